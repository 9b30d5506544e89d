import { describe, expect, it } from 'vitest';
import { buildAdaptiveBank } from '../../../server/delivery/adaptive/adaptive-bank.js';
import { informationBound } from '../../../server/delivery/adaptive/information-bound.js';

const rules = { seTarget: 0.45, maxItems: 40 };

describe('informationBound', () => {
  it('needs ⌈(1/SE² − 1/σ²)/0.25⌉ items on a bank of items at the ability, as the fixed form does', () => {
    const { bank } = buildAdaptiveBank(
      Array.from({ length: 40 }, (_, k) => ({ id: `i${k}`, difficulty: 0, area: 'all' })),
    );
    const bound = informationBound(bank, Float64Array.of(0), { sd: 1 }, rules);
    // (1/0.45² − 1)/0.25 = 15.75 → 16 items (Linacre 2006, I = P(1 − P) = 0.25 at θ = b).
    expect(bound.items).toBe(16);
    expect(bound.meanStandardError).toBeCloseTo(1 / Math.sqrt(5), 12);
    expect(bound.spanningLength).toBe(16);
    expect(bound.ratio).toBe(1);
  });

  it('halves the items against a form spanning two far-apart clusters (worked by hand)', () => {
    // 20 items at -2 and 20 at +2; persons at -2 and +2. Best items: 16 at their own b (SE 1/√5).
    // The spanning form of L puts half at each end: at θ = 2 it gives L/2 · (0.25 + 0.017663), where
    // 0.017663 = P(1 − P) at θ − b = 4; 1 + 15 · 0.267663 = 5.0149 ≥ 5 first at L = 30 (L = 29 splits
    // 14/15 and its mean SE is 0.4527 > 0.4472). Ratio 16/30.
    const { bank } = buildAdaptiveBank(
      Array.from({ length: 40 }, (_, k) => ({ id: `i${k}`, difficulty: k < 20 ? -2 : 2, area: 'all' })),
    );
    const bound = informationBound(bank, Float64Array.of(-2, 2), { sd: 1 }, rules);
    expect(bound.items).toBe(16);
    expect(bound.spanningLength).toBe(30);
    expect(bound.ratio).toBeCloseTo(16 / 30, 12);
  });

  it('keeps the content rule: quotas force off-target items, which costs items', () => {
    // Area "easy" at -2, area "hard" at +2, equal targets: a person at +2 must take half easy items.
    const { bank } = buildAdaptiveBank(
      Array.from({ length: 40 }, (_, k) => ({
        id: `i${k}`,
        difficulty: k < 20 ? -2 : 2,
        area: k < 20 ? 'easy' : 'hard',
      })),
    );
    const bound = informationBound(bank, Float64Array.of(2), { sd: 1 }, rules);
    // Equal lags go to the earlier area, so easy, hard, easy, ...: after n items ⌈n/2⌉ easy ones
    // (0.017663 each at θ − b = 4) and ⌊n/2⌋ hard ones (0.25). n = 29: 1 + 15·0.017663 + 14·0.25 =
    // 4.765 < 1/0.45² = 4.938; n = 30: 5.015.
    expect(bound.items).toBe(30);
    expect(bound.itemsWithoutContentRule).toBe(16);
    expect(bound.ratioWithoutContentRule!).toBeLessThan(bound.ratio!);
  });

  it('leaves out areas with target 0 with and without the rule', () => {
    // The hard area has target 0: a person at +2 gets only the easy items (0.017663 each).
    const { bank } = buildAdaptiveBank(
      Array.from({ length: 40 }, (_, k) => ({
        id: `i${k}`,
        difficulty: k < 20 ? -2 : 2,
        area: k < 20 ? 'easy' : 'hard',
      })),
      { easy: 1 },
    );
    const bound = informationBound(bank, Float64Array.of(2), { sd: 1 }, rules);
    expect(bound.items).toBe(20);
    expect(bound.itemsWithoutContentRule).toBe(20);
    expect(bound.meanStandardError).toBeCloseTo(1 / Math.sqrt(1 + 20 * 0.0176627), 6);
  });

  it('stops at maxItems and refuses empty audiences', () => {
    const { bank } = buildAdaptiveBank(
      Array.from({ length: 10 }, (_, k) => ({ id: `i${k}`, difficulty: 3, area: 'all' })),
    );
    const bound = informationBound(bank, Float64Array.of(-3), { sd: 1 }, { seTarget: 0.45, maxItems: 10 });
    expect(bound.items).toBe(10);
    // Every item at θ − b = −6 (P(1 − P) = 0.002467): far from the target, and the same on any form.
    expect(bound.meanStandardError).toBeCloseTo(1 / Math.sqrt(1 + 10 * 0.0024665), 5);
    expect(bound.spanningLength).toBe(10);
    expect(() => informationBound(bank, new Float64Array(0), { sd: 1 }, rules)).toThrow(
      'at least one person',
    );
  });
});
