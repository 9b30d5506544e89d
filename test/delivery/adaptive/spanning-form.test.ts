import { describe, expect, it } from 'vitest';
import { buildAdaptiveBank } from '../../../server/delivery/adaptive/adaptive-bank.js';
import { areaQuotas, spanningForm } from '../../../server/delivery/adaptive/spanning-form.js';
import { spacedBank } from './helpers.js';

describe('areaQuotas', () => {
  it('rounds target shares by largest remainder', () => {
    const bank = spacedBank(['read', 'interpret', 'envision'], 20, -2, 2, {
      read: 4,
      interpret: 3,
      envision: 3,
    });
    expect(Array.from(areaQuotas(bank, 10))).toEqual([4, 3, 3]);
    // 0.4·7 = 2.8, 0.3·7 = 2.1 twice: floors 2, 2, 2 and the one left goes to the largest remainder.
    expect(Array.from(areaQuotas(bank, 7))).toEqual([3, 2, 2]);
    expect(Array.from(areaQuotas(bank, 60))).toEqual([20, 20, 20]);
    expect(Array.from(areaQuotas(bank, 500))).toEqual([20, 20, 20]);
  });

  it('gives what a small area cannot take to the others, and nothing to an area with target 0', () => {
    const { bank } = buildAdaptiveBank(
      [
        { id: 'a1', difficulty: 0, area: 'a' },
        ...Array.from({ length: 6 }, (_, k) => ({ id: `b${k}`, difficulty: k - 3, area: 'b' })),
        ...Array.from({ length: 3 }, (_, k) => ({ id: `c${k}`, difficulty: k, area: 'c' })),
      ],
      { a: 1, b: 1 },
    );
    // a holds one item; the other three of four go to b; c has target 0.
    expect(Array.from(areaQuotas(bank, 4))).toEqual([1, 3, 0]);
    expect(Array.from(areaQuotas(bank, 9))).toEqual([1, 6, 0]);
  });
});

describe('spanningForm', () => {
  it('takes each area at evenly spaced quantiles of its difficulties', () => {
    // 30 items per area evenly spaced on [-3, 3]; 3 per area are positions 5, 15 and 25.
    const bank = spacedBank(['read', 'interpret', 'envision'], 30, -3, 3, undefined, 4);
    const form = spanningForm(bank, 9);
    const at = (k: number) => -3 + (6 * k) / 29;
    expect(form).toHaveLength(9);
    expect(new Set(form).size).toBe(9);
    for (const area of [0, 1, 2]) {
      const own = Array.from(form).filter((i) => bank.areaOf[i] === area);
      expect(own.map((i) => bank.difficulty[i]!)).toEqual([at(5), at(15), at(25)]);
    }
    // The whole bank at full length.
    expect(new Set(spanningForm(bank, 90)).size).toBe(90);
  });

  it('spans the bank: a longer form reaches further out', () => {
    const bank = spacedBank(['all'], 41, -4, 4);
    const range = (length: number) => {
      const b = Array.from(spanningForm(bank, length), (i) => bank.difficulty[i]!);
      return [Math.min(...b), Math.max(...b)];
    };
    expect(range(1)).toEqual([0, 0]);
    expect(range(4)[0]).toBeCloseTo(-3, 12); // position floor(0.5·41/4) = 5 → -4 + 8·5/40
    expect(range(20)[1]).toBeGreaterThan(3.5);
    expect(() => spanningForm(bank, 0)).toThrow('positive length');
  });
});
