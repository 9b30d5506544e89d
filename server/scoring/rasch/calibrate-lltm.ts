import type { ResponseMatrix } from '../response-matrix.js';
import { chiSquaredUpperTail } from '../statistics/chi-squared-upper-tail.js';
import { choleskyDecompose, choleskyInverse, choleskySolve } from '../statistics/cholesky.js';
import { calibrateCml } from './calibrate-cml.js';
import { groupScoreGroups } from './cml-score-groups.js';
import { addBookletTerms, type ConditionalLikelihoodTerms } from './conditional-likelihood.js';
import type { Exclusion, ItemCalibration } from './types.js';

/** The LLTM design (Q) matrix: how much of each feature every item has. */
export interface LltmDesign {
  /** One name per column, used in messages and reports. */
  readonly featureNames: readonly string[];
  /** Row-major items × features, rows aligned with `matrix.itemIds`. */
  readonly weights: Float64Array;
}

export interface CalibrateLltmOptions {
  /** Newton-Raphson steps at most. Default 100. */
  readonly maxIterations?: number;
  /** Stop when the largest step in η is below this, logits. Default 1e-9. */
  readonly tolerance?: number;
  /** A feature is collinear when its residual norm is below this share of its centred norm. Default 1e-9. */
  readonly collinearityTolerance?: number;
}

export interface LltmCalibration {
  readonly featureNames: readonly string[];
  /** η_j, logits of difficulty per unit of feature j (positive: the feature makes items harder). */
  readonly weights: Float64Array;
  readonly weightStandardErrors: Float64Array;
  /** Cov(η), row-major p × p (inverse conditional information). */
  readonly weightCovariance: Float64Array;
  /** Mean feature vector w̄ of the calibrated items: b = (w − w̄)ᵀη puts difficulties at mean zero. */
  readonly featureMeans: Float64Array;
  /** Ids of the calibrated items. */
  readonly itemIds: readonly string[];
  /** Model difficulties b_i = (w_i − w̄)ᵀη, mean zero, in the order of `itemIds`. */
  readonly difficulty: Float64Array;
  readonly difficultyStandardError: Float64Array;
  /** Conditional log-likelihood at η̂. */
  readonly logLikelihood: number;
  /** The plain Rasch CML calibration of the same items, and the LR test of the LLTM against it. */
  readonly rasch: ItemCalibration;
  readonly likelihoodRatio: {
    /** 2 (log L_Rasch − log L_LLTM). */
    readonly statistic: number;
    /** (I − 1) − p, as eRm's `anova(RM, LLTM)`. */
    readonly degreesOfFreedom: number;
    /** Upper-tail χ² probability; NaN only when df is 0 (a saturated design). */
    readonly pValue: number;
  };
  readonly iterations: number;
  readonly converged: boolean;
  readonly excludedItems: readonly Exclusion[];
  readonly excludedPersons: readonly Exclusion[];
}

/** A design matrix whose features cannot all be estimated; `features` names the ones involved. */
export class LltmDesignError extends Error {
  readonly features: readonly string[];
  constructor(message: string, features: readonly string[]) {
    super(message);
    this.name = 'LltmDesignError';
    this.features = features;
  }
}

/**
 * The linear logistic test model (LLTM) fitted by conditional maximum likelihood: item
 * difficulties are a weighted sum of design features, b_i = Σ_j w_ij η_j + c.
 *
 * The conditional likelihood is the Rasch one evaluated at b = Wη, so the elementary symmetric
 * functions and score-group code of the Rasch CML are reused: the gradient is Wᵀ(E − s) and the
 * information WᵀI_bW (chain rule), and Newton-Raphson with step halving maximises the concave
 * likelihood. The conditional likelihood does not change when every b shifts by c, so c is not
 * estimable: it is set to put the mean model difficulty at zero, the Rasch calibration's origin.
 * Hence η is identified only when the constant and the features are linearly independent, i.e.
 * when the centred columns of W have full rank. That is checked first by modified Gram-Schmidt
 * with a relative tolerance: a feature whose centred column is (within tolerance) a combination
 * of the constant and the earlier features is an error naming it and those features (for example
 * one-hot chart types that always sum to one, or a feature every item shares).
 *
 * Parametrisation against R's eRm: eRm reports easiness, betapar = W etapar, so η = −etapar.
 *
 * @see Fischer, G. H. (1973). The linear logistic test model as an instrument in educational
 *   research. Acta Psychologica 37, 359-374.
 * @see Fischer, G. H. (1995). The linear logistic test model. In G. H. Fischer & I. W. Molenaar
 *   (Eds.), Rasch Models, ch. 8 (CML equations, uniqueness condition on the centred design, the
 *   conditional LR test against the Rasch model with (k − 1) − p df).
 * @see Björck, Å. (1996). Numerical Methods for Least Squares Problems. SIAM, §2.4 (modified
 *   Gram-Schmidt as a rank-revealing step; from memory for the section).
 * @param matrix 0/1 responses or MISSING.
 * @param design feature names and the items × features weights.
 * @param options maxIterations (default 100), tolerance (default 1e-9), collinearityTolerance (1e-9).
 * @returns η with SEs and covariance, model difficulties, the conditional log-likelihood, the
 *   Rasch calibration and the LR test.
 * @throws LltmDesignError for a collinear design; Error for a design of the wrong shape.
 * @example
 * // see test/scoring/rasch/calibrate-lltm.test.ts: eRm lltmdat2 with W = [[1,2],[2,2],[1,1],[3,1],[2,1]]
 * // gives η = (0.0978, −0.1141) (eRm 1.0-2 etapar, sign turned to difficulty), LR = 1.049 on 2 df
 */
