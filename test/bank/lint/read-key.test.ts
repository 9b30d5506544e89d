import { describe, expect, it } from 'vitest';
import { readKey } from '../../../server/bank/lint/read-key.js';
import { barChart, broken, runRule, singleChoice } from './lint-helpers.js';

describe('read-key', () => {
  it('fires when the query cannot be computed', () => {
    const item = broken((i) => {
      i.key = { by: 'query', query: { op: 'value-at', field: 'passengers', where: { day: 'Sun' } } };
    });
    expect(runRule(readKey, [item])).toEqual([
      expect.objectContaining({
        field: 'key.query',
        message: 'cannot be computed: value-at: 0 rows match day = "Sun", need exactly 1',
      }),
    ]);
  });

  it('fires when the answer matches no option', () => {
    const item = broken((i) => {
      singleChoice(i).options[1] = { id: 'b', text: 'Friday', value: 'Fri' };
    });
    expect(runRule(readKey, [item])).toEqual([
      expect.objectContaining({
        field: 'key.query',
        message: 'answers "Tue", which matches no option value',
      }),
    ]);
  });

  it('fires when the answer matches two options', () => {
    const item = broken((i) => {
      singleChoice(i).options[0] = { id: 'a', text: 'Tues.', value: 'Tue' };
    });
    expect(runRule(readKey, [item])).toEqual([
      expect.objectContaining({
        field: 'key.query',
        message: 'answers "Tue", which matches 2 options (a, b)',
      }),
    ]);
  });

  it('fires on a tie, which makes the key ambiguous', () => {
    const item = broken((i) => {
      barChart(i).data[2] = { day: 'Wed', passengers: 340 };
    });
    expect(runRule(readKey, [item])[0]?.message).toBe(
      'cannot be computed: largest: "Tue" and "Wed" tie at 340',
    );
  });
});
