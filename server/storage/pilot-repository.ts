import type { Selectable } from 'kysely';
import type { PilotItemsTable } from './database.js';
import type { DbHandle } from './db-handle.js';

/** A stored pilot item with its JSON columns parsed and its image decoded. */
export interface PilotRecord {
  id: string;
  studyId: string;
  prompt: string;
  alt: string;
  options: { id: string; text: string }[];
  key: string;
  mediaType: PilotItemsTable['media_type'];
  image: Buffer;
  minResponses: number;
  status: PilotItemsTable['status'];
  createdAt: string;
}

function rowToRecord(row: Selectable<PilotItemsTable>): PilotRecord {
  return {
    id: row.id,
    studyId: row.study_id,
    prompt: row.prompt,
    alt: row.alt,
    options: JSON.parse(row.options) as { id: string; text: string }[],
    key: JSON.parse(row.key) as string,
    mediaType: row.media_type,
    image: Buffer.from(row.image, 'base64'),
    minResponses: Number(row.min_responses),
    status: row.status,
    createdAt: row.created_at,
  };
}

export async function insertPilot(db: DbHandle, pilot: PilotRecord): Promise<void> {
  await db
    .insertInto('pilot_items')
    .values({
      id: pilot.id,
      study_id: pilot.studyId,
      prompt: pilot.prompt,
      alt: pilot.alt,
      options: JSON.stringify(pilot.options),
      key: JSON.stringify(pilot.key),
      media_type: pilot.mediaType,
      image: pilot.image.toString('base64'),
      min_responses: pilot.minResponses,
      status: pilot.status,
      created_at: pilot.createdAt,
    })
    .execute();
}

export async function findPilotById(db: DbHandle, id: string): Promise<PilotRecord | undefined> {
  const row = await db.selectFrom('pilot_items').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? rowToRecord(row) : undefined;
}

/** Sets a pilot's status (`retired`: no new attempt is given it). */
export async function setPilotStatus(db: DbHandle, id: string, status: PilotRecord['status']): Promise<void> {
  await db.updateTable('pilot_items').set({ status }).where('id', '=', id).execute();
}

/** A study's pilots, oldest first. */
export async function listPilots(db: DbHandle, studyId: string): Promise<PilotRecord[]> {
  const rows = await db
    .selectFrom('pilot_items')
    .selectAll()
    .where('study_id', '=', studyId)
    .orderBy('created_at')
    .orderBy('id')
    .execute();
  return rows.map(rowToRecord);
}
