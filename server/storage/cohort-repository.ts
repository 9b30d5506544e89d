import type { Selectable } from 'kysely';
import type { CohortsTable } from './database.js';
import type { DbHandle } from './db-handle.js';

export type CohortRow = Selectable<CohortsTable>;

export interface CohortRecord {
  id: string;
  studyId: string;
  label: string;
  joinCode: string;
  createdAt: string;
}

export function cohortRowToRecord(row: CohortRow): CohortRecord {
  return {
    id: row.id,
    studyId: row.study_id,
    label: row.label,
    joinCode: row.join_code,
    createdAt: row.created_at,
  };
}

export async function insertCohort(db: DbHandle, cohort: CohortRecord): Promise<CohortRecord> {
  await db
    .insertInto('cohorts')
    .values({
      id: cohort.id,
      study_id: cohort.studyId,
      label: cohort.label,
      join_code: cohort.joinCode,
      created_at: cohort.createdAt,
    })
    .execute();
  return cohort;
}

export async function findCohortByJoinCode(
  db: DbHandle,
  joinCode: string,
): Promise<CohortRecord | undefined> {
  const row = await db.selectFrom('cohorts').selectAll().where('join_code', '=', joinCode).executeTakeFirst();
  return row ? cohortRowToRecord(row) : undefined;
}

export async function findCohortById(db: DbHandle, id: string): Promise<CohortRecord | undefined> {
  const row = await db.selectFrom('cohorts').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? cohortRowToRecord(row) : undefined;
}

/** The cohorts of a study, oldest first. */
export async function listCohorts(db: DbHandle, studyId: string): Promise<CohortRecord[]> {
  const rows = await db
    .selectFrom('cohorts')
    .selectAll()
    .where('study_id', '=', studyId)
    .orderBy('created_at')
    .orderBy('id')
    .execute();
  return rows.map(cohortRowToRecord);
}

export async function joinCodeExists(db: DbHandle, joinCode: string): Promise<boolean> {
  const row = await db
    .selectFrom('cohorts')
    .select('id')
    .where('join_code', '=', joinCode)
    .executeTakeFirst();
  return row !== undefined;
}
