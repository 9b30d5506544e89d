/**
 * Marginal maximum likelihood (MML) calibration of the Rasch model with a normal ability
 * distribution per group.
 *
 * Method: Bock-Aitkin EM with Gauss-Hermite quadrature, accelerated by Newton-Raphson on the
 * marginal log-likelihood. The EM cycles start from a logit (PROX-like) guess and run until the
 * parameters move less than 0.01 logits (at most 25 cycles); then Newton steps with the exact
 * observed information (analytic second derivatives via Louis' identity, see mml-marginal.ts)
 * and step halving converge quadratically. Should a Newton step fail (information not positive
 * definite, or no increase after halving), an EM cycle is taken instead.
 *
 * Persons are collapsed into (group, answered item set, raw score) cells, since the Rasch raw
 * score is sufficient for θ: the work per iteration grows with the number of cells, not persons.
 * Missing answers (missing by design, adaptive routing) are skipped.
 *
 * Identification: without anchors the first group's mean is fixed at 0 and every item is
 * free; with anchors the anchored items keep their values and every group mean is free.
 * `fixedSd` fixes every group's SD (for example at 1 for published θ ~ N(0,1) solutions).
 *
 * Standard errors: square roots of the diagonal of the inverse observed information, i.e. the
 * negative analytic Hessian of the quadrature marginal log-likelihood at the solution (Louis
 * 1982), not the cross-product approximation.
 *
 * @see Bock, R. D., & Aitkin, M. (1981). Marginal maximum likelihood estimation of item
 *   parameters: application of an EM algorithm. Psychometrika 46, 443–459.
 * @see Louis, T. A. (1982). Finding the observed information matrix when using the EM algorithm.
 *   JRSS B 44, 226–233.
 * @see Bock, R. D., & Zimowski, M. F. (1997). Multiple group IRT. In van der Linden & Hambleton
 *   (Eds.), Handbook of Modern Item Response Theory, 433–448.
 */
import { normalQuadrature } from '../quadrature/gauss-hermite.js';
import type { ResponseMatrix } from '../response-matrix.js';
import { choleskyDecompose, choleskyInverse, choleskySolve } from '../statistics/cholesky.js';
import { evaluateMmlMarginal, type MmlEvaluation, type MmlParameters } from './mml-marginal.js';
import { collectMmlScoreGroups, type MmlScoreGroups } from './mml-score-groups.js';
import type { ItemCalibration } from './types.js';

export interface CalibrateMmlOptions {
  /** Group of each person and the group labels; default one group labelled 'all'. */
  readonly groups?: { readonly index: Int32Array; readonly labels: readonly string[] };
  /** Gauss-Hermite points, default 41. */
  readonly quadraturePoints?: number;
  /** Item id -> fixed difficulty (logits); every id must be an item of the matrix. */
  readonly anchors?: ReadonlyMap<string, number>;
  /** Fix every group's SD at this value instead of estimating it. */
  readonly fixedSd?: number;
  /** EM cycles plus Newton steps, default 200. */
  readonly maxIterations?: number;
  /** Largest parameter change (logits) at convergence, default 1e-6. */
  readonly tolerance?: number;
}

export interface MmlGroupEstimate {
  readonly label: string;
  readonly mean: number;
  readonly sd: number;
  /** 0 when the mean was fixed for identification. */
  readonly meanStandardError: number;
  /** 0 when the SD was fixed. */
  readonly sdStandardError: number;
  readonly persons: number;
}

export type MmlCalibration = ItemCalibration & { readonly groups: readonly MmlGroupEstimate[] };

const EM_SWITCH_CHANGE = 0.01;
const EM_WARMUP_CYCLES = 25;

