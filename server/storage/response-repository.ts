import type { Insertable, Selectable } from 'kysely';
import type { ResponsesTable } from './database.js';
import type { DbHandle } from './db-handle.js';
import { preparedQuery } from './prepared-query.js';

export type ResponseRow = Selectable<ResponsesTable>;

/** One stored answer, with its JSON parsed. */
export interface ResponseRecord {
  id: string;
  attemptId: string;
  itemId: string;
  itemVersion: number;
  position: number;
  answerKind: ResponsesTable['answer_kind'];
  /** The answer as given (null for "I don't know"). */
  answer: unknown;
  score: number | null;
  serverMs: number | null;
  clientMs: number | null;
  receivedAt: string;
}

export function responseRowToRecord(row: ResponseRow): ResponseRecord {
  return {
    id: row.id,
    attemptId: row.attempt_id,
    itemId: row.item_id,
    itemVersion: Number(row.item_version),
    position: Number(row.position),
    answerKind: row.answer_kind,
    answer: row.answer === null ? null : (JSON.parse(row.answer) as unknown),
    score: row.score === null ? null : Number(row.score),
    serverMs: row.server_ms === null ? null : Number(row.server_ms),
    clientMs: row.client_ms === null ? null : Number(row.client_ms),
    receivedAt: row.received_at,
  };
}

/** The columns `insertResponse` writes, in slot order. */
const insertedColumns = [
  'id',
  'attempt_id',
  'item_id',
  'item_version',
  'position',
  'answer_kind',
  'answer',
  'score',
  'server_ms',
  'client_ms',
  'received_at',
] as const;

/** One answer's insert, compiled once per dialect (the hot respondent write: prepared-query.ts). */
const insertRow = preparedQuery(insertedColumns.length, (db, markers) =>
  db
    .insertInto('responses')
    .values(
      Object.fromEntries(
        insertedColumns.map((column, i) => [column, markers[i]]),
      ) as unknown as Insertable<ResponsesTable>,
    ),
);

export async function insertResponse(db: DbHandle, response: ResponseRecord): Promise<void> {
  await insertRow(db, [
    response.id,
    response.attemptId,
    response.itemId,
    response.itemVersion,
    response.position,
    response.answerKind,
    response.answer === null ? null : JSON.stringify(response.answer),
    response.score,
    response.serverMs,
    response.clientMs,
    response.receivedAt,
  ]);
}

export async function findResponse(
  db: DbHandle,
  attemptId: string,
  itemId: string,
): Promise<ResponseRecord | undefined> {
  const row = await db
    .selectFrom('responses')
    .selectAll()
    .where('attempt_id', '=', attemptId)
    .where('item_id', '=', itemId)
    .executeTakeFirst();
  return row ? responseRowToRecord(row) : undefined;
}

/** The answers of one attempt in the order they were shown. */
export async function listAttemptResponses(db: DbHandle, attemptId: string): Promise<ResponseRecord[]> {
  const rows = await db
    .selectFrom('responses')
    .selectAll()
    .where('attempt_id', '=', attemptId)
    .orderBy('position')
    .execute();
  return rows.map(responseRowToRecord);
}

/** A response with what an export row needs from its attempt and cohort. */
export interface ExportedResponse extends ResponseRecord {
  cohortId: string;
  cohortLabel: string;
  attemptStatus: string;
  background: Record<string, string>;
}

/**
 * Every response of a study (optionally one cohort), ordered by cohort, attempt start, attempt and
 * position, so exports are stable.
 */
export async function listStudyResponses(
  db: DbHandle,
  studyId: string,
  cohortId?: string,
): Promise<ExportedResponse[]> {
  let query = db
    .selectFrom('responses')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .selectAll('responses')
    .select([
      'cohorts.id as cohort_id',
      'cohorts.label as cohort_label',
      'attempts.status as attempt_status',
      'attempts.background as attempt_background',
    ])
    .where('cohorts.study_id', '=', studyId);
  if (cohortId !== undefined) query = query.where('cohorts.id', '=', cohortId);
  const rows = await query
    .orderBy('cohorts.created_at')
    .orderBy('cohorts.id')
    .orderBy('attempts.started_at')
    .orderBy('attempts.id')
    .orderBy('responses.position')
    .execute();
  return rows.map((row) => ({
    ...responseRowToRecord(row),
    cohortId: row.cohort_id,
    cohortLabel: row.cohort_label,
    attemptStatus: row.attempt_status,
    background: JSON.parse(row.attempt_background) as Record<string, string>,
  }));
}

/** How many answers an attempt has stored, and how many of them scored 1. */
export async function countAttemptResponses(
  db: DbHandle,
  attemptId: string,
): Promise<{ answered: number; correct: number }> {
  const row = await db
    .selectFrom('responses')
    .select((eb) => [
      eb.fn.countAll<number | string>().as('answered'),
      eb.fn.sum<number | string | null>(eb.case().when('score', '=', 1).then(1).else(0).end()).as('correct'),
    ])
    .where('attempt_id', '=', attemptId)
    .executeTakeFirstOrThrow();
  return { answered: Number(row.answered), correct: Number(row.correct ?? 0) };
}
