/** Shared result shapes for Rasch calibrations, so CML and MML answers read the same way. */

/** Why a person or an item took no part in an estimation. */
export type ExclusionReason = 'no-responses' | 'all-correct' | 'all-wrong' | 'constant-in-every-score-group';

export interface Exclusion {
  readonly id: string;
  readonly reason: ExclusionReason;
}

/** Item parameters from one calibration, in logits, difficulty (not easiness). */
export interface ItemCalibration {
  readonly method: 'cml' | 'mml';
  /** Ids of the calibrated items, in the order of the arrays below. */
  readonly itemIds: readonly string[];
  /**
   * b_i, logits. CML: mean zero over the items unless items were anchored. MML: the first
   * group's mean ability is fixed at zero instead, unless items were anchored.
   */
  readonly difficulty: Float64Array;
  /** SE(b_i) from the information matrix; 0 for anchored items. */
  readonly standardError: Float64Array;
  /** Log-likelihood at the solution (conditional for CML, marginal for MML). */
  readonly logLikelihood: number;
  readonly iterations: number;
  readonly converged: boolean;
  readonly excludedItems: readonly Exclusion[];
  readonly excludedPersons: readonly Exclusion[];
}
