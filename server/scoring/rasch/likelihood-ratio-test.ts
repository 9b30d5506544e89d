import { selectResponseMatrix } from '../build-response-matrix.js';
import { MISSING, type ResponseMatrix } from '../response-matrix.js';
import { chiSquaredUpperTail } from '../statistics/chi-squared-upper-tail.js';
import { type CalibrateCmlOptions, calibrateCml } from './calibrate-cml.js';
import type { ItemCalibration } from './types.js';

export interface LikelihoodRatioTestOptions extends Omit<CalibrateCmlOptions, 'anchors'> {
  /**
   * Group of each person (aligned with `matrix.personIds`, any integer labels). Default: a split at
   * the raw-score median within each set of answered items, persons above the median against the
   * rest (as eRm's `LRtest(splitcr = "median")`).
   */
  readonly groups?: ArrayLike<number>;
}

export interface LikelihoodRatioTest {
  /** LR = 2 (Σ_g log L_g − log L), conditional log-likelihoods. */
  readonly statistic: number;
  /** Σ_g (k_g − 1) − (k − 1). */
  readonly degreesOfFreedom: number;
  /** Upper-tail chi-squared probability of the statistic. */
  readonly pValue: number;
  /** Items left out of every model because some group answered them all right, all wrong or not at all. */
  readonly excludedItems: readonly string[];
  readonly full: ItemCalibration;
  readonly groups: readonly {
    readonly label: number;
    readonly persons: number;
    readonly calibration: ItemCalibration;
  }[];
}

/** Labels 1 for persons above the median raw score of their answered-item set, 0 otherwise. */
export function medianSplit(matrix: ResponseMatrix): Int32Array {
  const nItems = matrix.itemIds.length;
  const byPattern = new Map<string, { persons: number[]; scores: number[] }>();
  matrix.personIds.forEach((_, p) => {
    let key = '';
    let score = 0;
    for (let i = 0; i < nItems; i++) {
      const x = matrix.scores[p * nItems + i]!;
      key += x === MISSING ? '0' : '1';
      if (x !== MISSING) score += x;
    }
    let entry = byPattern.get(key);
    if (entry === undefined) {
      entry = { persons: [], scores: [] };
      byPattern.set(key, entry);
    }
    entry.persons.push(p);
    entry.scores.push(score);
  });
  const labels = new Int32Array(matrix.personIds.length);
  for (const { persons, scores } of byPattern.values()) {
    const sorted = [...scores].sort((a, b) => a - b);
    const middle = sorted.length >> 1;
    const median = sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
    persons.forEach((p, k) => {
      labels[p] = scores[k]! > median ? 1 : 0;
    });
  }
  return labels;
}

/**
 * Andersen's conditional likelihood-ratio test of the Rasch model: item difficulties estimated
 * separately in groups of persons should agree. Under the model LR is asymptotically chi-squared
 * with Σ_g (k_g − 1) − (k − 1) degrees of freedom.
 *
 * Items a group answered all right, all wrong or not at all cannot be estimated in that group and
 * are left out of every model (as eRm 1.0-2 `LRtest` does); they are listed in `excludedItems`.
 *
 * @see Andersen, E. B. (1973). A goodness of fit test for the Rasch model. Psychometrika 38(1), 123-140.
 * @param matrix responses, 0/1 or MISSING.
 * @param options groups (default: raw-score median split), CML maxIterations and tolerance.
 * @returns statistic, df, p-value, and the full and group calibrations.
 * @throws when fewer than two groups or two usable items remain.
 * @example
 * // see test/scoring/rasch/likelihood-ratio-test.test.ts: raschdat1 gives LR = 32.54 on 29 df (eRm 1.0-2)
 */
export function likelihoodRatioTest(
  matrix: ResponseMatrix,
  options: LikelihoodRatioTestOptions = {},
): LikelihoodRatioTest {
  const labels = options.groups ?? medianSplit(matrix);
  const nItems = matrix.itemIds.length;
  const nPersons = matrix.personIds.length;
  if (labels.length !== nPersons) throw new Error('likelihoodRatioTest requires one group per person');
  const members = new Map<number, number[]>();
  for (let p = 0; p < nPersons; p++) {
    const label = labels[p]!;
    let list = members.get(label);
    if (list === undefined) {
      list = [];
      members.set(label, list);
    }
    list.push(p);
  }
  if (members.size < 2) throw new Error('likelihoodRatioTest requires at least two groups');
  const drop = new Set<number>();
  for (const persons of members.values()) {
    for (let i = 0; i < nItems; i++) {
      let answered = 0;
      let correct = 0;
      for (const p of persons) {
        const x = matrix.scores[p * nItems + i]!;
        if (x === MISSING) continue;
        answered++;
        correct += x;
      }
      if (answered === 0 || correct === 0 || correct === answered) drop.add(i);
    }
  }
  const kept = Array.from(matrix.itemIds.keys()).filter((i) => !drop.has(i));
  if (kept.length < 2)
    throw new Error('likelihoodRatioTest requires at least two items estimable in every group');
  const cmlOptions = { maxIterations: options.maxIterations, tolerance: options.tolerance };
  const full = calibrateCml(selectResponseMatrix(matrix, undefined, kept), cmlOptions);
  const groups = [...members.entries()]
    .sort(([a], [b]) => a - b)
    .map(([label, persons]) => ({
      label,
      persons: persons.length,
      calibration: calibrateCml(selectResponseMatrix(matrix, persons, kept), cmlOptions),
    }));
  let statistic = -2 * full.logLikelihood;
  let degreesOfFreedom = -(full.itemIds.length - 1);
  for (const group of groups) {
    statistic += 2 * group.calibration.logLikelihood;
    degreesOfFreedom += group.calibration.itemIds.length - 1;
  }
  return {
    statistic,
    degreesOfFreedom,
    pValue: degreesOfFreedom > 0 ? chiSquaredUpperTail(Math.max(statistic, 0), degreesOfFreedom) : Number.NaN,
    excludedItems: [...drop].sort((a, b) => a - b).map((i) => matrix.itemIds[i]!),
    full,
    groups,
  };
}
