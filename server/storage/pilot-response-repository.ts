/**
 * Answers to pilot charts (`pilot_responses`). Kept apart from `responses` on purpose: estimates,
 * calibrations of the study and exports of bank answers read `responses` only, so a pilot answer
 * can never reach them. Only the pilot report reads this table.
 */
import type { Selectable } from 'kysely';
import type { PilotResponsesTable } from './database.js';
import type { DbHandle } from './db-handle.js';

/** One stored pilot answer, its JSON parsed. */
export interface PilotResponseRecord {
  id: string;
  attemptId: string;
  pilotId: string;
  position: number;
  answerKind: PilotResponsesTable['answer_kind'];
  /** The answer as given (null for "I don't know"). */
  answer: unknown;
  score: number;
  serverMs: number | null;
  receivedAt: string;
}

function rowToRecord(row: Selectable<PilotResponsesTable>): PilotResponseRecord {
  return {
    id: row.id,
    attemptId: row.attempt_id,
    pilotId: row.pilot_id,
    position: Number(row.position),
    answerKind: row.answer_kind,
    answer: row.answer === null ? null : (JSON.parse(row.answer) as unknown),
    score: Number(row.score),
    serverMs: row.server_ms === null ? null : Number(row.server_ms),
    receivedAt: row.received_at,
  };
}

export async function insertPilotResponse(db: DbHandle, response: PilotResponseRecord): Promise<void> {
  await db
    .insertInto('pilot_responses')
    .values({
      id: response.id,
      attempt_id: response.attemptId,
      pilot_id: response.pilotId,
      position: response.position,
      answer_kind: response.answerKind,
      answer: response.answer === null ? null : JSON.stringify(response.answer),
      score: response.score,
      server_ms: response.serverMs,
      received_at: response.receivedAt,
    })
    .execute();
}

/** The stored answer of one attempt to one pilot, or undefined. */
export async function findPilotResponse(
  db: DbHandle,
  attemptId: string,
  pilotId: string,
): Promise<PilotResponseRecord | undefined> {
  const row = await db
    .selectFrom('pilot_responses')
    .selectAll()
    .where('attempt_id', '=', attemptId)
    .where('pilot_id', '=', pilotId)
    .executeTakeFirst();
  return row ? rowToRecord(row) : undefined;
}

/** The pilot answers of one attempt, in the order they were shown. */
export async function listAttemptPilotResponses(
  db: DbHandle,
  attemptId: string,
): Promise<PilotResponseRecord[]> {
  const rows = await db
    .selectFrom('pilot_responses')
    .selectAll()
    .where('attempt_id', '=', attemptId)
    .orderBy('position')
    .execute();
  return rows.map(rowToRecord);
}

/** Answers stored so far per pilot of a study (pilots without answers are left out). */
export async function countPilotAnswers(db: DbHandle, studyId: string): Promise<Map<string, number>> {
  const rows = await db
    .selectFrom('pilot_responses')
    .innerJoin('pilot_items', 'pilot_items.id', 'pilot_responses.pilot_id')
    .select((eb) => ['pilot_responses.pilot_id as pilot_id', eb.fn.countAll<number | string>().as('count')])
    .where('pilot_items.study_id', '=', studyId)
    .groupBy('pilot_responses.pilot_id')
    .execute();
  return new Map(rows.map((row) => [row.pilot_id, Number(row.count)]));
}

/** One pilot answer as the pilot report reads it: who (attempt, cohort), which pilot, the score. */
export interface ScoredPilotResponse {
  attemptId: string;
  cohortId: string;
  pilotId: string;
  score: number;
  receivedAt: string;
}

/**
 * The pilot answers of a study, optionally only those received up to `until`, ordered by attempt
 * and position (stable).
 */
export async function listStudyPilotResponses(
  db: DbHandle,
  studyId: string,
  until?: string | null,
): Promise<ScoredPilotResponse[]> {
  let query = db
    .selectFrom('pilot_responses')
    .innerJoin('attempts', 'attempts.id', 'pilot_responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select([
      'pilot_responses.attempt_id',
      'cohorts.id as cohort_id',
      'pilot_responses.pilot_id',
      'pilot_responses.score',
      'pilot_responses.received_at',
    ])
    .where('cohorts.study_id', '=', studyId);
  if (until !== undefined && until !== null) query = query.where('pilot_responses.received_at', '<=', until);
  const rows = await query
    .orderBy('pilot_responses.attempt_id')
    .orderBy('pilot_responses.position')
    .execute();
  return rows.map((row) => ({
    attemptId: row.attempt_id,
    cohortId: row.cohort_id,
    pilotId: row.pilot_id,
    score: Number(row.score),
    receivedAt: row.received_at,
  }));
}
