/**
 * DIF classes for the bank browser. For the converged calibration an item's difficulty comes from,
 * when its study has at least two cohorts with respondents in it: the Mantel-Haenszel ETS class of
 * each item between the study's first two cohorts (by creation), exactly as the report's Fairness
 * section computes it with `fairness=cohorts:<first>,<second>` (server/reports/fairness-service.ts).
 * A stored calibration never changes, so each is checked once per process and remembered.
 */
import { AppError } from '../errors.js';
import { findCalibrationById, listScoredResponses } from '../storage/calibration-repository.js';
import { listCohorts } from '../storage/cohort-repository.js';
import type { DbHandle } from '../storage/db-handle.js';
import { findStudyById } from '../storage/study-repository.js';
import { loadStudyCalibration } from './calibrate-study.js';
import { buildFairnessSection } from './fairness-service.js';

/** A DIF result for an item from a fairness check. */
export interface ItemDifClass {
  /** ETS class (A, B+, B-, C+, C-), or null when the check could not class the item. */
  etsClass: string | null;
  /** The two groups, in words (for example "cohorts Morning visitors vs Afternoon visitors"). */
  groups: string;
}

/** Calibrations remembered at most (oldest forgotten first). */
const rememberedCalibrations = 200;

/**
 * A checker that returns the DIF classes of every item of a calibration by item id, or an empty
 * map when the calibration cannot be checked (not converged, fewer than two cohorts with
 * respondents, no study).
 */
export function bankDifChecker(): (
  db: DbHandle,
  calibrationId: string,
) => Promise<Map<string, ItemDifClass>> {
  const remembered = new Map<string, Map<string, ItemDifClass>>();
  return async (db, calibrationId) => {
    const known = remembered.get(calibrationId);
    if (known !== undefined) return known;
    const classes = await checkCalibration(db, calibrationId);
    if (remembered.size >= rememberedCalibrations)
      remembered.delete(remembered.keys().next().value as string);
    remembered.set(calibrationId, classes);
    return classes;
  };
}

async function checkCalibration(db: DbHandle, calibrationId: string): Promise<Map<string, ItemDifClass>> {
  const record = await findCalibrationById(db, calibrationId);
  if (!record?.converged || record.studyId === null) return new Map();
  const study = await findStudyById(db, record.studyId);
  if (!study) return new Map();
  const calibration = await loadStudyCalibration(db, record);
  const grouped = new Set(calibration.settings.groups?.map((g) => g.cohortId) ?? []);
  const cohorts = (await listCohorts(db, study.id)).filter((c) => grouped.has(c.id));
  if (cohorts.length < 2) return new Map();
  const [reference, focal] = cohorts as [(typeof cohorts)[0], (typeof cohorts)[0]];
  const responses = await listScoredResponses(db, study.id, record.responsesUntil);
  try {
    const section = await buildFairnessSection(
      db,
      study.id,
      study.settings,
      cohorts,
      calibration,
      responses,
      { kind: 'cohorts', reference: reference.id, focal: focal.id },
    );
    const groups = `cohorts ${reference.label} vs ${focal.label}`;
    return new Map(section.items.map((item) => [item.itemId, { etsClass: item.etsClass, groups }]));
  } catch (error) {
    // A group without respondents in this calibration: the check cannot run, so nothing is claimed.
    if (error instanceof AppError && error.code === 'TOO_FEW_RESPONSES') return new Map();
    throw error;
  }
}
