import type { ResponseMatrix } from '../response-matrix.js';
import { choleskyDecompose, choleskyInverse, choleskySolve } from '../statistics/cholesky.js';
import { addPcmBookletTerms, type PcmLikelihoodTerms } from './pcm-conditional-likelihood.js';
import { groupPcmScoreGroups, type PcmExclusion } from './pcm-score-groups.js';

export interface CalibratePcmOptions {
  /** Highest score m_i per matrix column (e.g. 1 for right/wrong, 2 for a 0-1-2 rubric). Default: observed maximum. */
  readonly maxScores?: ArrayLike<number>;
  /** Newton-Raphson steps at most. Default 100. */
  readonly maxIterations?: number;
  /** Stop when the largest step is below this, logits. Default 1e-9. */
  readonly tolerance?: number;
}

/** One item's partial credit parameters. */
export interface PcmItem {
  readonly id: string;
  /** δ_i1..δ_im (step or Andrich-threshold difficulties), logits; one value for a dichotomous item (= b). */
  readonly steps: Float64Array;
  readonly stepStandardErrors: Float64Array;
  /** Mean of the steps: the item's location. */
  readonly location: number;
  readonly locationStandardError: number;
}

export interface PcmCalibration {
  readonly method: 'cml-pcm';
  readonly items: readonly PcmItem[];
  /** Conditional log-likelihood at the solution. */
  readonly logLikelihood: number;
  readonly iterations: number;
  readonly converged: boolean;
  readonly excludedItems: readonly PcmExclusion[];
  readonly excludedPersons: readonly PcmExclusion[];
}

/**
 * Conditional maximum likelihood calibration of the partial credit model (Masters 1982), for
 * tests that mix right/wrong items with items scored 0..m (for example a 0-1-2 rubric).
 * Dichotomous items are the case m = 1, so a test of right/wrong items only gives the Rasch CML.
 *
 * Persons are grouped by the items they answered and conditioned on their total score; the
 * likelihood, its gradient and the exact conditional information come from
 * {@link addPcmBookletTerms}, computed in the cumulative parameters ψ_ih = δ_i1 + … + δ_ih and
 * carried to the steps by the chain rule. Newton-Raphson with step halving; identification: the
 * mean item location (mean of each item's steps, averaged over items) is zero, which for
 * dichotomous items is the usual mean-zero difficulty. Standard errors come from the inverse
 * information with the null direction (all steps + c) fixed and are then projected onto the
 * constraint.
 *
 * Parametrisation against R's eRm: `PCM()` reports betapar = cumulative category easiness
 * β_ih = −(δ_i1 + … + δ_ih) under its own sum-zero normalisation, and `thresholds()` returns the
 * δ_ih; the two agree with these steps after one common shift.
 *
 * @see Masters, G. N. (1982). A Rasch model for partial credit scoring. Psychometrika 47(2), 149-174.
 * @see Andersen, E. B. (1977). Sufficient statistics and latent trait models. Psychometrika 42, 69-81.
 * @see Mair, P., & Hatzinger, R. (2007). Extended Rasch modeling: The eRm package for the
 *   application of IRT models in R. Journal of Statistical Software 20(9) (eRm's PCM parametrisation).
 * @param matrix scores 0..m_i or MISSING.
 * @param options maxScores (default observed maxima), maxIterations (100), tolerance (1e-9).
 * @returns steps with SEs, locations, the conditional log-likelihood and exclusions.
 * @throws when fewer than two items remain, a score is above its maximum, or the information is singular.
 * @example
 * // see test/scoring/rasch/calibrate-pcm.test.ts: eRm pcmdat2 steps agree with eRm 1.0-2 thresholds() within 1e-3
 */