export function calibrateLltm(
  matrix: ResponseMatrix,
  design: LltmDesign,
  options: CalibrateLltmOptions = {},
): LltmCalibration {
  const maxIterations = options.maxIterations ?? 100;
  const tolerance = options.tolerance ?? 1e-9;
  const p = design.featureNames.length;
  const nAll = matrix.itemIds.length;
  if (p === 0) throw new Error('calibrateLltm requires at least one feature');
  if (design.weights.length !== nAll * p)
    throw new Error('calibrateLltm requires weights of length items × features');
  for (const w of design.weights)
    if (!Number.isFinite(w)) throw new Error('calibrateLltm requires finite weights');

  const groups = groupScoreGroups(matrix);
  const n = groups.itemIndex.length;
  if (n < 2) throw new Error('calibrateLltm requires at least two items with informative responses');
  // centred design over the calibrated items
  const featureMeans = new Float64Array(p);
  for (const column of groups.itemIndex)
    for (let j = 0; j < p; j++) featureMeans[j]! += design.weights[column * p + j]! / n;
  const centred = new Float64Array(n * p);
  groups.itemIndex.forEach((column, i) => {
    for (let j = 0; j < p; j++) centred[i * p + j] = design.weights[column * p + j]! - featureMeans[j]!;
  });
  // a column's size before centring: a constant column centres to rounding noise, not to exact zeros
  const rawNorms = Float64Array.from({ length: p }, (_, j) =>
    Math.hypot(...Array.from(groups.itemIndex, (column) => design.weights[column * p + j]!)),
  );
  checkRank(centred, rawNorms, n, p, design.featureNames, options.collinearityTolerance ?? 1e-9);

  const evaluate = (eta: Float64Array) => {
    const b = new Float64Array(n);
    for (let i = 0; i < n; i++) for (let j = 0; j < p; j++) b[i]! += centred[i * p + j]! * eta[j]!;
    const terms: ConditionalLikelihoodTerms = {
      logNormaliser: 0,
      expected: new Float64Array(n),
      information: new Float64Array(n * n),
    };
    for (const booklet of groups.booklets) {
      const local = Float64Array.from(booklet.items, (k) => b[k]!);
      addBookletTerms(local, booklet.counts, booklet.items, terms, n);
    }
    let logLikelihood = -terms.logNormaliser;
    for (let i = 0; i < n; i++) logLikelihood -= groups.itemTotals[i]! * b[i]!;
    // chain rule through b = W̃η
    const gradient = new Float64Array(p);
    for (let i = 0; i < n; i++) {
      const g = terms.expected[i]! - groups.itemTotals[i]!;
      for (let j = 0; j < p; j++) gradient[j]! += centred[i * p + j]! * g;
    }
    const information = new Float64Array(p * p);
    const infoW = new Float64Array(n * p); // I_b W̃
    for (let i = 0; i < n; i++)
      for (let k = 0; k < n; k++) {
        const v = terms.information![i * n + k]!;
        if (v === 0) continue;
        for (let j = 0; j < p; j++) infoW[i * p + j]! += v * centred[k * p + j]!;
      }
    for (let a = 0; a < p; a++)
      for (let c = 0; c < p; c++) {
        let sum = 0;
        for (let i = 0; i < n; i++) sum += centred[i * p + a]! * infoW[i * p + c]!;
        information[a * p + c] = sum;
      }
    return { b, logLikelihood, gradient, information };
  };
  const factorOf = (information: Float64Array) => {
    const factor = choleskyDecompose(information, p);
    if (factor === null)
      throw new Error('calibrateLltm information is singular (the data do not separate the features)');
    return factor;
  };

  const eta = new Float64Array(p);
  let current = evaluate(eta);
  let iterations = 0;
  let converged = false;
  while (!converged && iterations < maxIterations) {
    iterations++;
    const step = choleskySolve(factorOf(current.information), p, current.gradient);
    let largest = 0;
    for (const s of step) largest = Math.max(largest, Math.abs(s));
    let scale = largest > 2 ? 2 / largest : 1;
    let trial = eta;
    let next = current;
    for (let halving = 0; halving < 30; halving++) {
      trial = Float64Array.from(eta, (e, j) => e + scale * step[j]!);
      next = evaluate(trial);
      if (next.logLikelihood >= current.logLikelihood - 1e-10 * Math.abs(current.logLikelihood)) break;
      scale /= 2;
    }
    eta.set(trial);
    current = next;
    if (largest * scale < tolerance) converged = true;
  }

  const weightCovariance = choleskyInverse(factorOf(current.information), p);
  const weightStandardErrors = Float64Array.from({ length: p }, (_, j) =>
    Math.sqrt(weightCovariance[j * p + j]!),
  );
  const difficultyStandardError = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let variance = 0;
    for (let a = 0; a < p; a++)
      for (let c = 0; c < p; c++)
        variance += centred[i * p + a]! * weightCovariance[a * p + c]! * centred[i * p + c]!;
    difficultyStandardError[i] = Math.sqrt(variance);
  }
  const itemIds = Array.from(groups.itemIndex, (c) => matrix.itemIds[c]!);
  const rasch = calibrateCml(matrix, { maxIterations, tolerance });
  const statistic = Math.max(0, 2 * (rasch.logLikelihood - current.logLikelihood));
  const degreesOfFreedom = n - 1 - p;
  return {
    featureNames: design.featureNames,
    weights: eta,
    weightStandardErrors,
    weightCovariance,
    featureMeans,
    itemIds,
    difficulty: current.b,
    difficultyStandardError,
    logLikelihood: current.logLikelihood,
    rasch,
    likelihoodRatio: {
      statistic,
      degreesOfFreedom,
      pValue: degreesOfFreedom > 0 ? chiSquaredUpperTail(statistic, degreesOfFreedom) : Number.NaN,
    },
    iterations,
    converged,
    excludedItems: groups.excludedItems,
    excludedPersons: groups.excludedPersons,
  };
}

