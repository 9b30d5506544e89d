import { findRootSafeguarded } from '../statistics/find-root-safeguarded.js';
import {
  type AbilityEstimate,
  abilityBracket,
  type EstimateAbilityOptions,
  raschMoments,
  rawScoreOf,
} from './estimate-ability-mle.js';

/**
 * Warm's weighted likelihood estimate (WLE) of one person's ability under the Rasch model.
 *
 * Maximises L(θ)·√I(θ), i.e. solves r − Σ P_i(θ) + J(θ) / (2 I(θ)) = 0 with I = Σ P_i(1−P_i) and
 * J = Σ P_i(1−P_i)(1−2P_i). The first-order bias of the MLE is removed, and zero and perfect scores
 * get finite estimates (the left side tends to r + 1/2 and r − n − 1/2 at the ends). SE = 1/√I(θ̂).
 *
 * @see Warm, T. A. (1989). Weighted likelihood estimation of ability in item response theory.
 *   Psychometrika 54(3), 427-450 (eq. 11 for the Rasch model).
 * @see Fischer, G. H., & Molenaar, I. W. (Eds.) (1995). Rasch Models. Springer, Table 4.1 p. 59.
 * @param difficulties b_i of the answered items, logits.
 * @param responses the raw score, or the 0/1 responses aligned with `difficulties`.
 * @param options maxIterations (default 100), tolerance (default 1e-10).
 * @returns the estimate with its SE, iterations and convergence flag.
 * @throws when there are no items, a difficulty is not finite, or the score is out of range.
 * @example
 * estimateAbilityWle(Float64Array.of(-1.5, -0.75, 0, 0.75, 1.5), 0).estimate; // -2.9541 (4 d.p.)
 */
export function estimateAbilityWle(
  difficulties: Float64Array,
  responses: number | ArrayLike<number>,
  options: EstimateAbilityOptions = {},
): AbilityEstimate {
  const score = rawScoreOf('estimateAbilityWle', difficulties, responses);
  const n = difficulties.length;
  const [low, high] = abilityBracket(difficulties);
  let mean = 0;
  for (const b of difficulties) mean += b;
  mean /= n;
  const found = findRootSafeguarded(
    (theta) => {
      const [expected, information, skew, skewDerivative] = raschMoments(theta, difficulties);
      // d/dθ [J / (2I)] = (J' I − J²) / (2 I²), with dI/dθ = J
      const value = score - expected + skew / (2 * information);
      const slope =
        -information + (skewDerivative * information - skew * skew) / (2 * information * information);
      return [value, slope];
    },
    low,
    high,
    mean + Math.log((score + 0.5) / (n - score + 0.5)),
    options.maxIterations ?? 100,
    options.tolerance ?? 1e-10,
  );
  const [, information] = raschMoments(found.root, difficulties);
  return {
    kind: 'estimate',
    estimate: found.root,
    standardError: 1 / Math.sqrt(information),
    iterations: found.iterations,
    converged: found.converged,
  };
}
