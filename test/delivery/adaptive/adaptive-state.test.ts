import { describe, expect, it } from 'vitest';
import type { AdaptiveSettings } from '../../../server/delivery/adaptive/adaptive-settings.js';
import {
  type AdaptiveState,
  advance,
  type ItemStep,
  nextStep,
  startAdaptiveState,
  stopReason,
} from '../../../server/delivery/adaptive/adaptive-state.js';
import { seededRandom } from '../../../server/scoring/seeded-random.js';
import { spacedBank } from './helpers.js';

const prior = { mean: 0.3, sd: 1.2, source: 'cohort' as const };
const settings: AdaptiveSettings = { seTarget: 0.45, minItems: 5, maxItems: 30, randomesque: 3 };

/** Posterior mean and SD by brute force: trapezoid rule on a fine grid over [-12, 12]. */
function directPosterior(difficulty: number[], scores: number[], mean: number, sd: number) {
  const step = 0.0005;
  let total = 0;
  let first = 0;
  let second = 0;
  for (let theta = -12; theta <= 12; theta += step) {
    let density = Math.exp(-0.5 * ((theta - mean) / sd) ** 2);
    difficulty.forEach((b, i) => {
      const p = 1 / (1 + Math.exp(b - theta));
      density *= scores[i] === 1 ? p : 1 - p;
    });
    total += density;
    first += density * theta;
    second += density * theta * theta;
  }
  const posteriorMean = first / total;
  return { mean: posteriorMean, sd: Math.sqrt(second / total - posteriorMean ** 2) };
}

const item = (itemId: string, difficulty: number): ItemStep => ({
  kind: 'item',
  itemId,
  area: 'all',
  difficulty,
  passedOver: [],
});

describe('advance', () => {
  it('updates the EAP and posterior SD to the direct posterior computation', () => {
    // Bock & Mislevy (1982): EAP = posterior mean under the normal prior; checked against numerical
    // integration of prior x Rasch likelihood (common practice, no source).
    let state = startAdaptiveState(prior, 1);
    const b = [0.3, 1.1, -0.4, 0.8, 1.9, -1.5];
    const x: (0 | 1)[] = [1, 0, 1, 1, 0, 1];
    b.forEach((difficulty, k) => {
      state = advance(state, item(`i${k}`, difficulty), x[k]!);
      const direct = directPosterior(b.slice(0, k + 1), x.slice(0, k + 1), prior.mean, prior.sd);
      expect(state.ability).toBeCloseTo(direct.mean, 6);
      expect(state.standardError).toBeCloseTo(direct.sd, 6);
    });
    expect(state.items.map((i) => i.score)).toEqual(x);
    expect(state.areaCounts).toEqual({ all: 6 });
  });

  it('matches the documented example and leaves the old state alone', () => {
    const start = startAdaptiveState({ mean: 0, sd: 1, source: 'default' }, 1);
    const next = advance(start, item('a', 0), 1);
    expect(next.ability).toBeCloseTo(directPosterior([0], [1], 0, 1).mean, 6);
    expect(start.items).toHaveLength(0);
    expect(start.ability).toBe(0);
  });

  it('refuses a repeated item or a bad score', () => {
    const state = advance(startAdaptiveState(prior, 1), item('a', 0), 1);
    expect(() => advance(state, item('a', 0), 0)).toThrow('not yet given');
    expect(() => advance(state, item('b', 0), 2 as 0)).toThrow('score of 0 or 1');
    expect(() => startAdaptiveState({ mean: 0, sd: 0, source: 'default' }, 1)).toThrow('positive sd');
  });
});