/**
 * Modified Gram-Schmidt on the centred columns (the constant is already projected out by the
 * centring); throws naming the first dependent feature and the features it is a combination of.
 */
function checkRank(
  centred: Float64Array,
  rawNorms: Float64Array,
  n: number,
  p: number,
  names: readonly string[],
  tolerance: number,
): void {
  if (p > n - 1)
    throw new LltmDesignError(
      `calibrateLltm design has ${p} features for ${n} items; at most ${n - 1} can be estimated`,
      [...names],
    );
  const basis: Float64Array[] = [];
  const independent: number[] = [];
  for (let j = 0; j < p; j++) {
    const column = Float64Array.from({ length: n }, (_, i) => centred[i * p + j]!);
    const residual = Float64Array.from(column);
    for (const q of basis) {
      let dot = 0;
      for (let i = 0; i < n; i++) dot += q[i]! * residual[i]!;
      for (let i = 0; i < n; i++) residual[i]! -= dot * q[i]!;
    }
    const norm = Math.hypot(...residual);
    const scale = Math.hypot(...column);
    const constant = scale <= tolerance * rawNorms[j]!;
    if (constant || norm <= tolerance * scale) {
      const involved = constant ? [] : combinationOf(column, centred, n, p, independent);
      const others = involved.map((k) => `"${names[k]}"`);
      const what =
        others.length === 0
          ? 'is the same for every item (collinear with the constant)'
          : `is a linear combination of the constant and ${others.join(', ')}`;
      throw new LltmDesignError(`calibrateLltm design matrix is singular: feature "${names[j]}" ${what}`, [
        names[j]!,
        ...involved.map((k) => names[k]!),
      ]);
    }
    basis.push(residual.map((v) => v / norm));
    independent.push(j);
  }
}

/** Features (among `independent`) with a non-negligible least-squares coefficient for `column`. */
function combinationOf(
  column: Float64Array,
  centred: Float64Array,
  n: number,
  p: number,
  independent: readonly number[],
): number[] {
  const k = independent.length;
  const gram = new Float64Array(k * k);
  const right = new Float64Array(k);
  for (let a = 0; a < k; a++) {
    for (let i = 0; i < n; i++) right[a]! += centred[i * p + independent[a]!]! * column[i]!;
    for (let c = 0; c < k; c++) {
      let sum = 0;
      for (let i = 0; i < n; i++)
        sum += centred[i * p + independent[a]!]! * centred[i * p + independent[c]!]!;
      gram[a * k + c] = sum;
    }
  }
  const factor = choleskyDecompose(gram, k);
  if (factor === null) return [...independent];
  const coefficients = choleskySolve(factor, k, right);
  let largest = 0;
  for (const c of coefficients) largest = Math.max(largest, Math.abs(c));
  return independent.filter((_, a) => Math.abs(coefficients[a]!) > 1e-8 * Math.max(1, largest));
}
