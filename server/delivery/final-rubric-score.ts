/**
 * The score an answer counts with once its raters have scored it: one rater's score, or with two
 * raters the mean rounded down (equal scores stand; 0 and 1 give 0, 1 and 2 give 1, 0 and 2 give 1).
 * Rounding down keeps credit the two raters did not both see. This is a plain resolution rule
 * (`common practice, no source`); the report's weighted kappa says how often raters disagree.
 *
 * @param scores the raters' scores (0..2), as many as the study asks for
 * @returns the final score 0, 1 or 2
 * @throws when no score is given or a score is outside 0..2
 * @example finalRubricScore([1, 2]); // 1
 */
export function finalRubricScore(scores: readonly number[]): number {
  if (scores.length === 0) throw new Error('finalRubricScore requires at least one score');
  for (const s of scores)
    if (!Number.isInteger(s) || s < 0 || s > 2) throw new Error(`finalRubricScore: ${s} is outside 0..2`);
  return Math.floor(scores.reduce((sum, s) => sum + s, 0) / scores.length);
}
