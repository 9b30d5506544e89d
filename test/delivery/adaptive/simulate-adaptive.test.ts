import { describe, expect, it } from 'vitest';
import { fixedFormOrder, simulateAdaptive } from '../../../server/delivery/adaptive/simulate-adaptive.js';
import { tuneExposureControl } from '../../../server/delivery/adaptive/tune-exposure-control.js';
import { spacedBank } from './helpers.js';

// INVENTED bank: 90 items, difficulties evenly spaced on [-3, 3] within each task level, in shuffled order.
const bank = spacedBank(['read', 'interpret', 'envision'], 30, -3, 3, undefined, 17);
const audiences = [-1, 0, 1].map((mean) => ({ label: `mean ${mean}`, mean, sd: 1, persons: 150 }));
const settings = { seTarget: 0.45, minItems: 5, maxItems: 30, randomesque: 3 };

describe('simulateAdaptive', { timeout: 60000 }, () => {
  const result = simulateAdaptive({ bank, audiences, settings, seed: 5 });

  it('recovers the truth: bias within 3 standard errors of a mean, RMSE close to the posterior SD', () => {
    for (const a of result.audiences) {
      const n = a.audience.persons;
      // The mean error of n persons has SD about RMSE/sqrt(n); |bias| <= 3 of those (common practice, no source).
      expect(Math.abs(a.adaptive.bias)).toBeLessThanOrEqual((3 * a.adaptive.rmse) / Math.sqrt(n));
      // With the generating distribution as prior, E[(EAP - theta)^2] = E[posterior variance]
      // (law of total variance, from memory), so RMSE is close to the mean posterior SD.
      expect(a.adaptive.rmse).toBeGreaterThan(0.8 * a.adaptive.meanStandardError);
      expect(a.adaptive.rmse).toBeLessThan(1.2 * a.adaptive.meanStandardError);
      expect(a.adaptive.meanStandardError).toBeLessThan(0.47);
    }
  });

  it('needs fewer items than fixed forms of the same precision on a wide bank', () => {
    for (const a of result.audiences) {
      expect(a.fixed).not.toBeNull();
      expect(a.poolOrder).not.toBeNull();
      expect(a.fixed!.meanStandardError).toBeLessThanOrEqual(a.adaptive.meanStandardError);
      expect(a.adaptive.items).toBeLessThan(a.fixed!.length);
      // A pool-order form spreads over [-3, 3]; Weiss (1982) reports about half the items for adaptive tests.
      expect(a.adaptive.items / a.poolOrder!.length).toBeLessThan(0.7);
    }
    // The best-targeted fixed form is built at the pooled mean (0), so the off-centre audiences gain most.
    const [low, mid, high] = result.audiences;
    expect(low!.itemRatio!).toBeLessThan(mid!.itemRatio!);
    expect(high!.itemRatio!).toBeLessThan(mid!.itemRatio!);
  });

  it('counts exposure consistently and is deterministic under a seed', { timeout: 60000 }, () => {
    const administered = result.exposure.reduce((sum, rate) => sum + rate, 0) * result.persons;
    const items = result.audiences.reduce((sum, a) => sum + a.adaptive.items * a.audience.persons, 0);
    expect(administered).toBeCloseTo(items, 6);
    expect(result.maxExposure).toBeLessThanOrEqual(1);
    const again = (seed: number) =>
      simulateAdaptive({ bank, audiences, settings, seed, compareFixed: false });
    expect(again(5).audiences[1]!.adaptive).toEqual(result.audiences[1]!.adaptive);
    expect(again(6).audiences[1]!.adaptive.rmse).not.toBe(result.audiences[1]!.adaptive.rmse);
  });

  it('orders the fixed form nearest the pooled mean first, level by level', () => {
    const order = Array.from(fixedFormOrder(bank, 0)).map((i) => bank.difficulty[i]!);
    // Per level, the two items nearest 0 are at -0.103 and +0.103 (30 points on [-3, 3]).
    expect(order.slice(0, 3).every((b) => Math.abs(b) < 0.11)).toBe(true);
    expect(order).toHaveLength(90);
  });
});

describe('tuneExposureControl', () => {
  it('lowers the largest exposure toward r_max with K_i in [0, 1]', { timeout: 60000 }, () => {
    const small = audiences.map((a) => ({ ...a, persons: 60 }));
    const tuning = tuneExposureControl(
      { bank, audiences: small, settings: { ...settings, randomesque: 1 }, seed: 9 },
      { maxExposure: 0.3, rounds: 5 },
    );
    const history = tuning.maxExposureByRound;
    expect(history[0]!).toBeGreaterThan(0.3);
    expect(history.at(-1)!).toBeLessThan(history[0]!);
    expect(Math.min(...tuning.exposureControl)).toBeLessThan(1);
    expect(tuning.exposureControl.every((k) => k > 0 && k <= 1)).toBe(true);
  });
});
