import { describe, expect, it } from 'vitest';
import { duplicateIds } from '../../../server/bank/lint/duplicate-ids.js';
import { validItem } from '../valid-item.js';
import { contextOf, entryOf } from './lint-helpers.js';

describe('duplicate-ids', () => {
  it('fires on the second file that uses an id', () => {
    const context = {
      ...contextOf([]),
      entries: [
        entryOf(validItem(), 'items/isle/isle-ferry-busiest-day.json'),
        entryOf(validItem(), 'items/isle/copy.json'),
      ],
    };
    expect(duplicateIds.check(context)).toEqual([
      expect.objectContaining({
        file: 'items/isle/copy.json',
        field: 'id',
        message: 'duplicate id "isle-ferry-busiest-day", also used by items/isle/isle-ferry-busiest-day.json',
      }),
    ]);
  });
});
