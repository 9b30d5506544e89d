import type { RubricScoresTable } from './database.js';
import type { DbHandle } from './db-handle.js';

/** One rater's score of one short-text answer. */
export interface RubricScoreRecord {
  id: string;
  responseId: string;
  rater: string;
  score: number;
  scoredAt: string;
}

/** A short-text answer waiting for (or holding) rubric scores, as the scoring queue shows it. */
export interface RubricAnswer {
  /** The response id: the queue entry id (never the attempt's). */
  responseId: string;
  studyId: string;
  itemId: string;
  itemVersion: number;
  /** The text exactly as the respondent sent it. */
  text: string;
  /** The final score once the answer has all the scores its study asks for, else null. */
  finalScore: number | null;
  receivedAt: string;
}

function rowToScore(row: RubricScoresTable): RubricScoreRecord {
  return {
    id: row.id,
    responseId: row.response_id,
    rater: row.rater,
    score: Number(row.score),
    scoredAt: row.scored_at,
  };
}

function textOf(answer: string | null): string {
  if (answer === null) return '';
  const parsed = JSON.parse(answer) as { kind?: unknown; text?: unknown };
  return typeof parsed.text === 'string' ? parsed.text : '';
}

function answerQuery(db: DbHandle) {
  return db
    .selectFrom('responses')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select([
      'responses.id as response_id',
      'cohorts.study_id as study_id',
      'responses.item_id',
      'responses.item_version',
      'responses.answer',
      'responses.score',
      'responses.received_at',
    ])
    .where('responses.answer_kind', '=', 'answer')
    .where('responses.answer', 'like', '{"kind":"text"%');
}

type AnswerRow = {
  response_id: string;
  study_id: string;
  item_id: string;
  item_version: number;
  answer: string | null;
  score: number | null;
  received_at: string;
};

function rowToAnswer(row: AnswerRow): RubricAnswer {
  return {
    responseId: row.response_id,
    studyId: row.study_id,
    itemId: row.item_id,
    itemVersion: Number(row.item_version),
    text: textOf(row.answer),
    finalScore: row.score === null ? null : Number(row.score),
    receivedAt: row.received_at,
  };
}

/**
 * The short-text answers of a study that `rater` has not scored, that have no final score yet, and
 * fewer than `raters` scores (with two raters: fewer than three, since an answer without a final
 * score after two is a third read, its first two scores being 0 and 2), oldest first (received time, then response id): every rater walks the same order.
 * "I don't know" answers are scored 0 on arrival and never queued.
 */
export async function listAnswersToScore(
  db: DbHandle,
  studyId: string,
  rater: string,
  raters: number,
  limit: number,
): Promise<{ answers: RubricAnswer[]; remaining: number }> {
  const base = answerQuery(db)
    .where('cohorts.study_id', '=', studyId)
    .where('responses.score', 'is', null)
    .where(({ not, exists, selectFrom }) =>
      not(
        exists(
          selectFrom('rubric_scores')
            .select('rubric_scores.id')
            .whereRef('rubric_scores.response_id', '=', 'responses.id')
            .where('rubric_scores.rater', '=', rater),
        ),
      ),
    )
    .where(
      (eb) =>
        eb
          .selectFrom('rubric_scores')
          .select((inner) => inner.fn.countAll<number>().as('n'))
          .whereRef('rubric_scores.response_id', '=', 'responses.id'),
      '<',
      // With two raters an answer still without a final score after two scores is a third read
      // (0 and 2: final-rubric-score.ts), so it waits for a third; with one rater, for one.
      raters === 2 ? 3 : raters,
    );
  const rows = await base.orderBy('responses.received_at').orderBy('responses.id').execute();
  return { answers: rows.slice(0, limit).map(rowToAnswer), remaining: rows.length };
}

/** One short-text answer by its response id, or undefined (also for answers of other kinds). */
export async function findRubricAnswer(db: DbHandle, responseId: string): Promise<RubricAnswer | undefined> {
  const row = await answerQuery(db).where('responses.id', '=', responseId).executeTakeFirst();
  return row ? rowToAnswer(row) : undefined;
}

/**
 * Takes the response row's write lock (a no-op update) so that two raters scoring the same answer
 * at once are serialised: the second sees the first one's score.
 */
