import type { Selectable } from 'kysely';
import type { CalibrationItemsTable, CalibrationsTable } from './database.js';
import type { DbHandle } from './db-handle.js';

export type CalibrationRow = Selectable<CalibrationsTable>;
export type CalibrationItemRow = Selectable<CalibrationItemsTable>;

/** A stored calibration; `settings` is the parsed JSON (options, groups, bootstrap, minimums). */
export interface CalibrationRecord {
  id: string;
  studyId: string | null;
  method: CalibrationsTable['method'];
  settings: unknown;
  converged: boolean;
  iterations: number;
  logLikelihood: number | null;
  /** Scored responses the calibration used, and the newest `received_at` among them. */
  responseCount: number;
  responsesUntil: string | null;
  createdAt: string;
}

/** One item's parameters in a calibration (logits). */
export interface CalibrationItemRecord {
  itemId: string;
  itemVersion: number;
  difficulty: number;
  standardError: number | null;
  infit: number | null;
  outfit: number | null;
  anchored: boolean;
}

export function calibrationRowToRecord(row: CalibrationRow): CalibrationRecord {
  return {
    id: row.id,
    studyId: row.study_id,
    method: row.method,
    settings: JSON.parse(row.settings) as unknown,
    converged: Number(row.converged) === 1,
    iterations: Number(row.iterations),
    logLikelihood: row.log_likelihood === null ? null : Number(row.log_likelihood),
    responseCount: Number(row.response_count),
    responsesUntil: row.responses_until,
    createdAt: row.created_at,
  };
}

export function calibrationItemRowToRecord(row: CalibrationItemRow): CalibrationItemRecord {
  const numberOrNull = (value: number | null) => (value === null ? null : Number(value));
  return {
    itemId: row.item_id,
    itemVersion: Number(row.item_version),
    difficulty: Number(row.difficulty),
    standardError: numberOrNull(row.standard_error),
    infit: numberOrNull(row.infit),
    outfit: numberOrNull(row.outfit),
    anchored: Number(row.anchored) === 1,
  };
}

/** Stores a calibration and its item parameters (call inside a transaction). */
export async function insertCalibration(
  db: DbHandle,
  calibration: CalibrationRecord,
  items: readonly CalibrationItemRecord[],
): Promise<void> {
  await db
    .insertInto('calibrations')
    .values({
      id: calibration.id,
      study_id: calibration.studyId,
      method: calibration.method,
      settings: JSON.stringify(calibration.settings),
      converged: calibration.converged ? 1 : 0,
      iterations: calibration.iterations,
      log_likelihood: calibration.logLikelihood,
      response_count: calibration.responseCount,
      responses_until: calibration.responsesUntil,
      created_at: calibration.createdAt,
    })
    .execute();
  // Insert in chunks: SQLite limits the number of bound parameters per statement.
  for (let start = 0; start < items.length; start += 100) {
    await db
      .insertInto('calibration_items')
      .values(
        items.slice(start, start + 100).map((item) => ({
          calibration_id: calibration.id,
          item_id: item.itemId,
          item_version: item.itemVersion,
          difficulty: item.difficulty,
          standard_error: item.standardError,
          infit: item.infit,
          outfit: item.outfit,
          anchored: item.anchored ? 1 : 0,
        })),
      )
      .execute();
  }
}

/** The newest calibration of a study, or undefined. */
export async function findLatestCalibration(
  db: DbHandle,
  studyId: string,
): Promise<CalibrationRecord | undefined> {
  const row = await db
    .selectFrom('calibrations')
    .selectAll()
    .where('study_id', '=', studyId)
    .orderBy('created_at', 'desc')
    .orderBy('id', 'desc')
    .executeTakeFirst();
  return row ? calibrationRowToRecord(row) : undefined;
}

export async function findCalibrationById(db: DbHandle, id: string): Promise<CalibrationRecord | undefined> {
  const row = await db.selectFrom('calibrations').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? calibrationRowToRecord(row) : undefined;
}