/**
 * Calibrates Rasch item difficulties and group ability distributions by MML.
 *
 * @param matrix 0/1 responses with MISSING for items not presented.
 * @param options groups, quadrature points, anchors, fixedSd, maxIterations, tolerance.
 * @returns difficulties with SEs, group means and SDs with SEs, marginal log-likelihood,
 *   iterations and whether the tolerance was met.
 * @throws when an anchor is not an item of the matrix, no item is left, a group has no persons,
 *   or the information matrix
 *   at the solution is singular (an unidentified design).
 * @example
 * // LSAT-6 (Bock & Lieberman 1970) with θ ~ N(0,1): b[0] ≈ −2.8720, logLikelihood ≈ −2473.054.
 * const fit = calibrateMml(lsat6, { fixedSd: 1 });
 */
export function calibrateMml(matrix: ResponseMatrix, options: CalibrateMmlOptions = {}): MmlCalibration {
  const personCount = matrix.personIds.length;
  const labels = options.groups?.labels ?? ['all'];
  const groupIndex = options.groups?.index ?? new Int32Array(personCount);
  const groupCount = labels.length;
  const quadraturePoints = options.quadraturePoints ?? 41;
  const maxIterations = options.maxIterations ?? 200;
  const tolerance = options.tolerance ?? 1e-6;
  const fixedSd = options.fixedSd;
  if (groupCount < 1) throw new Error('calibrateMml requires at least one group label');
  if (fixedSd !== undefined && !(fixedSd > 0 && Number.isFinite(fixedSd))) {
    throw new Error('calibrateMml requires a positive fixedSd');
  }
  const anchors = new Map<string, number>();
  const known = new Set(matrix.itemIds);
  for (const [id, value] of options.anchors ?? []) {
    if (!known.has(id)) throw new Error(`calibrateMml anchor ${id} is not an item of the matrix`);
    if (!Number.isFinite(value)) throw new Error(`calibrateMml anchor ${id} must be finite`);
    anchors.set(id, value);
  }

  const cells = collectMmlScoreGroups(matrix, groupIndex, groupCount, new Set(anchors.keys()));
  const itemCount = cells.itemIds.length;
  if (itemCount === 0) throw new Error('calibrateMml requires at least one item with varied responses');
  for (let g = 0; g < groupCount; g++) {
    if (cells.groupPersons[g] === 0) throw new Error(`calibrateMml group ${labels[g]} has no responses`);
  }

  // Which parameters are free (full layout: items, then μ_g, σ_g per group).
  const dim = itemCount + 2 * groupCount;
  const free = new Uint8Array(dim);
  const difficulty = new Float64Array(itemCount);
  let anchored = 0;
  for (let i = 0; i < itemCount; i++) {
    const anchor = anchors.get(cells.itemIds[i]!);
    if (anchor === undefined) {
      free[i] = 1;
      const p = (cells.itemCorrect[i]! + 0.5) / (cells.itemAnswered[i]! + 1);
      // Logit of the p-value, widened for a unit-variance ability spread (PROX, 1.7² ≈ 2.9).
      difficulty[i] = -Math.log(p / (1 - p)) * Math.sqrt(1 + 1 / 2.9);
    } else {
      difficulty[i] = anchor;
      anchored++;
    }
  }
  const mean = new Float64Array(groupCount);
  const sd = new Float64Array(groupCount).fill(fixedSd ?? 1);
  for (let g = 0; g < groupCount; g++) {
    free[itemCount + 2 * g] = anchored > 0 || g > 0 ? 1 : 0;
    free[itemCount + 2 * g + 1] = fixedSd === undefined ? 1 : 0;
  }
  const freeIndex: number[] = [];
  for (let d = 0; d < dim; d++) if (free[d]) freeIndex.push(d);
  const freeCount = freeIndex.length;

  const rule = normalQuadrature(quadraturePoints, 0, 1);
  const z = rule.nodes;
  const logWeight = rule.weights.map(Math.log);
  const parameters: MmlParameters = { difficulty, mean, sd };

  let iterations = 0;
  let converged = false;
  let useNewton = false;
  let current = evaluateMmlMarginal(cells, parameters, z, logWeight, { hessian: false, em: true });
  while (iterations < maxIterations) {
    iterations++;
    if (useNewton) {
      if (!current.hessian) {
        current = evaluateMmlMarginal(cells, parameters, z, logWeight, { hessian: true, em: true });
      }
      const step = newtonStep(cells, parameters, current, freeIndex, z, logWeight);
      if (step) {
        current = step.evaluation;
        if (step.change < tolerance) {
          converged = true;
          break;
        }
        continue;
      }
    }
    const change = emCycle(cells, parameters, current, free, z);
    current = evaluateMmlMarginal(cells, parameters, z, logWeight, { hessian: false, em: true });
    if (change < EM_SWITCH_CHANGE || iterations >= EM_WARMUP_CYCLES) useNewton = true;
  }

  // Standard errors from the observed information at the solution.
  const final = current.hessian
    ? current
    : evaluateMmlMarginal(cells, parameters, z, logWeight, { hessian: true, em: false });
  const factor = choleskyDecompose(negatedSubmatrix(final.hessian!, dim, freeIndex), freeCount);
  if (!factor)
    throw new Error('calibrateMml information matrix is singular (unidentified design or an SD near 0)');
  const covariance = choleskyInverse(factor, freeCount);
  const standardErrorFull = new Float64Array(dim);
  freeIndex.forEach((d, k) => {
    standardErrorFull[d] = Math.sqrt(covariance[k * freeCount + k]!);
  });

  return {
    method: 'mml',
    itemIds: cells.itemIds,
    difficulty: Float64Array.from(difficulty),
    standardError: standardErrorFull.slice(0, itemCount),
    logLikelihood: final.logLikelihood,
    iterations,
    converged,
    excludedItems: cells.excludedItems,
    excludedPersons: cells.excludedPersons,
    groups: labels.map((label, g) => ({
      label,
      mean: mean[g]!,
      sd: sd[g]!,
      meanStandardError: standardErrorFull[itemCount + 2 * g]!,
      sdStandardError: standardErrorFull[itemCount + 2 * g + 1]!,
      persons: cells.groupPersons[g]!,
    })),
  };
}

