import { describe, expect, it } from 'vitest';
import { allRules, lintBank } from '../../../server/bank/lint-bank.js';
import { validItem } from '../valid-item.js';
import { contextOf } from './lint-helpers.js';

describe('a valid item', () => {
  it('passes every rule, including label overlap with well-spaced boxes', () => {
    const labelBoxes = () => [
      { x: 0, y: 0, width: 40, height: 16, text: 'Mon', kind: 'tick' },
      { x: 60, y: 0, width: 40, height: 16, text: 'Tue', kind: 'tick' },
    ];
    expect(lintBank(contextOf([validItem()], { labelBoxes }), allRules)).toEqual([]);
  });

  it('runs every rule (each has a kebab-case name and a failing-case test file)', () => {
    expect(allRules.map((r) => r.name)).toEqual([
      'schema-errors',
      'item-location',
      'duplicate-ids',
      'unknown-scenario',
      'encoding-fields',
      'read-key',
      'field-kinds',
      'distractor-duplicates',
      'distractor-range',
      'contrast',
      'colour-vision',
      'alt-text',
      'label-overlap',
      'key-balance',
    ]);
  });
});
