import type { DbHandle } from '../storage/db-handle.js';
import { listPendingRubricScores, setFinalScore } from '../storage/rubric-score-repository.js';
import { finalRubricScore, scoresNeeded } from './final-rubric-score.js';

/**
 * Settles the answers a study's new `rubricRaters` makes complete (call inside the transaction that
 * changes the settings). Lowering two raters to one would otherwise leave answers that have one
 * score, or a third read pending, out of every queue with no final score: each such answer now
 * counts with its first score, the one score the study asks for. Raising the number changes nothing
 * (answers with a final score keep it).
 *
 * @returns how many answers got their final score
 */
export async function resolvePendingRubricAnswers(
  db: DbHandle,
  studyId: string,
  raters: 1 | 2,
): Promise<number> {
  let resolved = 0;
  for (const [responseId, scores] of await listPendingRubricScores(db, studyId)) {
    const needed = scoresNeeded(raters, scores.slice(0, raters));
    if (scores.length < needed) continue;
    await setFinalScore(db, responseId, finalRubricScore(scores.slice(0, needed)));
    resolved += 1;
  }
  return resolved;
}