export function calibratePcm(matrix: ResponseMatrix, options: CalibratePcmOptions = {}): PcmCalibration {
  const maxIterations = options.maxIterations ?? 100;
  const tolerance = options.tolerance ?? 1e-9;
  const groups = groupPcmScoreGroups(matrix, options.maxScores);
  const nItems = groups.itemIndex.length;
  if (nItems < 2) throw new Error('calibratePcm requires at least two items with informative responses');
  const { offsets, categoryCounts } = groups;
  const size = offsets[nItems]!;
  const itemOf = new Int32Array(size);
  for (let k = 0; k < nItems; k++) for (let s = offsets[k]!; s < offsets[k + 1]!; s++) itemOf[s] = k;
  // constraint weights: mean location = Σ_k a_k δ_k with a = 1 / (I · m_i)
  const constraint = Float64Array.from(itemOf, (k) => 1 / (nItems * (offsets[k + 1]! - offsets[k]!)));

  const evaluate = (delta: Float64Array) => {
    const psi = new Float64Array(size);
    for (let k = 0; k < nItems; k++) {
      let sum = 0;
      for (let s = offsets[k]!; s < offsets[k + 1]!; s++) psi[s] = sum += delta[s]!;
    }
    const terms: PcmLikelihoodTerms = {
      logNormaliser: 0,
      expected: new Float64Array(size),
      information: new Float64Array(size * size),
    };
    for (const booklet of groups.booklets)
      addPcmBookletTerms(booklet.items, booklet.counts, psi, offsets, terms);
    let logLikelihood = -terms.logNormaliser;
    for (let s = 0; s < size; s++) logLikelihood -= categoryCounts[s]! * psi[s]!;
    // chain rule ψ → δ: ∂/∂δ_ik = Σ_{h ≥ k} ∂/∂ψ_ih (reverse cumulative sums within each item)
    const gradient = new Float64Array(size);
    for (let s = 0; s < size; s++) gradient[s] = terms.expected[s]! - categoryCounts[s]!;
    reverseCumulate(gradient, 1, size, offsets, nItems);
    const information = terms.information!;
    reverseCumulate(information, size, size, offsets, nItems); // rows
    for (let row = 0; row < size; row++)
      reverseCumulate(information.subarray(row * size, (row + 1) * size), 1, size, offsets, nItems);
    return { logLikelihood, gradient, information };
  };
  const factorOf = (information: Float64Array) => {
    const a = new Float64Array(size * size);
    for (let u = 0; u < size; u++)
      for (let v = 0; v < size; v++) a[u * size + v] = information[u * size + v]! + 1;
    const factor = choleskyDecompose(a, size);
    if (factor === null)
      throw new Error('calibratePcm requires a connected design (information is singular)');
    return factor;
  };

  const delta = new Float64Array(size);
  let current = evaluate(delta);
  let iterations = 0;
  let converged = false;
  while (!converged && iterations < maxIterations) {
    iterations++;
    const step = choleskySolve(factorOf(current.information), size, current.gradient);
    let largest = 0;
    for (const s of step) largest = Math.max(largest, Math.abs(s));
    let scale = largest > 2 ? 2 / largest : 1;
    let trial = delta;
    let next = current;
    for (let halving = 0; halving < 30; halving++) {
      trial = Float64Array.from(delta, (d, s) => d + scale * step[s]!);
      normalise(trial, constraint);
      next = evaluate(trial);
      if (next.logLikelihood >= current.logLikelihood - 1e-10 * Math.abs(current.logLikelihood)) break;
      scale /= 2;
    }
    delta.set(trial);
    current = next;
    if (largest * scale < tolerance) converged = true;
  }

  // Cov of the normalised parameters: P G Pᵀ with P = I − 1aᵀ and G = (H + 11ᵀ)⁻¹
  const g = choleskyInverse(factorOf(current.information), size);
  const ga = new Float64Array(size); // G a
  for (let u = 0; u < size; u++) for (let v = 0; v < size; v++) ga[u]! += g[u * size + v]! * constraint[v]!;
  let aga = 0;
  for (let u = 0; u < size; u++) aga += constraint[u]! * ga[u]!;
  const covariance = (u: number, v: number) => g[u * size + v]! - ga[u]! - ga[v]! + aga;

  const items = Array.from(groups.itemIndex, (column, k): PcmItem => {
    const from = offsets[k]!;
    const to = offsets[k + 1]!;
    const m = to - from;
    const steps = delta.slice(from, to);
    const stepStandardErrors = Float64Array.from({ length: m }, (_, h) =>
      Math.sqrt(Math.max(covariance(from + h, from + h), 0)),
    );
    let location = 0;
    let locationVariance = 0;
    for (let u = from; u < to; u++) {
      location += delta[u]! / m;
      for (let v = from; v < to; v++) locationVariance += covariance(u, v) / (m * m);
    }
    return {
      id: matrix.itemIds[column]!,
      steps,
      stepStandardErrors,
      location,
      locationStandardError: Math.sqrt(Math.max(locationVariance, 0)),
    };
  });
  return {
    method: 'cml-pcm',
    items,
    logLikelihood: current.logLikelihood,
    iterations,
    converged,
    excludedItems: groups.excludedItems,
    excludedPersons: groups.excludedPersons,
  };
}

/** Within each item, replaces entry k (in strides of `stride`) by the sum over entries h ≥ k. */
function reverseCumulate(
  values: Float64Array,
  stride: number,
  columns: number,
  offsets: Int32Array,
  nItems: number,
): void {
  const lanes = stride === 1 ? 1 : columns;
  for (let k = 0; k < nItems; k++) {
    for (let s = offsets[k + 1]! - 2; s >= offsets[k]!; s--) {
      for (let lane = 0; lane < lanes; lane++) values[s * stride + lane]! += values[(s + 1) * stride + lane]!;
    }
  }
}

/** Shifts all steps by one constant so the mean item location Σ a_s δ_s is zero. */
function normalise(delta: Float64Array, constraint: Float64Array): void {
  let mean = 0;
  for (let s = 0; s < delta.length; s++) mean += constraint[s]! * delta[s]!;
  for (let s = 0; s < delta.length; s++) delta[s]! -= mean;
}
