/**
 * How many scores an answer needs, and the score it counts with once it has them.
 *
 * - One rater: that rater's score.
 * - Two raters who agree or differ by one point: the mean rounded down (equal scores stand; 0 and 1
 *   give 0, 1 and 2 give 1). Rounding down keeps credit the two raters did not both see.
 * - Two raters a whole rubric apart (0 and 2): the answer goes back to the queue for a third read,
 *   and the final score is the median of the three, i.e. the third rater decides between the two (or
 *   sides with one of them).
 *
 * These are plain resolution rules of rated scoring (`common practice, no source`); the report's
 * weighted kappa (the first two scores only) says how often raters disagree.
 */

/**
 * Scores an answer needs: the study's `rubricRaters`, or 3 when the first two are 0 and 2.
 *
 * @param raters the study's `rubricRaters` (1 or 2)
 * @param scores the answer's scores so far, oldest first
 * @example scoresNeeded(2, [0, 2]); // 3
 */
export function scoresNeeded(raters: 1 | 2, scores: readonly number[]): number {
  if (raters === 2 && scores.length >= 2 && Math.abs(scores[0]! - scores[1]!) === 2) return 3;
  return raters;
}

/**
 * The final score from an answer's scores (oldest first): one score; two scores, the mean rounded
 * down; three (a third read), the median.
 *
 * @returns the final score 0, 1 or 2
 * @throws when no score or more than three are given, or a score is outside 0..2
 * @example finalRubricScore([1, 2]); // 1
 * @example finalRubricScore([0, 2, 2]); // 2
 */
export function finalRubricScore(scores: readonly number[]): number {
  if (scores.length === 0) throw new Error('finalRubricScore requires at least one score');
  if (scores.length > 3) throw new Error('finalRubricScore takes at most three scores');
  for (const s of scores)
    if (!Number.isInteger(s) || s < 0 || s > 2) throw new Error(`finalRubricScore: ${s} is outside 0..2`);
  if (scores.length === 3) return [...scores].sort((a, b) => a - b)[1]!;
  return Math.floor(scores.reduce((sum, s) => sum + s, 0) / scores.length);
}
