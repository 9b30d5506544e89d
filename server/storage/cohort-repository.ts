import type { Selectable } from 'kysely';
import type { CohortsTable } from './database.js';
import type { DbHandle } from './db-handle.js';
import { preparedQuery } from './prepared-query.js';
import type { StudyRow } from './study-repository.js';

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

/**
 * A cohort with its study's row, in one query (every respondent request needs both). The study's
 * settings stay unparsed JSON: `server/delivery/study-settings-cache.ts` parses them once per text.
 */
export async function findCohortWithStudy(
  db: DbHandle,
  cohortId: string,
): Promise<{ cohort: CohortRecord; study: StudyRow } | undefined> {
  const [row] = await cohortWithStudy(db, [cohortId]);
  if (!row) return undefined;
  return {
    cohort: {
      id: row.cohort_id,
      studyId: row.study_id,
      label: row.label,
      joinCode: row.join_code,
      createdAt: row.cohort_created_at,
    },
    study: {
      id: row.study_id,
      title: row.title,
      settings: row.settings,
      status: row.status,
      created_at: row.study_created_at,
      updated_at: row.updated_at,
    },
  };
}

const cohortWithStudy = preparedQuery(1, (db, [cohortId]) =>
  db
    .selectFrom('cohorts')
    .innerJoin('studies', 'studies.id', 'cohorts.study_id')
    .select([
      'cohorts.id as cohort_id',
      'cohorts.study_id',
      'cohorts.label',
      'cohorts.join_code',
      'cohorts.created_at as cohort_created_at',
      'studies.title',
      'studies.settings',
      'studies.status',
      'studies.created_at as study_created_at',
      'studies.updated_at',
    ])
    .where('cohorts.id', '=', cohortId!),
);

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
