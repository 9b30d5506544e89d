import { describe, expect, it } from 'vitest';
import { keyBalance } from '../../../server/bank/lint/key-balance.js';
import { validItem } from '../valid-item.js';
import { runRule } from './lint-helpers.js';

describe('key-balance', () => {
  it('warns (not errors) when one position holds far more keys than its share', () => {
    // 12 four-option items, every key in position B: expected 3 per position
    const items = Array.from({ length: 12 }, (_, n) => ({ ...validItem(), id: `item-${n}` }));
    expect(runRule(keyBalance, items)).toEqual([
      {
        file: 'items',
        field: 'key',
        severity: 'warning',
        message: 'key position B holds 12 of 12 single-choice keys, expected about 3.0; move some keys',
      },
    ]);
  });

  it('says nothing about a small bank', () => {
    expect(runRule(keyBalance, [validItem()])).toEqual([]);
  });
});
