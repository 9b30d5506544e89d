import type { ResponseMatrix } from '../response-matrix.js';
import { choleskyDecompose, choleskyInverse, choleskySolve } from '../statistics/cholesky.js';
import { groupScoreGroups } from './cml-score-groups.js';
import { addBookletTerms, type ConditionalLikelihoodTerms } from './conditional-likelihood.js';
import type { ItemCalibration } from './types.js';

export interface CalibrateCmlOptions {
  /** Items fixed at given difficulties (logits), e.g. from an earlier calibration. Default none. */
  readonly anchors?: ReadonlyMap<string, number>;
  /** Newton-Raphson steps at most. Default 100. */
  readonly maxIterations?: number;
  /** Stop when the largest step is below this, in logits. Default 1e-9. */
  readonly tolerance?: number;
  /** Called after each Newton step (e.g. for a progress line). */
  readonly onIteration?: (iteration: number, largestStep: number) => void;
}

/**
 * Conditional maximum likelihood (CML) calibration of the dichotomous Rasch model.
 *
 * Conditioning on each person's raw score removes the abilities from the likelihood, so item
 * difficulties are estimated consistently whatever the ability distribution. Persons are grouped
 * by the set of items they answered (booklets), so rotated forms and adaptive attempts calibrate
 * together; within a booklet only the count of persons at each raw score enters, which makes each
 * iteration independent of the number of persons. Newton-Raphson uses the exact conditional
 * Hessian, with step halving if the likelihood drops. Identification: mean difficulty zero over
 * the calibrated items, or the anchored items fixed at their values. Standard errors come from the
 * inverse information (the Moore-Penrose inverse under the sum-zero constraint).
 *
 * @see Andersen, E. B. (1972). The numerical solution of a set of conditional estimation equations.
 *   Journal of the Royal Statistical Society B 34(1), 42-54.
 * @see Fischer, G. H., & Molenaar, I. W. (Eds.) (1995). Rasch Models: Foundations, Recent
 *   Developments, and Applications. Springer, ch. 3 (CML equations, incomplete designs).
 * @param matrix responses, 0/1 or MISSING.
 * @param options anchors, maxIterations (default 100), tolerance (default 1e-9 logits).
 * @returns the calibration (method 'cml'); excluded persons and items are listed, not dropped silently.
 * @throws when an anchor names an unknown item, fewer than two items remain, or the design is not connected.
 * @example
 * // four persons on two items: item x right 3 times, item y once, among mixed patterns
 * const cal = calibrateCml({
 *   personIds: ['a', 'b', 'c', 'd'], itemIds: ['x', 'y'],
 *   scores: Uint8Array.of(1, 0, 1, 0, 1, 0, 0, 1),
 * });
 * Array.from(cal.difficulty); // [-0.5493061443340549, 0.5493061443340549] (= ∓ ln(3)/2)
 */
