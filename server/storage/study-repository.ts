import type { Selectable } from 'kysely';
import type { StudiesTable } from './database.js';
import type { DbHandle } from './db-handle.js';

export type StudyRow = Selectable<StudiesTable>;
export type StudyStatus = StudiesTable['status'];

/** A study as the rest of the server sees it: settings parsed from JSON, camelCase times. */
export interface StudyRecord {
  id: string;
  title: string;
  /** Parsed JSON; `server/delivery/study-settings.ts` validates it. */
  settings: unknown;
  status: StudyStatus;
  createdAt: string;
  updatedAt: string;
}

export function studyRowToRecord(row: StudyRow): StudyRecord {
  return {
    id: row.id,
    title: row.title,
    settings: JSON.parse(row.settings) as unknown,
    status: row.status,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
}

export async function insertStudy(
  db: DbHandle,
  study: { id: string; title: string; settings: unknown; status: StudyStatus; at: string },
): Promise<StudyRecord> {
  const row: StudyRow = {
    id: study.id,
    title: study.title,
    settings: JSON.stringify(study.settings),
    status: study.status,
    created_at: study.at,
    updated_at: study.at,
  };
  await db.insertInto('studies').values(row).execute();
  return studyRowToRecord(row);
}

export async function findStudyById(db: DbHandle, id: string): Promise<StudyRecord | undefined> {
  const row = await db.selectFrom('studies').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? studyRowToRecord(row) : undefined;
}

/** All studies, newest first. */
export async function listStudies(db: DbHandle): Promise<StudyRecord[]> {
  const rows = await db
    .selectFrom('studies')
    .selectAll()
    .orderBy('created_at', 'desc')
    .orderBy('id')
    .execute();
  return rows.map(studyRowToRecord);
}

export async function updateStudy(
  db: DbHandle,
  id: string,
  change: { title: string; settings: unknown; status: StudyStatus; at: string },
): Promise<void> {
  await db
    .updateTable('studies')
    .set({
      title: change.title,
      settings: JSON.stringify(change.settings),
      status: change.status,
      updated_at: change.at,
    })
    .where('id', '=', id)
    .execute();
}
