/**
 * Sympson–Hetter exposure control parameters tuned by simulation.
 *
 * Each item i gets K_i = P(given | selected). Starting from K_i = 1, each round simulates the
 * audiences with the current K and measures P(S_i), the share of persons for whom the selector
 * chose item i; then K_i = r / P(S_i) where P(S_i) > r and 1 elsewhere, so that the exposure
 * P(A_i) = P(S_i)·K_i approaches at most r. Each round draws new persons (seed + round).
 *
 * Sampling margin: an item whose true exposure is exactly r_max shows more than r_max in about
 * half of all simulations, and the largest of a bank's such rates nearly always does. So the
 * rounds aim at r = r_max − margin, by default z·√(r_max(1 − r_max)/persons) with z the normal
 * quantile 1 − 0.05/items (a binomial standard error of one round's rate, Bonferroni over the
 * bank's items: no item should exceed r_max by sampling noise alone in 19 simulations of 20;
 * common practice, no source), at most r_max/2. Rounds stop once a round's largest exposure is at most r, or after
 * `rounds`; the K of the round with the smallest largest exposure is returned (the iteration is
 * noisy and need not fall monotonically).
 *
 * @see Sympson, J. B., & Hetter, R. D. (1985). Controlling item-exposure rates in computerized
 *   adaptive testing. Proceedings of the 27th annual meeting of the Military Testing Association,
 *   973–977.
 */
import { standardNormalCdf } from '../../scoring/statistics/standard-normal-cdf.js';
import { type SimulationInput, simulateAdaptive } from './simulate-adaptive.js';

export interface ExposureTuning {
  /** K_i aligned with the bank (those of the best round). */
  readonly exposureControl: Float64Array;
  /** Largest exposure observed in each round (round 1 ran with every K_i = 1). */
  readonly maxExposureByRound: readonly number[];
  /** The rate the rounds aimed at: r_max − margin. */
  readonly tunedFor: number;
  /** The round whose K are returned (1-based). */
  readonly bestRound: number;
  readonly iterations: number;
  /** Whether the best round's largest exposure is at most r_max. */
  readonly converged: boolean;
}

/**
 * Tunes K_i for a largest exposure of `maxExposure`.
 *
 * @param input the simulation the K_i are tuned on (its settings' own exposureControl is ignored).
 * @param options r_max (default 0.3), the most rounds (default 12), the sampling margin (default
 *   see the file comment; 0 aims at r_max itself).
 * @returns the K_i of the best round and the largest exposure of every round.
 * @throws when r_max is not in (0, 1], the margin not in [0, r_max) or rounds not a positive integer.
 * @example
 * tuneExposureControl(input, { maxExposure: 0.3 }).maxExposureByRound; // e.g. [0.59, 0.34, 0.28]
 */
export function tuneExposureControl(
  input: SimulationInput,
  options: { readonly maxExposure?: number; readonly rounds?: number; readonly margin?: number } = {},
): ExposureTuning {
  const rMax = options.maxExposure ?? 0.3;
  const rounds = options.rounds ?? 12;
  if (!(rMax > 0 && rMax <= 1)) throw new Error('tuneExposureControl requires maxExposure in (0, 1]');
  if (!Number.isInteger(rounds) || rounds < 1) throw new Error('tuneExposureControl requires rounds >= 1');
  const persons = input.audiences.reduce((sum, a) => sum + a.persons, 0);
  const z = upperNormalQuantile(0.05 / input.bank.ids.length);
  // At most half of r_max: a tiny simulation would otherwise aim at nothing.
  const margin = options.margin ?? Math.min(z * Math.sqrt((rMax * (1 - rMax)) / persons), rMax / 2);
  if (!(margin >= 0 && margin < rMax))
    throw new Error('tuneExposureControl requires a margin in [0, maxExposure)');
  const r = rMax - margin;
  let control = new Float64Array(input.bank.ids.length).fill(1);
  let best = { control, max: Number.POSITIVE_INFINITY, round: 0 };
  const history: number[] = [];
  for (let round = 0; round < rounds; round++) {
    const result = simulateAdaptive({
      ...input,
      seed: (input.seed + round + 1) >>> 0,
      settings: { ...input.settings, exposureControl: control },
      compareFixed: false,
    });
    history.push(result.maxExposure);
    if (result.maxExposure < best.max) best = { control, max: result.maxExposure, round: round + 1 };
    if (result.maxExposure <= r) break;
    const next = new Float64Array(control.length);
    for (let i = 0; i < next.length; i++) {
      const selected = result.selectionRate[i]!;
      next[i] = selected > r ? r / selected : 1;
    }
    control = next;
  }
  return {
    exposureControl: best.control,
    maxExposureByRound: history,
    tunedFor: r,
    bestRound: best.round,
    iterations: history.length,
    converged: best.max <= rMax,
  };
}

/** z with 1 − Φ(z) = tail, for tail in (0, 0.5], by bisection on Φ (to 1e-12). */
export function upperNormalQuantile(tail: number): number {
  if (!(tail > 0 && tail <= 0.5)) throw new Error('upperNormalQuantile requires a tail in (0, 0.5]');
  let low = 0;
  let high = 40;
  while (high - low > 1e-12) {
    const mid = (low + high) / 2;
    if (1 - standardNormalCdf(mid) > tail) low = mid;
    else high = mid;
  }
  return (low + high) / 2;
}