export async function lockResponse(db: DbHandle, responseId: string): Promise<void> {
  await db
    .updateTable('responses')
    .set((eb) => ({ score: eb.ref('score') }))
    .where('id', '=', responseId)
    .execute();
}

/** The scores of one answer, oldest first. */
export async function listRubricScores(db: DbHandle, responseId: string): Promise<RubricScoreRecord[]> {
  const rows = await db
    .selectFrom('rubric_scores')
    .selectAll()
    .where('response_id', '=', responseId)
    .orderBy('scored_at')
    .orderBy('id')
    .execute();
  return rows.map(rowToScore);
}

export async function insertRubricScore(db: DbHandle, score: RubricScoreRecord): Promise<void> {
  await db
    .insertInto('rubric_scores')
    .values({
      id: score.id,
      response_id: score.responseId,
      rater: score.rater,
      score: score.score,
      scored_at: score.scoredAt,
    })
    .execute();
}

/** Writes an answer's final score into its response, where calibration and exports read it. */
export async function setFinalScore(db: DbHandle, responseId: string, score: number): Promise<void> {
  await db.updateTable('responses').set({ score }).where('id', '=', responseId).execute();
}

/**
 * The scores (oldest first) of every answer of a study that has at least one rubric score but no
 * final score yet, by response id.
 */
export async function listPendingRubricScores(db: DbHandle, studyId: string): Promise<Map<string, number[]>> {
  const rows = await db
    .selectFrom('rubric_scores')
    .innerJoin('responses', 'responses.id', 'rubric_scores.response_id')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select(['rubric_scores.response_id as responseId', 'rubric_scores.score as score'])
    .where('cohorts.study_id', '=', studyId)
    .where('responses.score', 'is', null)
    .orderBy('rubric_scores.scored_at')
    .orderBy('rubric_scores.id')
    .execute();
  const pending = new Map<string, number[]>();
  for (const row of rows) {
    const scores = pending.get(row.responseId) ?? [];
    scores.push(Number(row.score));
    pending.set(row.responseId, scores);
  }
  return pending;
}

/** One answer scored by two raters: the pair as the agreement table reads it. */
export interface DoubleScore {
  itemId: string;
  first: number;
  second: number;
}

/**
 * For every short-text answer of a study with at least two scores, its first two scores in the order
 * they were given (first rater = whoever scored first), by item id then response id.
 */
export async function listDoubleScores(
  db: DbHandle,
  studyId: string,
  until?: string | null,
): Promise<DoubleScore[]> {
  let query = db
    .selectFrom('rubric_scores')
    .innerJoin('responses', 'responses.id', 'rubric_scores.response_id')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select([
      'responses.id as response_id',
      'responses.item_id',
      'rubric_scores.score',
      'rubric_scores.scored_at',
      'rubric_scores.id',
    ])
    .where('cohorts.study_id', '=', studyId);
  if (until !== undefined && until !== null) query = query.where('responses.received_at', '<=', until);
  const rows = await query
    .orderBy('responses.item_id')
    .orderBy('responses.id')
    .orderBy('rubric_scores.scored_at')
    .orderBy('rubric_scores.id')
    .execute();
  const out: DoubleScore[] = [];
  for (let k = 0; k + 1 < rows.length; ) {
    const a = rows[k]!;
    const b = rows[k + 1]!;
    if (a.response_id === b.response_id) {
      out.push({ itemId: a.item_id, first: Number(a.score), second: Number(b.score) });
      let next = k + 2;
      while (next < rows.length && rows[next]!.response_id === a.response_id) next++;
      k = next;
    } else k++;
  }
  return out;
}

/** Item ids of a study's answers that hold at least one rubric score: the 0-1-2 items. */
export async function listRubricScoredItemIds(db: DbHandle, studyId: string): Promise<string[]> {
  const rows = await db
    .selectFrom('rubric_scores')
    .innerJoin('responses', 'responses.id', 'rubric_scores.response_id')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select('responses.item_id')
    .distinct()
    .where('cohorts.study_id', '=', studyId)
    .orderBy('responses.item_id')
    .execute();
  return rows.map((row) => row.item_id);
}
