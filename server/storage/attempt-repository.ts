import type { Selectable } from 'kysely';
import type { AttemptsTable } from './database.js';
import type { DbHandle } from './db-handle.js';
import { preparedQuery } from './prepared-query.js';

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

/** The attempt columns `updateAttempt` may change, by the record field that holds each. */
const updatableColumns = {
  status: 'status',
  form: 'form',
  background: 'background',
  consentedAt: 'consented_at',
  lastSeenAt: 'last_seen_at',
  finishedAt: 'finished_at',
} as const;
type UpdatableField = keyof typeof updatableColumns;

/** One prepared update per set of changed fields (at most 63; a handful in use). */
const attemptUpdates = new Map<string, ReturnType<typeof preparedAttemptUpdate>>();

function preparedAttemptUpdate(fields: readonly UpdatableField[]) {
  return preparedQuery(fields.length + 1, (db, markers) =>
    db
      .updateTable('attempts')
      .set(Object.fromEntries(fields.map((field, i) => [updatableColumns[field], markers[i]])))
      .where('id', '=', markers[fields.length]!),
  );
}

/** Writes the changed fields of an attempt (only those given). */
export async function updateAttempt(
  db: DbHandle,
  id: string,
  change: Partial<
    Pick<AttemptRecord, 'status' | 'form' | 'background' | 'consentedAt' | 'lastSeenAt' | 'finishedAt'>
  >,
): Promise<void> {
  const fields = (Object.keys(updatableColumns) as UpdatableField[]).filter(
    (field) => change[field] !== undefined,
  );
  if (fields.length === 0) return;
  const values = fields.map((field) =>
    field === 'form' || field === 'background' ? JSON.stringify(change[field]) : change[field],
  );
  const key = fields.join(',');
  let update = attemptUpdates.get(key);
  if (update === undefined) {
    update = preparedAttemptUpdate(fields);
    attemptUpdates.set(key, update);
  }
  await update(db, [...values, id]);
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
 * as a retried answer racing its original, run one after the other. Changes nothing stored. Returns
 * the locked attempt (`RETURNING`: one statement instead of a lock and a read), or undefined.
 */
export async function lockAttemptByTokenHash(
  db: DbHandle,
  tokenHash: string,
): Promise<AttemptRecord | undefined> {
  const [row] = await lockByTokenHash(db, [tokenHash]);
  return row ? attemptRowToRecord(row) : undefined;
}

const lockByTokenHash = preparedQuery(1, (db, [tokenHash]) =>
  db
    .updateTable('attempts')
    .set((eb) => ({ last_seen_at: eb.ref('last_seen_at') }))
    .where('token_hash', '=', tokenHash!)
    .returningAll(),
);
