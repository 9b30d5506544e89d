import { describe, expect, it } from 'vitest';
import {
  fixedDesigns,
  fixedFormOrder,
  simulateAdaptive,
} from '../../../server/delivery/adaptive/simulate-adaptive.js';
import {
  tuneExposureControl,
  upperNormalQuantile,
} from '../../../server/delivery/adaptive/tune-exposure-control.js';
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
      for (const design of fixedDesigns) {
        const fixed = a.fixed[design];
        expect(fixed, design).not.toBeNull();
        expect(fixed!.meanStandardError).toBeLessThanOrEqual(a.adaptive.meanStandardError);
        expect(a.adaptive.items).toBeLessThan(fixed!.length);
        expect(a.itemRatio[design]).toBeCloseTo(a.adaptive.items / fixed!.length, 12);
      }
      // A form spanning [-3, 3]; Weiss (1982) reports about half the items for adaptive tests.
      expect(a.itemRatio.spanning!).toBeLessThan(0.7);
    }
    // The peaked form is built at the pooled mean (0), so the off-centre audiences gain most on it.
    const [low, mid, high] = result.audiences;
    expect(low!.itemRatio.bestTargeted!).toBeLessThan(mid!.itemRatio.bestTargeted!);
    expect(high!.itemRatio.bestTargeted!).toBeLessThan(mid!.itemRatio.bestTargeted!);
  });

  it('bounds the ratio by information: no design beats the best items at the true ability', () => {
    for (const a of result.audiences) {
      const bound = a.bound!;
      expect(bound.spanningLength).not.toBeNull();
      expect(bound.ratio).toBeCloseTo(bound.items / bound.spanningLength!, 12);
      // Same SE target: the bound needs fewer items than the adaptive attempts (which select at a
      // noisy estimate and randomesque k = 3), and its ratio is lower.
      expect(bound.items).toBeLessThan(a.adaptive.items);
      expect(bound.ratio!).toBeLessThan(a.itemRatio.spanning!);
      expect(bound.meanStandardError).toBeLessThanOrEqual(0.45);
      // Without the content rule the best items of the whole bank can only be better or equal.
      expect(bound.itemsWithoutContentRule).toBeLessThanOrEqual(bound.items);
    }
  });

  it('leaves the fixed forms and the bound out when asked', () => {
    const quick = simulateAdaptive({
      bank,
      audiences: audiences.slice(0, 1),
      settings,
      seed: 5,
      compareFixed: false,
    });
    const only = quick.audiences[0]!;
    expect(only.bound).toBeNull();
    expect(only.fixed).toEqual({ spanning: null, bestTargeted: null, poolOrder: null });
    expect(only.adaptive).toEqual(result.audiences[0]!.adaptive);
    expect(quick.meanItems).toBeCloseTo(only.adaptive.items, 12);
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
    // The best round is kept: its largest exposure is the smallest of all rounds.
    expect(history[tuning.bestRound - 1]).toBe(Math.min(...history));
    expect(tuning.bestRound).toBeGreaterThan(1);
    // z = 3.260767 (Python 3.11 statistics.NormalDist().inv_cdf(1 - 0.05 / 90)) binomial SEs of 0.3
    // over 180 persons: 3.260767 * sqrt(0.21 / 180) = 0.111376.
    expect(tuning.tunedFor).toBeCloseTo(0.3 - 0.111376, 5);
    expect(Math.min(...tuning.exposureControl)).toBeLessThan(1);
    expect(tuning.exposureControl.every((k) => k > 0 && k <= 1)).toBe(true);
  });

  it('caps the sampling margin at half the limit for tiny simulations, and refuses a bad margin', () => {
    const tiny = audiences.map((a) => ({ ...a, persons: 2 }));
    const input = { bank, audiences: tiny, settings, seed: 3 };
    // z · √(0.21/6) = 3.26 · 0.187 = 0.61 > 0.15, so the cap applies.
    expect(tuneExposureControl(input, { maxExposure: 0.3, rounds: 1 }).tunedFor).toBe(0.15);
    expect(tuneExposureControl(input, { maxExposure: 0.3, rounds: 1, margin: 0 }).tunedFor).toBe(0.3);
    expect(() => tuneExposureControl(input, { maxExposure: 0.3, margin: 0.3 })).toThrow('margin');
  });

  it('finds upper normal quantiles', () => {
    // Python 3.11 statistics.NormalDist().inv_cdf(1 - tail): 1.959963984540054, 3.260767488420533.
    expect(upperNormalQuantile(0.025)).toBeCloseTo(1.959963984540054, 9);
    expect(upperNormalQuantile(0.05 / 90)).toBeCloseTo(3.260767488420533, 9);
    expect(() => upperNormalQuantile(0.7)).toThrow('tail');
  });
});
