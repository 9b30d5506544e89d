/**
 * Rubric scoring of short-text answers: the queue a rater works through, and one rater's score.
 *
 * Blind: a queue entry carries the item's prompt and rubric and the answer's text, with the response
 * id as the entry id; never the attempt, cohort, background answers, timing or position. Every rater
 * walks the same order (oldest answer first); an answer leaves a rater's queue once that rater has
 * scored it, and everyone's queue once it has the scores it needs: its study's `rubricRaters` (1 or
 * 2), or a third read when two raters gave 0 and 2 (final-rubric-score.ts).
 * When the last score arrives, the final score (see final-rubric-score.ts) is written into the
 * response, so calibration, exports and reports read it like any other score.
 */
import { randomUUID } from 'node:crypto';
import type { ItemBank } from '../bank/load-bank.js';
import { AppError } from '../errors.js';
import { insertAuditEntry } from '../storage/audit-repository.js';
import { type DbHandle, isUniqueViolation, nowIso } from '../storage/db-handle.js';
import {
  findRubricAnswer,
  insertRubricScore,
  listAnswersToScore,
  listRubricScores,
  lockResponse,
  setFinalScore,
} from '../storage/rubric-score-repository.js';
import { findStudyById } from '../storage/study-repository.js';
import { finalRubricScore, scoresNeeded } from './final-rubric-score.js';
import { requireStudy } from './study-service.js';
import { studySettingsSchema } from './study-settings.js';

/** One answer as a rater sees it. */
export interface ScoringQueueEntry {
  entryId: string;
  itemId: string;
  /** The question the respondent answered (the bank's current version of the item). */
  prompt: string;
  rubric: { score: number; description: string }[];
  text: string;
  /** Scores the answer has (from other raters), and how many it needs (3 for a third read). */
  scoresGiven: number;
  scoresNeeded: number;
}

export interface ScoringQueue {
  studyId: string;
  rater: string;
  scoresNeeded: 1 | 2;
  /** Answers still waiting for this rater (the entries are the first of them). */
  remaining: number;
  entries: ScoringQueueEntry[];
}

/** The outcome of one score. */
export interface RubricScoreResult {
  entryId: string;
  score: number;
  scoresGiven: number;
  /** Scores the answer needs: the study's raters, or 3 once two raters gave 0 and 2. */
  scoresNeeded: number;
  /** The answer's final score once it has every score it needs, else null. */
  finalScore: number | null;
}

function ratersOf(settings: unknown): 1 | 2 {
  return studySettingsSchema.parse(settings).rubricRaters;
}

function rubricOf(bank: ItemBank, itemId: string): { prompt: string; rubric: ScoringQueueEntry['rubric'] } {
  const item = bank.byId.get(itemId);
  if (item?.response.kind !== 'short-text') return { prompt: '', rubric: [] };
  return {
    prompt: item.prompt,
    rubric: item.response.rubric.map((level) => ({ score: level.score, description: level.description })),
  };
}

/**
 * The next answers of a study waiting for a score from `rater` (at most `limit`, oldest first).
 *
 * @throws AppError STUDY_NOT_FOUND
 */
export async function scoringQueue(
  db: DbHandle,
  bank: ItemBank,
  studyId: string,
  rater: string,
  limit: number,
): Promise<ScoringQueue> {
  const study = await requireStudy(db, studyId);
  const raters = ratersOf(study.settings);
  const { answers, remaining } = await listAnswersToScore(db, studyId, rater, raters, limit);
  const entries: ScoringQueueEntry[] = [];
  for (const answer of answers) {
    const scores = (await listRubricScores(db, answer.responseId)).map((s) => s.score);
    entries.push({
      entryId: answer.responseId,
      itemId: answer.itemId,
      ...rubricOf(bank, answer.itemId),
      text: answer.text,
      scoresGiven: scores.length,
      scoresNeeded: scoresNeeded(raters, scores),
    });
  }
  return { studyId, rater, scoresNeeded: raters, remaining, entries };
}

/**
 * Stores `rater`'s score of one answer and, with the last score the study asks for, the answer's
 * final score; audited as `rubric.score` (item id and score, never the text). Call inside a
 * transaction: the response row is locked first, so two raters scoring at once are serialised.
 *
 * @throws AppError SCORING_ENTRY_NOT_FOUND; RUBRIC_ALREADY_SCORED when this rater scored it;
 *   RUBRIC_SCORES_COMPLETE when it has every score its study asks for.
 */
export async function scoreRubricAnswer(
  db: DbHandle,
  entryId: string,
  rater: string,
  score: 0 | 1 | 2,
): Promise<RubricScoreResult> {
  await lockResponse(db, entryId);
  const answer = await findRubricAnswer(db, entryId);
  if (!answer)
    throw new AppError('SCORING_ENTRY_NOT_FOUND', `No short-text answer has the queue entry id ${entryId}.`, {
      field: 'params.entryId',
    });
  const study = await findStudyById(db, answer.studyId);
  const raters = study ? ratersOf(study.settings) : 1;
  const scores = await listRubricScores(db, entryId);
  const mine = scores.find((s) => s.rater === rater);
  if (mine)
    throw new AppError(
      'RUBRIC_ALREADY_SCORED',
      `You (${rater}) already scored this answer ${mine.score}; the first score stands.`,
      { field: 'params.entryId', rater },
    );
  const needed = scoresNeeded(
    raters,
    scores.map((s) => s.score),
  );
  if (scores.length >= needed)
    throw new AppError(
      'RUBRIC_SCORES_COMPLETE',
      `This answer already has the ${needed === 1 ? 'one score' : `${needed} scores`} it needs.`,
      { field: 'params.entryId', scoresNeeded: needed },
    );
  const scoredAt = nowIso();
  try {
    await insertRubricScore(db, { id: randomUUID(), responseId: entryId, rater, score, scoredAt });
  } catch (error) {
    if (isUniqueViolation(error))
      throw new AppError('RUBRIC_ALREADY_SCORED', `You (${rater}) already scored this answer.`, {
        field: 'params.entryId',
        rater,
      });
    throw error;
  }
  const given = [...scores.map((s) => s.score), score];
  const neededNow = scoresNeeded(raters, given);
  const finalScore = given.length >= neededNow ? finalRubricScore(given) : null;
  if (finalScore !== null) await setFinalScore(db, entryId, finalScore);
  await insertAuditEntry(db, {
    id: randomUUID(),
    at: scoredAt,
    actor: rater,
    action: 'rubric.score',
    subject: entryId,
    details: { itemId: answer.itemId, score, final: finalScore },
  });
  return { entryId, score, scoresGiven: given.length, scoresNeeded: neededNow, finalScore };
}
