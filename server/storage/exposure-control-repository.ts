import type { Selectable } from 'kysely';
import type { ExposureControlsTable } from './database.js';
import type { DbHandle } from './db-handle.js';

/** One stored exposure control (see migrations/…-create-exposure-controls.ts). */
export interface ExposureControlRecord {
  id: string;
  studyId: string;
  calibrationId: string;
  /** The adaptive settings it holds for (parsed JSON). */
  settings: Record<string, unknown>;
  settingsHash: string;
  /** K per item id, in [0, 1]. */
  itemParameters: Record<string, number>;
  targetMaxExposure: number;
  achievedMaxExposure: number;
  /** Seed, persons, rounds and per-round results of the tuning (parsed JSON). */
  simulation: Record<string, unknown>;
  createdAt: string;
  createdBy: string;
}

function toRecord(row: Selectable<ExposureControlsTable>): ExposureControlRecord {
  return {
    id: row.id,
    studyId: row.study_id,
    calibrationId: row.calibration_id,
    settings: JSON.parse(row.settings) as Record<string, unknown>,
    settingsHash: row.settings_hash,
    itemParameters: JSON.parse(row.item_parameters) as Record<string, number>,
    targetMaxExposure: Number(row.target_max_exposure),
    achievedMaxExposure: Number(row.achieved_max_exposure),
    simulation: JSON.parse(row.simulation) as Record<string, unknown>,
    createdAt: row.created_at,
    createdBy: row.created_by,
  };
}

/**
 * Stores a control. `settings` is written as given (a JSON string, so the stored text is the text
 * its hash was taken of). Never updates a row: tuning again adds one.
 */
export async function insertExposureControl(
  db: DbHandle,
  control: Omit<ExposureControlRecord, 'settings'> & { settingsJson: string },
): Promise<void> {
  await db
    .insertInto('exposure_controls')
    .values({
      id: control.id,
      study_id: control.studyId,
      calibration_id: control.calibrationId,
      settings: control.settingsJson,
      settings_hash: control.settingsHash,
      item_parameters: JSON.stringify(control.itemParameters),
      target_max_exposure: control.targetMaxExposure,
      achieved_max_exposure: control.achievedMaxExposure,
      simulation: JSON.stringify(control.simulation),
      created_at: control.createdAt,
      created_by: control.createdBy,
    })
    .execute();
}

/** Every control tuned on one calibration, newest first (ties by id, so the order is total). */
export async function listCalibrationExposureControls(
  db: DbHandle,
  calibrationId: string,
): Promise<ExposureControlRecord[]> {
  const rows = await db
    .selectFrom('exposure_controls')
    .selectAll()
    .where('calibration_id', '=', calibrationId)
    .orderBy('created_at', 'desc')
    .orderBy('id', 'desc')
    .execute();
  return rows.map(toRecord);
}

/** Every control of a study, newest first. */
export async function listStudyExposureControls(
  db: DbHandle,
  studyId: string,
): Promise<ExposureControlRecord[]> {
  const rows = await db
    .selectFrom('exposure_controls')
    .selectAll()
    .where('study_id', '=', studyId)
    .orderBy('created_at', 'desc')
    .orderBy('id', 'desc')
    .execute();
  return rows.map(toRecord);
}