/**
 * One Bock-Aitkin EM cycle from the expected counts in `current`; updates `parameters` in place.
 * Items: solve Σ_gq N_igq P(θ_gq − b_i) = s_i by a bounded 1-D Newton. Groups: posterior mean and
 * variance of θ (with a fixed mean or SD kept).
 * @returns the largest parameter change.
 */
function emCycle(
  cells: MmlScoreGroups,
  parameters: MmlParameters,
  current: MmlEvaluation,
  free: Uint8Array,
  z: Float64Array,
): number {
  const { difficulty, mean, sd } = parameters;
  const itemCount = difficulty.length;
  const groupCount = mean.length;
  const nodes = z.length;
  const counts = current.itemNodeCounts!;
  const moments = current.groupMoments!;
  let change = 0;
  for (let i = 0; i < itemCount; i++) {
    if (!free[i]) continue;
    const target = cells.itemCorrect[i]!;
    let bi = difficulty[i]!;
    for (let step = 0; step < 20; step++) {
      let f = -target;
      let slope = 0;
      for (let g = 0; g < groupCount; g++) {
        const offset = (i * groupCount + g) * nodes;
        for (let q = 0; q < nodes; q++) {
          const n = counts[offset + q]!;
          if (n === 0) continue;
          const p = 1 / (1 + Math.exp(bi - mean[g]! - sd[g]! * z[q]!));
          f += n * p;
          slope += n * p * (1 - p);
        }
      }
      if (!(slope > 0)) break;
      const delta = Math.max(-1, Math.min(1, f / slope));
      bi += delta;
      if (Math.abs(delta) < 1e-10) break;
    }
    change = Math.max(change, Math.abs(bi - difficulty[i]!));
    difficulty[i] = bi;
  }
  for (let g = 0; g < groupCount; g++) {
    const n = moments[3 * g]!;
    const m1 = moments[3 * g + 1]! / n;
    const m2 = moments[3 * g + 2]! / n;
    const mu = mean[g]!;
    const sigma = sd[g]!;
    const newMean = free[itemCount + 2 * g] ? mu + sigma * m1 : mu;
    if (free[itemCount + 2 * g + 1]) {
      const shift = mu - newMean;
      const variance = sigma * sigma * m2 + 2 * sigma * shift * m1 + shift * shift;
      const newSd = Math.sqrt(Math.max(variance, 1e-8));
      change = Math.max(change, Math.abs(newSd - sigma));
      sd[g] = newSd;
    }
    change = Math.max(change, Math.abs(newMean - mu));
    mean[g] = newMean;
  }
  return change;
}

