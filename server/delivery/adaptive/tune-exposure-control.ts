/**
 * Sympson–Hetter exposure control parameters tuned by simulation.
 *
 * Each item i gets K_i = P(given | selected). Starting from K_i = 1, each round simulates the
 * audiences with the current K and measures P(S_i), the share of persons for whom the selector
 * chose item i; then K_i = r_max / P(S_i) where P(S_i) > r_max and 1 elsewhere, so that the
 * exposure P(A_i) = P(S_i)·K_i approaches at most r_max. Each round draws new persons (seed + round).
 * Rounds stop once a round's largest exposure is at most r_max, or after `rounds`.
 *
 * @see Sympson, J. B., & Hetter, R. D. (1985). Controlling item-exposure rates in computerized
 *   adaptive testing. Proceedings of the 27th annual meeting of the Military Testing Association,
 *   973–977.
 */
import { type SimulationInput, simulateAdaptive } from './simulate-adaptive.js';

export interface ExposureTuning {
  /** K_i aligned with the bank. */
  readonly exposureControl: Float64Array;
  /** Largest exposure observed in each round (round 1 ran with every K_i = 1). */
  readonly maxExposureByRound: readonly number[];
  readonly iterations: number;
  readonly converged: boolean;
}

/**
 * Tunes K_i for a largest exposure of `maxExposure`.
 *
 * @param input the simulation the K_i are tuned on (its settings' own exposureControl is ignored).
 * @param options r_max (default 0.3) and the most rounds (default 8).
 * @returns the K_i of the last round and the largest exposure of every round.
 * @throws when r_max is not in (0, 1] or rounds is not a positive integer.
 * @example
 * tuneExposureControl(input, { maxExposure: 0.3 }).maxExposureByRound; // e.g. [0.59, 0.34, 0.30]
 */
export function tuneExposureControl(
  input: SimulationInput,
  options: { readonly maxExposure?: number; readonly rounds?: number } = {},
): ExposureTuning {
  const rMax = options.maxExposure ?? 0.3;
  const rounds = options.rounds ?? 8;
  if (!(rMax > 0 && rMax <= 1)) throw new Error('tuneExposureControl requires maxExposure in (0, 1]');
  if (!Number.isInteger(rounds) || rounds < 1) throw new Error('tuneExposureControl requires rounds >= 1');
  const control = new Float64Array(input.bank.ids.length).fill(1);
  const history: number[] = [];
  for (let round = 0; round < rounds; round++) {
    const result = simulateAdaptive({
      ...input,
      seed: (input.seed + round + 1) >>> 0,
      settings: { ...input.settings, exposureControl: control },
      compareFixed: false,
    });
    history.push(result.maxExposure);
    if (result.maxExposure <= rMax) {
      return {
        exposureControl: control,
        maxExposureByRound: history,
        iterations: round + 1,
        converged: true,
      };
    }
    for (let i = 0; i < control.length; i++) {
      const selected = result.selectionRate[i]!;
      control[i] = selected > rMax ? rMax / selected : 1;
    }
  }
  return { exposureControl: control, maxExposureByRound: history, iterations: rounds, converged: false };
}
