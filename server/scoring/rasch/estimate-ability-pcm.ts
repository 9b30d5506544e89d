import { findRootSafeguarded } from '../statistics/find-root-safeguarded.js';
import type { AbilityEstimate, AbilityMleResult, EstimateAbilityOptions } from './estimate-ability-mle.js';
import { pcmCategoryProbabilities } from './pcm-category-probabilities.js';

/** Which estimator {@link estimateAbilityPcm} uses. */
export interface EstimateAbilityPcmOptions extends EstimateAbilityOptions {
  /** 'wle' (default, finite for every score) or 'mle' (none for extreme scores). */
  readonly method?: 'wle' | 'mle';
}

/** Σ E(X_i), I = Σ Var(X_i), J = Σ κ3(X_i) and J' = Σ κ4(X_i) at θ (dI/dθ = J, dJ/dθ = J'). */
export function pcmMoments(
  theta: number,
  items: readonly ArrayLike<number>[],
): [number, number, number, number] {
  let expected = 0;
  let information = 0;
  let skew = 0;
  let kurtosis = 0;
  for (const steps of items) {
    const p = pcmCategoryProbabilities(theta, steps);
    let mean = 0;
    for (let x = 1; x < p.length; x++) mean += x * p[x]!;
    let m2 = 0;
    let m3 = 0;
    let m4 = 0;
    for (let x = 0; x < p.length; x++) {
      const d = x - mean;
      m2 += p[x]! * d * d;
      m3 += p[x]! * d * d * d;
      m4 += p[x]! * d * d * d * d;
    }
    expected += mean;
    information += m2;
    skew += m3;
    kurtosis += m4 - 3 * m2 * m2;
  }
  return [expected, information, skew, kurtosis];
}

/**
 * One person's ability from a test mixing right/wrong items and partial credit items, given the
 * calibrated steps of the items the person answered (a dichotomous item has one step, its b).
 *
 * The PCM is an exponential family in θ with the total score r sufficient, so the MLE solves
 * r = Σ E(X_i | θ) and Warm's weighted likelihood estimate solves r − Σ E(X_i | θ) + J/(2I) = 0,
 * with I = Σ Var(X_i) the test information and J = dI/dθ = Σ κ3(X_i); for right/wrong items this
 * is exactly the Rasch WLE. Safeguarded Newton-Raphson; SE = 1/√I(θ̂). The WLE is finite for zero
 * and perfect totals; the MLE reports them as their own cases.
 *
 * @see Warm, T. A. (1989). Weighted likelihood estimation of ability in item response theory.
 *   Psychometrika 54(3), 427-450.
 * @see Penfield, R. D., & Bergeron, J. M. (2005). Applying a weighted maximum likelihood latent trait
 *   estimator to the generalized partial credit model. Applied Psychological Measurement 29(3),
 *   218-233 (the WLE for polytomous items; from memory).
 * @see Masters, G. N. (1982). A Rasch model for partial credit scoring. Psychometrika 47(2), 149-174.
 * @param items steps δ_i1..δ_im of each answered item, logits.
 * @param responses scores 0..m_i aligned with `items`.
 * @param options method ('wle' default or 'mle'), maxIterations (100), tolerance (1e-10).
 * @returns the estimate with its SE, or for the MLE `{ kind: 'all-wrong' | 'all-correct' }`.
 * @throws when there are no items, a step is not finite, or a score is outside 0..m_i.
 * @example
 * // one 0-1-2 item with steps (−1, 1) and score 1: θ̂ = 0 by symmetry, SE = 1/√(2 · 0.2119416)
 * estimateAbilityPcm([Float64Array.of(-1, 1)], [1]); // { estimate: 0, standardError: 1.5360 (4 d.p.) }
 */
export function estimateAbilityPcm(
  items: readonly ArrayLike<number>[],
  responses: ArrayLike<number>,
  options: EstimateAbilityPcmOptions = {},
): AbilityMleResult {
  if (items.length === 0) throw new Error('estimateAbilityPcm requires at least one response');
  if (responses.length !== items.length) throw new Error('estimateAbilityPcm requires one response per item');
  let score = 0;
  let top = 0;
  let low = Number.POSITIVE_INFINITY;
  let high = Number.NEGATIVE_INFINITY;
  items.forEach((steps, i) => {
    const x = responses[i]!;
    if (steps.length === 0) throw new Error('estimateAbilityPcm requires at least one step per item');
    if (!Number.isInteger(x) || x < 0 || x > steps.length)
      throw new Error('estimateAbilityPcm requires scores between 0 and each item maximum');
    for (let k = 0; k < steps.length; k++) {
      const d = steps[k]!;
      if (!Number.isFinite(d)) throw new Error('estimateAbilityPcm requires finite steps');
      low = Math.min(low, d);
      high = Math.max(high, d);
    }
    score += x;
    top += steps.length;
  });
  const method = options.method ?? 'wle';
  if (method === 'mle' && score === 0) return { kind: 'all-wrong' };
  if (method === 'mle' && score === top) return { kind: 'all-correct' };
  const margin = 10 + 2 * Math.log(top + 1);
  const found = findRootSafeguarded(
    (theta) => {
      const [expected, information, skew, kurtosis] = pcmMoments(theta, items);
      if (method === 'mle') return [score - expected, -information];
      const value = score - expected + skew / (2 * information);
      const slope = -information + (kurtosis * information - skew * skew) / (2 * information * information);
      return [value, slope];
    },
    low - margin,
    high + margin,
    (low + high) / 2 + Math.log((score + 0.5) / (top - score + 0.5)),
    options.maxIterations ?? 100,
    options.tolerance ?? 1e-10,
  );
  const [, information] = pcmMoments(found.root, items);
  const result: AbilityEstimate = {
    kind: 'estimate',
    estimate: found.root,
    standardError: 1 / Math.sqrt(information),
    iterations: found.iterations,
    converged: found.converged,
  };
  return result;
}