/**
 * A Newton-Raphson step on the free parameters from `current` (which carries the Hessian), with
 * step halving (at most 12 halvings).
 * @returns the new evaluation (with Hessian and EM counts) and the largest parameter change, or
 *   null when the information is not positive definite or no step increases the log-likelihood.
 */
function newtonStep(
  cells: MmlScoreGroups,
  parameters: MmlParameters,
  current: MmlEvaluation,
  freeIndex: readonly number[],
  z: Float64Array,
  logWeight: Float64Array,
): { evaluation: MmlEvaluation; change: number } | null {
  const itemCount = parameters.difficulty.length;
  const dim = current.gradient.length;
  const freeCount = freeIndex.length;
  if (freeCount === 0) return { evaluation: current, change: 0 };
  const factor = choleskyDecompose(negatedSubmatrix(current.hessian!, dim, freeIndex), freeCount);
  if (!factor) return null;
  const gradient = Float64Array.from(freeIndex, (d) => current.gradient[d]!);
  const step = choleskySolve(factor, freeCount, gradient);
  const start = saveParameters(parameters);
  const floor = current.logLikelihood - 1e-10 * Math.abs(current.logLikelihood);
  let scale = 1;
  for (let halving = 0; halving <= 12; halving++, scale /= 2) {
    let valid = true;
    freeIndex.forEach((d, k) => {
      const value = start[d]! + scale * step[k]!;
      if (d >= itemCount && (d - itemCount) % 2 === 1 && !(value > 0)) valid = false;
      setParameter(parameters, d, value);
    });
    if (!valid) continue;
    const evaluation = evaluateMmlMarginal(cells, parameters, z, logWeight, { hessian: true, em: true });
    if (evaluation.logLikelihood >= floor) {
      let change = 0;
      for (let k = 0; k < freeCount; k++) change = Math.max(change, Math.abs(scale * step[k]!));
      return { evaluation, change };
    }
  }
  for (let d = 0; d < dim; d++) setParameter(parameters, d, start[d]!);
  return null;
}

function negatedSubmatrix(hessian: Float64Array, dim: number, freeIndex: readonly number[]): Float64Array {
  const n = freeIndex.length;
  const out = new Float64Array(n * n);
  for (let a = 0; a < n; a++) {
    const row = freeIndex[a]! * dim;
    for (let c = 0; c < n; c++) out[a * n + c] = -hessian[row + freeIndex[c]!]!;
  }
  return out;
}

function saveParameters(parameters: MmlParameters): Float64Array {
  const itemCount = parameters.difficulty.length;
  const groupCount = parameters.mean.length;
  const out = new Float64Array(itemCount + 2 * groupCount);
  out.set(parameters.difficulty);
  for (let g = 0; g < groupCount; g++) {
    out[itemCount + 2 * g] = parameters.mean[g]!;
    out[itemCount + 2 * g + 1] = parameters.sd[g]!;
  }
  return out;
}

function setParameter(parameters: MmlParameters, d: number, value: number): void {
  const itemCount = parameters.difficulty.length;
  if (d < itemCount) {
    parameters.difficulty[d] = value;
    return;
  }
  const g = (d - itemCount) >> 1;
  if ((d - itemCount) % 2 === 0) parameters.mean[g] = value;
  else parameters.sd[g] = value;
}
