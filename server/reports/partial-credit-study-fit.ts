import { selectResponseMatrix } from '../scoring/build-response-matrix.js';
import { calibrateMml, type MmlGroupEstimate } from '../scoring/rasch/calibrate-mml.js';
import { calibratePcm } from '../scoring/rasch/calibrate-pcm.js';
import type { ResponseMatrix } from '../scoring/response-matrix.js';

/** A study's calibration when some items are scored 0-1-2 against a rubric. */
export interface PartialCreditStudyFit {
  readonly itemIds: readonly string[];
  /** Item location (mean of its steps), logits; for a right/wrong item its difficulty. */
  readonly difficulty: Float64Array;
  readonly standardError: Float64Array;
  /** Steps δ_i1, δ_i2 of each calibrated rubric item, logits. */
  readonly steps: ReadonlyMap<string, readonly number[]>;
  readonly stepStandardErrors: ReadonlyMap<string, readonly number[]>;
  /** Calibrated right/wrong items and their difficulties (what the cohorts' distributions rest on). */
  readonly dichotomous: ReadonlyMap<string, number>;
  readonly excludedItems: readonly { readonly id: string; readonly reason: string }[];
  readonly groups: readonly MmlGroupEstimate[];
  readonly converged: boolean;
  readonly iterations: number;
  /** Conditional log-likelihood of the partial credit fit. */
  readonly logLikelihood: number;
}

/**
 * Calibrates a study that mixes right/wrong items with rubric items scored 0, 1, 2: every item by
 * conditional maximum likelihood under the partial credit model (Masters 1982; a right/wrong item is
 * the case of one step), identified by a mean item location of 0; then each cohort's normal ability
 * distribution by MML with every right/wrong item anchored at its partial credit difficulty (cohort
 * means and SDs free). The cohort distributions rest on the right/wrong items only (the MML engine is
 * dichotomous); rubric answers enter the item parameters and every person's estimate.
 *
 * @see Masters, G. N. (1982). A Rasch model for partial credit scoring. Psychometrika 47(2), 149-174.
 * @see Bock, R. D., & Aitkin, M. (1981). Marginal maximum likelihood estimation of item parameters:
 *   application of an EM algorithm. Psychometrika 46(4), 443-459.
 * @param matrix scores 0..2 (rubric items) and 0..1 (others), MISSING where not answered
 * @param rubricItems ids of the 0-1-2 items
 * @param groups cohort of each person
 * @param options quadrature points and iterations of the cohort fit
 * @throws when the partial credit fit fails, or no right/wrong item is left to place the cohorts
 */
export function fitPartialCreditStudy(
  matrix: ResponseMatrix,
  rubricItems: ReadonlySet<string>,
  groups: { readonly index: Int32Array; readonly labels: readonly string[] },
  options: { readonly quadraturePoints: number; readonly maxIterations: number },
): PartialCreditStudyFit {
  const maxScores = matrix.itemIds.map((id) => (rubricItems.has(id) ? 2 : 1));
  const pcm = calibratePcm(matrix, { maxScores, maxIterations: options.maxIterations });
  const steps = new Map<string, readonly number[]>();
  const stepStandardErrors = new Map<string, readonly number[]>();
  const dichotomous = new Map<string, number>();
  for (const item of pcm.items) {
    if (rubricItems.has(item.id)) {
      steps.set(item.id, Array.from(item.steps));
      stepStandardErrors.set(item.id, Array.from(item.stepStandardErrors));
    } else dichotomous.set(item.id, item.location);
  }
  if (dichotomous.size === 0)
    throw new Error('no right/wrong item was calibrated to place the cohorts on the scale');
  const columns = matrix.itemIds.flatMap((id, c) => (dichotomous.has(id) ? [c] : []));
  const cohortFit = calibrateMml(selectResponseMatrix(matrix, undefined, columns), {
    groups,
    anchors: dichotomous,
    quadraturePoints: options.quadraturePoints,
    maxIterations: options.maxIterations,
  });
  return {
    itemIds: pcm.items.map((item) => item.id),
    difficulty: Float64Array.from(pcm.items, (item) => item.location),
    standardError: Float64Array.from(pcm.items, (item) => item.locationStandardError),
    steps,
    stepStandardErrors,
    dichotomous,
    excludedItems: pcm.excludedItems,
    groups: cohortFit.groups,
    converged: pcm.converged && cohortFit.converged,
    iterations: pcm.iterations + cohortFit.iterations,
    logLikelihood: pcm.logLikelihood,
  };
}
