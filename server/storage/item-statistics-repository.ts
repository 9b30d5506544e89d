import { type CalibrationItemRecord, calibrationItemRowToRecord } from './calibration-repository.js';
import type { DbHandle } from './db-handle.js';

/** An item's parameters in the newest converged calibration that includes it. */
export interface LatestItemCalibration extends CalibrationItemRecord {
  calibrationId: string;
  studyId: string | null;
  calibratedAt: string;
}

/**
 * For every calibrated item, its parameters in the newest converged calibration (of any study)
 * that includes it. Non-converged calibrations are skipped: no report is drawn from them either.
 */
export async function latestItemCalibrations(db: DbHandle): Promise<Map<string, LatestItemCalibration>> {
  const rows = await db
    .selectFrom('calibration_items as i')
    .innerJoin('calibrations as c', 'c.id', 'i.calibration_id')
    .select([
      'i.item_id',
      'i.item_version',
      'i.difficulty',
      'i.standard_error',
      'i.infit',
      'i.outfit',
      'i.anchored',
      'c.id as calibration_id',
      'c.study_id',
      'c.created_at',
    ])
    .where('c.converged', '=', 1)
    .orderBy('c.created_at', 'desc')
    .orderBy('c.id', 'desc')
    .execute();
  const latest = new Map<string, LatestItemCalibration>();
  for (const row of rows) {
    if (latest.has(row.item_id)) continue;
    latest.set(row.item_id, {
      ...calibrationItemRowToRecord(row),
      calibrationId: row.calibration_id,
      studyId: row.study_id,
      calibratedAt: row.created_at,
    });
  }
  return latest;
}

/**
 * Responses per item over every study, and the number of attempts with at least one response (the
 * denominator of exposure = responses / attempts, as the progress page counts it per study). One
 * response per attempt and item, so an item's count is also the attempts that answered it. Counts
 * only; no answer leaves storage.
 */
export async function itemExposureCounts(
  db: DbHandle,
): Promise<{ attempts: number; responsesByItem: Map<string, number> }> {
  const attempts = await db
    .selectFrom('responses')
    .select(({ fn }) => fn.count<number>('attempt_id').distinct().as('count'))
    .executeTakeFirstOrThrow();
  const rows = await db
    .selectFrom('responses')
    .select(['item_id', ({ fn }) => fn.countAll<number>().as('count')])
    .groupBy('item_id')
    .execute();
  return {
    attempts: Number(attempts.count),
    responsesByItem: new Map(rows.map((row) => [row.item_id, Number(row.count)])),
  };
}
