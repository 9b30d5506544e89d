import { findRootSafeguarded } from '../statistics/find-root-safeguarded.js';

export interface EstimateAbilityOptions {
  /** Newton steps at most. Default 100. */
  readonly maxIterations?: number;
  /** Stop when the step is below this, in logits. Default 1e-10. */
  readonly tolerance?: number;
}

/** A finite maximum-likelihood ability. */
export interface AbilityEstimate {
  readonly kind: 'estimate';
  /** θ̂, logits. */
  readonly estimate: number;
  /** 1/√I(θ̂), logits. */
  readonly standardError: number;
  readonly iterations: number;
  readonly converged: boolean;
}

/** The MLE does not exist for zero and perfect scores: the likelihood rises without bound. */
export type AbilityMleResult =
  | AbilityEstimate
  | { readonly kind: 'all-wrong' }
  | { readonly kind: 'all-correct' };

/** Raw score from a score or a 0/1 response vector aligned with the difficulties. */
export function rawScoreOf(
  name: string,
  difficulties: Float64Array,
  responses: number | ArrayLike<number>,
): number {
  if (difficulties.length === 0) throw new Error(`${name} requires at least one response`);
  for (const b of difficulties)
    if (!Number.isFinite(b)) throw new Error(`${name} requires finite difficulties`);
  if (typeof responses === 'number') {
    if (!Number.isInteger(responses) || responses < 0 || responses > difficulties.length) {
      throw new Error(`${name} requires a raw score between 0 and the number of items`);
    }
    return responses;
  }
  if (responses.length !== difficulties.length)
    throw new Error(`${name} requires one response per difficulty`);
  let score = 0;
  for (let i = 0; i < responses.length; i++) {
    const x = responses[i]!;
    if (x !== 0 && x !== 1) throw new Error(`${name} requires responses of 0 or 1`);
    score += x;
  }
  return score;
}

/** Σ P_i, I = Σ P_i(1−P_i), J = Σ P_i(1−P_i)(1−2P_i) and J' at θ. */
export function raschMoments(theta: number, difficulties: Float64Array): [number, number, number, number] {
  let expected = 0;
  let information = 0;
  let skew = 0;
  let skewDerivative = 0;
  for (const b of difficulties) {
    const p = 1 / (1 + Math.exp(b - theta));
    const w = p * (1 - p);
    expected += p;
    information += w;
    skew += w * (1 - 2 * p);
    skewDerivative += w * (1 - 6 * w);
  }
  return [expected, information, skew, skewDerivative];
}

/** A bracket wide enough for any root: beyond the item range by more than the score offsets need. */
export function abilityBracket(difficulties: Float64Array): [number, number] {
  let low = Number.POSITIVE_INFINITY;
  let high = Number.NEGATIVE_INFINITY;
  for (const b of difficulties) {
    low = Math.min(low, b);
    high = Math.max(high, b);
  }
  const margin = 10 + Math.log(difficulties.length + 1) * 2;
  return [low - margin, high + margin];
}

/**
 * Maximum-likelihood estimate of one person's ability under the Rasch model, given the
 * difficulties of the items the person answered.
 *
 * Solves r = Σ P_i(θ) by safeguarded Newton-Raphson; SE = 1/√I(θ̂). Zero and perfect scores have
 * no finite MLE and are returned as their own cases; use {@link estimateAbilityWle} when every
 * person needs a number.
 *
 * @see Fischer, G. H., & Molenaar, I. W. (Eds.) (1995). Rasch Models. Springer, ch. 4 (Hoijtink &
 *   Boomsma), eq. 4.3 and Table 4.1.
 * @param difficulties b_i of the answered items, logits.
 * @param responses the raw score, or the 0/1 responses aligned with `difficulties`.
 * @param options maxIterations (default 100), tolerance (default 1e-10).
 * @returns the estimate, or `{ kind: 'all-wrong' }` / `{ kind: 'all-correct' }`.
 * @throws when there are no items, a difficulty is not finite, or the score is out of range.
 * @example
 * const b = Float64Array.of(-1.5, -0.75, 0, 0.75, 1.5);
 * const result = estimateAbilityMle(b, 1);
 * result.kind === 'estimate' && result.estimate; // -1.7031 (4 d.p.)
 */
export function estimateAbilityMle(
  difficulties: Float64Array,
  responses: number | ArrayLike<number>,
  options: EstimateAbilityOptions = {},
): AbilityMleResult {
  const score = rawScoreOf('estimateAbilityMle', difficulties, responses);
  const n = difficulties.length;
  if (score === 0) return { kind: 'all-wrong' };
  if (score === n) return { kind: 'all-correct' };
  const [low, high] = abilityBracket(difficulties);
  let mean = 0;
  for (const b of difficulties) mean += b;
  mean /= n;
  const found = findRootSafeguarded(
    (theta) => {
      const [expected, information] = raschMoments(theta, difficulties);
      return [score - expected, -information];
    },
    low,
    high,
    mean + Math.log(score / (n - score)),
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
