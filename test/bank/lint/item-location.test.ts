import { describe, expect, it } from 'vitest';
import { itemLocation } from '../../../server/bank/lint/item-location.js';
import { validItem } from '../valid-item.js';
import { contextOf, entryOf } from './lint-helpers.js';

describe('item-location', () => {
  it('fires when the file name is not the id and the folder is not the scenario', () => {
    const context = { ...contextOf([]), entries: [entryOf(validItem(), 'items/town/ferry.json')] };
    expect(itemLocation.check(context).map((p) => `${p.field}: ${p.message}`)).toEqual([
      'id: id "isle-ferry-busiest-day" differs from the file name "ferry"',
      'scenario: scenario "isle" differs from the folder "town"',
    ]);
  });
});