export function calibrateCml(matrix: ResponseMatrix, options: CalibrateCmlOptions = {}): ItemCalibration {
  const maxIterations = options.maxIterations ?? 100;
  const tolerance = options.tolerance ?? 1e-9;
  const anchors = options.anchors ?? new Map<string, number>();
  const columnOf = new Map(matrix.itemIds.map((id, i) => [id, i]));
  const anchoredColumns = new Set<number>();
  for (const [id, value] of anchors) {
    const column = columnOf.get(id);
    if (column === undefined) throw new Error(`calibrateCml anchor ${id} is not an item of the matrix`);
    if (!Number.isFinite(value)) throw new Error(`calibrateCml anchor ${id} must be finite`);
    anchoredColumns.add(column);
  }
  const groups = groupScoreGroups(matrix, anchoredColumns);
  const nItems = groups.itemIndex.length;
  if (nItems < 2) throw new Error('calibrateCml requires at least two items with informative responses');
  const itemIds = Array.from(groups.itemIndex, (c) => matrix.itemIds[c]!);
  const anchoredValue = new Float64Array(nItems).fill(Number.NaN);
  for (let i = 0; i < nItems; i++) {
    const value = anchors.get(itemIds[i]!);
    if (value !== undefined) anchoredValue[i] = value;
  }
  const free: number[] = [];
  for (let i = 0; i < nItems; i++) if (Number.isNaN(anchoredValue[i]!)) free.push(i);
  const anchored = free.length < nItems;

  const difficulty = startingValues(groups.booklets, groups.itemTotals, anchoredValue);
  const evaluate = (b: Float64Array, withInformation: boolean) => {
    const terms: ConditionalLikelihoodTerms = {
      logNormaliser: 0,
      expected: new Float64Array(nItems),
      information: withInformation ? new Float64Array(nItems * nItems) : null,
    };
    for (const booklet of groups.booklets) {
      const local = new Float64Array(booklet.items.length);
      for (let k = 0; k < local.length; k++) local[k] = b[booklet.items[k]!]!;
      addBookletTerms(local, booklet.counts, booklet.items, terms, nItems);
    }
    let logLikelihood = -terms.logNormaliser;
    for (let i = 0; i < nItems; i++) logLikelihood -= groups.itemTotals[i]! * b[i]!;
    return { ...terms, logLikelihood };
  };

  const nFree = free.length;
  // Reduced system over free items; without anchors add 11ᵀ to fix the sum-zero direction.
  const reducedMatrix = (information: Float64Array) => {
    const a = new Float64Array(nFree * nFree);
    for (let u = 0; u < nFree; u++) {
      for (let v = 0; v < nFree; v++) {
        a[u * nFree + v] = information[free[u]! * nItems + free[v]!]! + (anchored ? 0 : 1);
      }
    }
    const factor = choleskyDecompose(a, nFree);
    if (factor === null)
      throw new Error('calibrateCml requires a connected design (information is singular)');
    return factor;
  };

  let current = evaluate(difficulty, true);
  let iterations = 0;
  let converged = nFree === 0;
  while (!converged && iterations < maxIterations) {
    iterations++;
    const factor = reducedMatrix(current.information!);
    const gradient = new Float64Array(nFree); // ∂ log L / ∂ b_i = E_i − s_i
    for (let u = 0; u < nFree; u++) gradient[u] = current.expected[free[u]!]! - groups.itemTotals[free[u]!]!;
    const step = choleskySolve(factor, nFree, gradient);
    let largest = 0;
    for (let u = 0; u < nFree; u++) largest = Math.max(largest, Math.abs(step[u]!));
    // Cap wild first steps; the conditional likelihood is concave, so halving always recovers.
    let scale = largest > 2 ? 2 / largest : 1;
    let trial = difficulty;
    let next = current;
    for (let halving = 0; halving < 30; halving++) {
      trial = Float64Array.from(difficulty);
      for (let u = 0; u < nFree; u++) trial[free[u]!]! += scale * step[u]!;
      if (!anchored) centre(trial);
      next = evaluate(trial, true);
      if (next.logLikelihood >= current.logLikelihood - 1e-10 * Math.abs(current.logLikelihood)) break;
      scale /= 2;
    }
    difficulty.set(trial);
    current = next;
    if (largest * scale < tolerance) converged = true;
    options.onIteration?.(iterations, largest * scale);
  }

  const covariance = choleskyInverse(reducedMatrix(current.information!), nFree);
  const standardError = new Float64Array(nItems);
  for (let u = 0; u < nFree; u++) {
    const variance = covariance[u * nFree + u]! - (anchored ? 0 : 1 / (nItems * nItems));
    standardError[free[u]!] = Math.sqrt(Math.max(variance, 0));
  }
  return {
    method: 'cml',
    itemIds,
    difficulty,
    standardError,
    logLikelihood: current.logLikelihood,
    iterations,
    converged,
    excludedItems: groups.excludedItems,
    excludedPersons: groups.excludedPersons,
  };
}

function centre(b: Float64Array): void {
  let mean = 0;
  for (const v of b) mean += v;
  mean /= b.length;
  for (let i = 0; i < b.length; i++) b[i]! -= mean;
}

/** Log-odds of failure per item (PROX without expansion), shifted to the anchors when present. */
function startingValues(
  booklets: readonly { items: Int32Array; counts: Float64Array }[],
  totals: Float64Array,
  anchoredValue: Float64Array,
): Float64Array {
  const n = totals.length;
  const answered = new Float64Array(n);
  for (const booklet of booklets) {
    let persons = 0;
    for (const c of booklet.counts) persons += c;
    for (const i of booklet.items) answered[i]! += persons;
  }
  const b = new Float64Array(n);
  for (let i = 0; i < n; i++) b[i] = Math.log((answered[i]! - totals[i]! + 0.5) / (totals[i]! + 0.5));
  let shift = 0;
  let anchoredCount = 0;
  for (let i = 0; i < n; i++) {
    if (Number.isNaN(anchoredValue[i]!)) continue;
    shift += anchoredValue[i]! - b[i]!;
    anchoredCount++;
  }
  if (anchoredCount === 0) {
    centre(b);
    return b;
  }
  shift /= anchoredCount;
  for (let i = 0; i < n; i++) b[i] = Number.isNaN(anchoredValue[i]!) ? b[i]! + shift : anchoredValue[i]!;
  return b;
}
