/**
 * The prior an adaptive attempt starts from: the respondent's cohort's ability distribution as
 * estimated by the study's latest calibration, or the study's default prior with a warning.
 *
 * Decision (documented in DEVELOPERS.md): a cohort without an estimate of its own (a new cohort, or
 * a calibration whose groups do not include it) starts from the study default, N(0, 1.5²) unless
 * the study sets another, and the caller logs the returned warning. A wide prior is a safe start:
 * after a handful of answers the data outweigh it (prior precision 1/1.5² ≈ 0.44 is the
 * information of fewer than two well-targeted items), and the first item is chosen at the
 * scale's centre. A study with no calibration at all has no item difficulties, so it cannot run
 * adaptively: that refusal belongs to the delivery layer (see DEVELOPERS.md, "Adaptive delivery").
 *
 * @see Bock, R. D., & Mislevy, R. J. (1982). Adaptive EAP estimation of ability in a
 *   microcomputer environment. Applied Psychological Measurement 6, 431–444 (a normal prior on
 *   the population of examinees).
 */

/** A normal prior on ability, logits, and where it came from. */
export interface AdaptivePrior {
  readonly mean: number;
  readonly sd: number;
  /** `cohort`: the cohort's estimate in a calibration; `default`: the study default. */
  readonly source: 'cohort' | 'default';
}

/** The study default prior when nothing better is known: N(0, 1.5²) (common practice, no source). */
export const DEFAULT_PRIOR: { readonly mean: number; readonly sd: number } = { mean: 0, sd: 1.5 };

/** One cohort's estimated distribution from a calibration (mean and SD in logits). */
export interface CohortDistribution {
  readonly cohortId: string;
  readonly mean: number;
  readonly sd: number;
}

/**
 * Chooses the prior of a new adaptive attempt.
 *
 * @param cohortId the respondent's cohort.
 * @param groups the cohort distributions of the study's latest calibration (empty when none).
 * @param studyDefault the study's own default prior, if it sets one; otherwise {@link DEFAULT_PRIOR}.
 * @returns the prior and a warning (null when the cohort's own estimate is used).
 * @throws when the study default is not a finite mean with a positive SD.
 * @example
 * choosePrior('weekday', [{ cohortId: 'weekday', mean: 0.2, sd: 0.9 }]);
 * // { prior: { mean: 0.2, sd: 0.9, source: 'cohort' }, warning: null }
 */
export function choosePrior(
  cohortId: string,
  groups: readonly CohortDistribution[],
  studyDefault: { readonly mean: number; readonly sd: number } = DEFAULT_PRIOR,
): { prior: AdaptivePrior; warning: string | null } {
  if (!Number.isFinite(studyDefault.mean) || !(studyDefault.sd > 0) || !Number.isFinite(studyDefault.sd)) {
    throw new Error('choosePrior requires a default prior with a finite mean and a positive sd');
  }
  const fallback = (why: string) => ({
    prior: { mean: studyDefault.mean, sd: studyDefault.sd, source: 'default' as const },
    warning: `adaptive prior for cohort ${cohortId}: ${why}; using the default N(${studyDefault.mean}, ${studyDefault.sd}²)`,
  });
  const group = groups.find((g) => g.cohortId === cohortId);
  if (group === undefined) return fallback('no estimate of this cohort in the calibration');
  if (!Number.isFinite(group.mean) || !(group.sd > 0) || !Number.isFinite(group.sd)) {
    return fallback('the calibration has no usable mean and SD for this cohort');
  }
  return { prior: { mean: group.mean, sd: group.sd, source: 'cohort' }, warning: null };
}
