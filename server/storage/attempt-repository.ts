import type { Selectable } from 'kysely';
import type { AttemptsTable } from './database.js';
import type { DbHandle } from './db-handle.js';

export type AttemptRow = Selectable<AttemptsTable>;
export type AttemptStatus = AttemptsTable['status'];

/** An attempt with its JSON columns parsed; `server/delivery/attempt-form.ts` validates `form`. */
export interface AttemptRecord {
  id: string;
  cohortId: string;
  status: AttemptStatus;
  form: unknown;
  background: Record<string, string>;
  consentedAt: string | null;
  startedAt: string;
  lastSeenAt: string;
  finishedAt: string | null;
}

export function attemptRowToRecord(row: AttemptRow): AttemptRecord {
  return {
    id: row.id,
    cohortId: row.cohort_id,
    status: row.status,
    form: JSON.parse(row.form) as unknown,
    background: JSON.parse(row.background) as Record<string, string>,
    consentedAt: row.consented_at,
    startedAt: row.started_at,
    lastSeenAt: row.last_seen_at,
    finishedAt: row.finished_at,
  };
}

export async function insertAttempt(
  db: DbHandle,
  attempt: { id: string; cohortId: string; tokenHash: string; form: unknown; at: string },
): Promise<void> {
  await db
    .insertInto('attempts')
    .values({
      id: attempt.id,
      cohort_id: attempt.cohortId,
      token_hash: attempt.tokenHash,
      status: 'started',
      form: JSON.stringify(attempt.form),
      background: '{}',
      consented_at: null,
      started_at: attempt.at,
      last_seen_at: attempt.at,
      finished_at: null,
    })
    .execute();
}

export async function findAttemptByTokenHash(
  db: DbHandle,
  tokenHash: string,
): Promise<AttemptRecord | undefined> {
  const row = await db
    .selectFrom('attempts')
    .selectAll()
    .where('token_hash', '=', tokenHash)
    .executeTakeFirst();
  return row ? attemptRowToRecord(row) : undefined;
}

export async function findAttemptById(db: DbHandle, id: string): Promise<AttemptRecord | undefined> {
  const row = await db.selectFrom('attempts').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? attemptRowToRecord(row) : undefined;
}

/** Writes the changed fields of an attempt (only those given). */
export async function updateAttempt(
  db: DbHandle,
  id: string,
  change: Partial<
    Pick<AttemptRecord, 'status' | 'form' | 'background' | 'consentedAt' | 'lastSeenAt' | 'finishedAt'>
  >,
): Promise<void> {
  const set: Partial<Omit<AttemptRow, 'id' | 'cohort_id' | 'token_hash' | 'started_at'>> = {};
  if (change.status !== undefined) set.status = change.status;
  if (change.form !== undefined) set.form = JSON.stringify(change.form);
  if (change.background !== undefined) set.background = JSON.stringify(change.background);
  if (change.consentedAt !== undefined) set.consented_at = change.consentedAt;
  if (change.lastSeenAt !== undefined) set.last_seen_at = change.lastSeenAt;
  if (change.finishedAt !== undefined) set.finished_at = change.finishedAt;
  if (Object.keys(set).length === 0) return;
  await db.updateTable('attempts').set(set).where('id', '=', id).execute();
}

/** How many attempts a study has had so far (all cohorts): the next attempt's booklet counter. */
export async function countAttemptsInStudy(db: DbHandle, studyId: string): Promise<number> {
  const row = await db
    .selectFrom('attempts')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select((eb) => eb.fn.countAll<number | string>().as('n'))
    .where('cohorts.study_id', '=', studyId)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

/**
 * Takes the write lock on one attempt's row for the rest of the transaction (a no-op update, which
 * both engines lock: PostgreSQL the row, SQLite the database), so two requests of one attempt, such
 * as a retried answer racing its original, run one after the other. Changes nothing stored.
 */
export async function lockAttemptByTokenHash(db: DbHandle, tokenHash: string): Promise<void> {
  await db
    .updateTable('attempts')
    .set((eb) => ({ last_seen_at: eb.ref('last_seen_at') }))
    .where('token_hash', '=', tokenHash)
    .execute();
}
