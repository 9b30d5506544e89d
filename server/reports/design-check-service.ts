/**
 * The design check's database side: reads the study's latest calibration (never makes one: a design
 * check changes nothing) and the answers it used, and calls the pure {@link designCheck}.
 */
import type { ItemBank } from '../bank/load-bank.js';
import { AppError } from '../errors.js';
import { findLatestCalibration, listScoredResponses } from '../storage/calibration-repository.js';
import { listCohorts } from '../storage/cohort-repository.js';
import type { DbHandle } from '../storage/db-handle.js';
import { findStudyById } from '../storage/study-repository.js';
import { loadStudyCalibration } from './calibrate-study.js';
import { type DesignCheck, type DesignCheckItem, designCheck } from './design-check.js';
import type { PlannedChart } from './design-features.js';
import { studyResponseMatrix } from './study-response-matrix.js';

/**
 * Chart type, level and derived features of a bank item, for the design check; undefined for items no
 * longer in the bank and for short-text items (scored on a rubric, not right/wrong).
 */
export function designCheckItems(bank: ItemBank) {
  return (itemId: string): DesignCheckItem | undefined => {
    const item = bank.byId.get(itemId);
    if (!item || item.response.kind === 'short-text') return undefined;
    return { chartType: item.chart.type, level: item.level, features: item.features };
  };
}

/**
 * The design check of a planned chart against a study's latest calibration.
 *
 * @param itemOf chart type, level and derived features of a bank item (undefined when it left the bank:
 *   such items are left out of the model, as are rubric-scored items)
 * @throws AppError STUDY_NOT_FOUND; COHORT_NOT_FOUND for a cohort of another study; CALIBRATION_NEEDED
 *   when the study has no calibration; CALIBRATION_NOT_CONVERGED when the latest did not converge;
 *   TOO_FEW_RESPONSES when the chosen cohort has no one in the calibration; and what
 *   {@link designCheck} throws (bad chart type or level, features that cannot be estimated).
 */
export async function checkPlannedChart(
  db: DbHandle,
  itemOf: (itemId: string) => DesignCheckItem | undefined,
  studyId: string,
  planned: PlannedChart,
): Promise<DesignCheck> {
  const study = await findStudyById(db, studyId);
  if (!study) throw new AppError('STUDY_NOT_FOUND', `There is no study ${studyId}.`, { studyId });
  const cohorts = await listCohorts(db, studyId);
  if (planned.cohortId !== undefined && !cohorts.some((c) => c.id === planned.cohortId)) {
    throw new AppError(
      'COHORT_NOT_FOUND',
      `Cohort ${planned.cohortId} is not a cohort of study "${study.title}". Its cohorts: ${cohorts.map((c) => `${c.id} (${c.label})`).join(', ') || 'none yet'}.`,
      { field: 'body.cohortId', cohortId: planned.cohortId, studyId },
    );
  }
  const latest = await findLatestCalibration(db, studyId);
  if (!latest) {
    throw new AppError(
      'CALIBRATION_NEEDED',
      `Study "${study.title}" has no calibration yet, and a design check needs one: run plotgauge calibrate --study ${studyId} (or open the report, which calibrates when it can).`,
      { studyId },
    );
  }
  if (!latest.converged) {
    throw new AppError(
      'CALIBRATION_NOT_CONVERGED',
      `Calibration ${latest.id} did not converge, so no design check is drawn from it. Calibrate again (plotgauge calibrate --study ${studyId}).`,
      { calibrationId: latest.id },
    );
  }
  const calibration = await loadStudyCalibration(db, latest);
  const groups = calibration.settings.groups;
  if (planned.cohortId !== undefined && !groups.some((g) => g.cohortId === planned.cohortId)) {
    const label = cohorts.find((c) => c.id === planned.cohortId)?.label ?? planned.cohortId;
    throw new AppError(
      'TOO_FEW_RESPONSES',
      `Cohort "${label}" has no scored answers in calibration ${latest.id}. Collect answers from it, then calibrate again.`,
      { field: 'body.cohortId', cohortId: planned.cohortId, calibrationId: latest.id },
    );
  }
  const calibratedDifficulty = new Map(calibration.items.map((item) => [item.itemId, item.difficulty]));
  const items = new Map<string, DesignCheckItem>();
  for (const id of calibratedDifficulty.keys()) {
    const item = itemOf(id);
    if (item) items.set(id, item);
  }
  const responses = await listScoredResponses(db, studyId, latest.responsesUntil);
  // the LLTM is a model for right/wrong items: items scored on a rubric (0, 1, 2) are left out
  for (const r of responses) if (r.score > 1) items.delete(r.itemId);
  const { matrix } = studyResponseMatrix(responses, (id) => items.has(id));
  return designCheck({
    matrix,
    items,
    calibratedDifficulty,
    calibrationId: latest.id,
    planned,
    cohorts: groups.map((g) => ({ cohortId: g.cohortId, label: g.label, mean: g.mean, sd: g.sd })),
    draws: calibration.settings.bootstrap.draws,
  });
}