describe('stop rules', () => {
  const given = (n: number) =>
    Array.from({ length: n }, (_, k) => ({ itemId: `i${k}`, area: 'all', difficulty: 0, score: 1 as const }));

  it('stops on the SE target only after the minimum number of items', () => {
    // Linacre (2006), RMT 20:2: stop at a target SE, with minimum and maximum test lengths.
    expect(stopReason({ items: given(6), standardError: 0.44 }, settings, 0)).toBe('se-target');
    expect(stopReason({ items: given(6), standardError: 0.45 }, settings, 0)).toBe('se-target');
    expect(stopReason({ items: given(6), standardError: 0.46 }, settings, 0)).toBeNull();
    expect(stopReason({ items: given(4), standardError: 0.3 }, settings, 0)).toBeNull();
  });

  it('stops at the maximum number of items', () => {
    expect(stopReason({ items: given(30), standardError: 0.9 }, settings, 0)).toBe('max-items');
    expect(stopReason({ items: given(29), standardError: 0.9 }, settings, 0)).toBeNull();
  });

  it('stops at the time limit before anything else', () => {
    const timed = { ...settings, timeLimitSeconds: 120 };
    expect(stopReason({ items: given(30), standardError: 0.1 }, timed, 120)).toBe('time-limit');
    expect(stopReason({ items: given(2), standardError: 0.9 }, timed, 119.9)).toBeNull();
  });

  it('stops when the pool is exhausted (a bank smaller than the maximum)', () => {
    const small = spacedBank(['all'], 4);
    let state = startAdaptiveState(prior, 5);
    const seen: string[] = [];
    for (;;) {
      const step = nextStep(state, small, { ...settings, seTarget: 0.1 });
      if (step.kind === 'stop') {
        expect(step.reason).toBe('pool-exhausted');
        break;
      }
      seen.push(step.itemId);
      state = advance(state, step, 1);
    }
    expect(seen.sort()).toEqual([...small.ids].sort());
  });
});

describe('nextStep', () => {
  const bank = spacedBank(['read', 'interpret', 'envision'], 60, -3, 3, {
    read: 0.5,
    interpret: 0.3,
    envision: 0.2,
  });

  function run(seed: number, truth: number, long: AdaptiveSettings): AdaptiveState {
    const answers = seededRandom(seed + 1000);
    let state = startAdaptiveState(prior, seed);
    for (;;) {
      const step = nextStep(state, bank, long);
      if (step.kind === 'stop') return state;
      state = advance(state, step, answers.uniform() < 1 / (1 + Math.exp(step.difficulty - truth)) ? 1 : 0);
    }
  }

  it('is deterministic under a seed and differs between seeds', () => {
    const ids = (s: AdaptiveState) => s.items.map((i) => i.itemId);
    expect(ids(run(11, 0.5, settings))).toEqual(ids(run(11, 0.5, settings)));
    expect(ids(run(11, 0.5, settings))).not.toEqual(ids(run(12, 0.5, settings)));
  });

  it('survives a JSON round trip of the state', () => {
    const state = run(3, -0.5, { ...settings, maxItems: 8, seTarget: 0.1 });
    const copy = JSON.parse(JSON.stringify(state)) as AdaptiveState;
    expect(nextStep(copy, bank, settings)).toEqual(nextStep(state, bank, settings));
  });

  it('keeps content balance within one item of the target proportions over a long attempt', () => {
    // Kingsbury & Zara (1989) content balancing; the brief's check: within one item of the targets.
    const long = { ...settings, seTarget: 0.01, maxItems: 90, randomesque: 5 };
    for (const [seed, truth] of [
      [1, -2],
      [2, 0],
      [3, 1.5],
    ] as const) {
      const state = run(seed, truth, long);
      expect(state.items).toHaveLength(90);
      const counts: Record<string, number> = { read: 0, interpret: 0, envision: 0 };
      state.items.forEach((it, n) => {
        counts[it.area]!++;
        for (const [area, target] of [
          ['read', 0.5],
          ['interpret', 0.3],
          ['envision', 0.2],
        ] as const) {
          expect(Math.abs(counts[area]! - target * (n + 1))).toBeLessThanOrEqual(1);
        }
      });
    }
  });

  it('moves toward the truth: a strong person gets harder items than a weak one', () => {
    const strong = run(21, 2.5, settings);
    const weak = run(21, -2.5, settings);
    const meanB = (s: AdaptiveState) =>
      s.items.slice(5).reduce((sum, i) => sum + i.difficulty, 0) / (s.items.length - 5);
    expect(meanB(strong)).toBeGreaterThan(1);
    expect(meanB(weak)).toBeLessThan(-1);
  });
});