/** Item parameters of a calibration, by item id. */
export async function listCalibrationItems(
  db: DbHandle,
  calibrationId: string,
): Promise<CalibrationItemRecord[]> {
  const rows = await db
    .selectFrom('calibration_items')
    .selectAll()
    .where('calibration_id', '=', calibrationId)
    .orderBy('item_id')
    .execute();
  return rows.map(calibrationItemRowToRecord);
}

/** One scored response as calibration and reports read it. */
export interface ScoredResponse {
  attemptId: string;
  attemptStatus: 'started' | 'finished' | 'abandoned';
  cohortId: string;
  itemId: string;
  itemVersion: number;
  answerKind: 'answer' | 'dont-know';
  score: number;
  receivedAt: string;
}

/**
 * The scored responses of a study (score not null; "I don't know" is stored with score 0), optionally
 * only those received up to `until` (a calibration's `responsesUntil`), in a stable order.
 */
export async function listScoredResponses(
  db: DbHandle,
  studyId: string,
  until?: string | null,
): Promise<ScoredResponse[]> {
  let query = db
    .selectFrom('responses')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select([
      'responses.attempt_id',
      'attempts.status as attempt_status',
      'cohorts.id as cohort_id',
      'responses.item_id',
      'responses.item_version',
      'responses.answer_kind',
      'responses.score',
      'responses.received_at',
    ])
    .where('cohorts.study_id', '=', studyId)
    .where('responses.score', 'is not', null);
  if (until !== undefined && until !== null) query = query.where('responses.received_at', '<=', until);
  const rows = await query.orderBy('responses.attempt_id').orderBy('responses.position').execute();
  return rows.map((row) => ({
    attemptId: row.attempt_id,
    attemptStatus: row.attempt_status,
    cohortId: row.cohort_id,
    itemId: row.item_id,
    itemVersion: Number(row.item_version),
    answerKind: row.answer_kind,
    score: Number(row.score),
    receivedAt: row.received_at,
  }));
}

/** How many scored responses a study has, and the newest one's time: tells whether a calibration is stale. */
export async function scoredResponseWatermark(
  db: DbHandle,
  studyId: string,
): Promise<{ count: number; newest: string | null }> {
  const row = await db
    .selectFrom('responses')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select((eb) => [
      eb.fn.countAll<number | string>().as('count'),
      eb.fn.max('responses.received_at').as('newest'),
    ])
    .where('cohorts.study_id', '=', studyId)
    .where('responses.score', 'is not', null)
    .executeTakeFirstOrThrow();
  return { count: Number(row.count), newest: (row.newest as string | null) ?? null };
}

/** Attempts of one cohort by status: started (includes not yet consented), finished, abandoned. */
export interface CohortAttemptCounts {
  cohortId: string;
  started: number;
  finished: number;
  abandoned: number;
  consented: number;
}

/** Attempt counts per cohort of a study (cohorts without attempts are left out). */
export async function countAttemptsByCohort(db: DbHandle, studyId: string): Promise<CohortAttemptCounts[]> {
  const rows = await db
    .selectFrom('attempts')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select((eb) => [
      'cohorts.id as cohort_id',
      'attempts.status as status',
      eb.fn.countAll<number | string>().as('count'),
      eb.fn.count<number | string>('attempts.consented_at').as('consented'),
    ])
    .where('cohorts.study_id', '=', studyId)
    .groupBy(['cohorts.id', 'attempts.status'])
    .execute();
  const byCohort = new Map<string, CohortAttemptCounts>();
  for (const row of rows) {
    const entry = byCohort.get(row.cohort_id) ?? {
      cohortId: row.cohort_id,
      started: 0,
      finished: 0,
      abandoned: 0,
      consented: 0,
    };
    entry[row.status] += Number(row.count);
    entry.consented += Number(row.consented);
    byCohort.set(row.cohort_id, entry);
  }
  return [...byCohort.values()];
}
