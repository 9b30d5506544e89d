import type { DbHandle } from './db-handle.js';

/** Attempts of one cohort by status (every cohort of the study, also those nobody joined yet). */
export interface CohortAttemptCounts {
  cohortId: string;
  label: string;
  joinCode: string;
  /** Attempts whose status is still `started` (in progress or left open). */
  inProgress: number;
  finished: number;
  abandoned: number;
  /** Newest `last_seen_at` of the cohort's attempts; null before the first join. */
  lastActivityAt: string | null;
}

/** Answers to one bank item in a study. */
export interface ItemAnswerCount {
  itemId: string;
  /** Attempts that answered the item (at most one answer per attempt and item). */
  attempts: number;
}

/** One answer's server-measured time (ms from the item being shown to the answer arriving). */
export interface ItemAnswerTime {
  itemId: string;
  serverMs: number;
}

/** A pilot chart of the study and how many answers it has. */
export interface PilotAnswerCount {
  pilotId: string;
  prompt: string;
  status: 'active' | 'retired';
  minResponses: number;
  responses: number;
}

/** Counts of attempts per cohort and status, cohorts in the order they were added. */
export async function countAttemptsByCohort(db: DbHandle, studyId: string): Promise<CohortAttemptCounts[]> {
  const rows = await db
    .selectFrom('cohorts')
    .leftJoin('attempts', 'attempts.cohort_id', 'cohorts.id')
    .select((eb) => [
      'cohorts.id as cohort_id',
      'cohorts.label as label',
      'cohorts.join_code as join_code',
      'cohorts.created_at as created_at',
      eb.fn
        .sum<number | string | null>(eb.case().when('attempts.status', '=', 'started').then(1).else(0).end())
        .as('in_progress'),
      eb.fn
        .sum<number | string | null>(eb.case().when('attempts.status', '=', 'finished').then(1).else(0).end())
        .as('finished'),
      eb.fn
        .sum<number | string | null>(
          eb.case().when('attempts.status', '=', 'abandoned').then(1).else(0).end(),
        )
        .as('abandoned'),
      eb.fn.max('attempts.last_seen_at').as('last_activity_at'),
    ])
    .where('cohorts.study_id', '=', studyId)
    .groupBy(['cohorts.id', 'cohorts.label', 'cohorts.join_code', 'cohorts.created_at'])
    .orderBy('cohorts.created_at')
    .orderBy('cohorts.id')
    .execute();
  return rows.map((row) => ({
    cohortId: row.cohort_id,
    label: row.label,
    joinCode: row.join_code,
    inProgress: Number(row.in_progress ?? 0),
    finished: Number(row.finished ?? 0),
    abandoned: Number(row.abandoned ?? 0),
    lastActivityAt: row.last_activity_at ?? null,
  }));
}

/** How many attempts of the study have at least one answer to a bank item (the exposure denominator). */
export async function countAttemptsWithAnswers(db: DbHandle, studyId: string): Promise<number> {
  const row = await db
    .selectFrom('responses')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select((eb) => eb.fn.count<number | string>('responses.attempt_id').distinct().as('n'))
    .where('cohorts.study_id', '=', studyId)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

/** Per bank item: how many attempts of the study answered it (the exposure numerator). */
export async function countAnswersByItem(db: DbHandle, studyId: string): Promise<ItemAnswerCount[]> {
  const rows = await db
    .selectFrom('responses')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select((eb) => [
      'responses.item_id as item_id',
      eb.fn.count<number | string>('responses.attempt_id').distinct().as('n'),
    ])
    .where('cohorts.study_id', '=', studyId)
    .groupBy('responses.item_id')
    .orderBy('responses.item_id')
    .execute();
  return rows.map((row) => ({ itemId: row.item_id, attempts: Number(row.n) }));
}

/**
 * Every server-measured answer time of the study's bank items (answers without one are left out).
 * The median is computed outside storage (server/reports/study-progress.ts).
 */
export async function listAnswerTimes(db: DbHandle, studyId: string): Promise<ItemAnswerTime[]> {
  const rows = await db
    .selectFrom('responses')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select(['responses.item_id as item_id', 'responses.server_ms as server_ms'])
    .where('cohorts.study_id', '=', studyId)
    .where('responses.server_ms', 'is not', null)
    .orderBy('responses.item_id')
    .execute();
  return rows.map((row) => ({ itemId: row.item_id, serverMs: Number(row.server_ms) }));
}

/** The study's pilot charts with their answer counts, oldest first. */
export async function countPilotAnswers(db: DbHandle, studyId: string): Promise<PilotAnswerCount[]> {
  const rows = await db
    .selectFrom('pilot_items')
    .leftJoin('pilot_responses', 'pilot_responses.pilot_id', 'pilot_items.id')
    .select((eb) => [
      'pilot_items.id as id',
      'pilot_items.prompt as prompt',
      'pilot_items.status as status',
      'pilot_items.min_responses as min_responses',
      'pilot_items.created_at as created_at',
      eb.fn.count<number | string>('pilot_responses.id').as('n'),
    ])
    .where('pilot_items.study_id', '=', studyId)
    .groupBy([
      'pilot_items.id',
      'pilot_items.prompt',
      'pilot_items.status',
      'pilot_items.min_responses',
      'pilot_items.created_at',
    ])
    .orderBy('pilot_items.created_at')
    .orderBy('pilot_items.id')
    .execute();
  return rows.map((row) => ({
    pilotId: row.id,
    prompt: row.prompt,
    status: row.status,
    minResponses: Number(row.min_responses),
    responses: Number(row.n),
  }));
}

/** How many cohorts each study has (studies without cohorts are absent). */
export async function countCohortsByStudy(db: DbHandle): Promise<Map<string, number>> {
  const rows = await db
    .selectFrom('cohorts')
    .select((eb) => ['study_id', eb.fn.countAll<number | string>().as('n')])
    .groupBy('study_id')
    .execute();
  return new Map(rows.map((row) => [row.study_id, Number(row.n)]));
}
