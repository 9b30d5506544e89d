/**
 * The report service: finds (or makes) the study's current calibration, checks the request against
 * it, and composes the report every output (JSON, HTML, CSV, text) prints.
 */
import { AppError } from '../errors.js';
import {
  type CalibrationRecord,
  countAttemptsByCohort,
  findLatestCalibration,
  listScoredResponses,
  scoredResponseWatermark,
} from '../storage/calibration-repository.js';
import { listCohorts } from '../storage/cohort-repository.js';
import type { DbHandle } from '../storage/db-handle.js';
import { listDoubleScores, listRubricScoredItemIds } from '../storage/rubric-score-repository.js';
import { findStudyById } from '../storage/study-repository.js';
import {
  type CalibrateStudyOptions,
  calibrateStudy,
  loadStudyCalibration,
  type StudyCalibration,
} from './calibrate-study.js';
import { composeReport, type ReportItemInfo, type ReportOptions } from './compose-report.js';
import type { FairnessGrouping } from './fairness-section.js';
import { buildFairnessSection } from './fairness-service.js';
import { buildPilotSection } from './pilot-report-service.js';
import type { Report } from './report-types.js';
import { rubricAgreementSection } from './rubric-agreement-section.js';

export interface BuildReportOptions extends ReportOptions {
  /**
   * 'when-stale' (default): calibrate first when the study has no calibration or scored responses
   * arrived since the latest; 'never': report from the latest calibration as it is.
   */
  readonly calibrate?: 'when-stale' | 'never';
  /** Options of an on-demand calibration. */
  readonly calibration?: CalibrateStudyOptions;
  /** Adds the Fairness section (DIF between two answers of a background question, or two cohorts). */
  readonly fairness?: FairnessGrouping;
}

/** The study's current calibration: the latest, or a new one when none exists or it is stale. */
export async function currentCalibration(
  db: DbHandle,
  studyId: string,
  options: Pick<BuildReportOptions, 'calibrate' | 'calibration'> = {},
): Promise<{ calibration: StudyCalibration; newerResponses: number }> {
  const latest = await findLatestCalibration(db, studyId);
  const watermark = await scoredResponseWatermark(db, studyId);
  const stale = (record: CalibrationRecord) =>
    watermark.count !== record.responseCount || watermark.newest !== record.responsesUntil;
  if (latest && (options.calibrate === 'never' || !stale(latest))) {
    return {
      calibration: await loadStudyCalibration(db, latest),
      newerResponses: Math.max(watermark.count - latest.responseCount, 0),
    };
  }
  if (!latest && options.calibrate === 'never') {
    throw new AppError(
      'TOO_FEW_RESPONSES',
      'This study has no calibration yet: run plotgauge calibrate --study <id> (or open the report, which calibrates when it can).',
    );
  }
  return { calibration: await calibrateStudy(db, studyId, options.calibration), newerResponses: 0 };
}

/**
 * Builds the report of a study, of one cohort, or of two cohorts compared.
 *
 * @param itemInfo chart type and task level of a bank item (undefined for an item no longer in the bank)
 * @throws AppError STUDY_NOT_FOUND; COHORT_NOT_FOUND for a cohort of another study; TOO_FEW_RESPONSES
 *   (saying how many more are needed) for a study or cohort without enough answers;
 *   CALIBRATION_NOT_CONVERGED for a calibration that did not converge.
 */
export async function buildReport(
  db: DbHandle,
  itemInfo: (itemId: string) => ReportItemInfo | undefined,
  studyId: string,
  options: BuildReportOptions = {},
): Promise<Report> {
  const study = await findStudyById(db, studyId);
  if (!study) throw new AppError('STUDY_NOT_FOUND', `There is no study ${studyId}.`, { studyId });
  const cohorts = await listCohorts(db, studyId);
  const known = new Set(cohorts.map((c) => c.id));
  const requested = [
    ...(options.compare ?? []),
    ...(options.cohortId === undefined ? [] : [options.cohortId]),
  ];
  for (const id of requested) {
    if (!known.has(id)) {
      throw new AppError(
        'COHORT_NOT_FOUND',
        `Cohort ${id} is not a cohort of study "${study.title}". Its cohorts: ${cohorts.map((c) => `${c.id} (${c.label})`).join(', ') || 'none yet'}.`,
        { cohortId: id, studyId },
      );
    }
  }
  if (options.compare && options.compare[0] === options.compare[1]) {
    throw new AppError('VALIDATION_FAILED', 'Compare two different cohorts.', { field: 'query.compare' });
  }

  const { calibration, newerResponses } = await currentCalibration(db, studyId, options);
  const record = calibration.record;
  if (!record.converged) {
    throw new AppError(
      'CALIBRATION_NOT_CONVERGED',
      `Calibration ${record.id} (${record.createdAt}) did not converge after ${record.iterations} iterations, so no report is drawn from it. ` +
        'Calibrate again (plotgauge calibrate --study <id>); if it still fails, more respondents per booklet usually help.',
      { calibrationId: record.id, iterations: record.iterations },
    );
  }
  const inCalibration = new Set(calibration.settings.groups.map((g) => g.cohortId));
  for (const id of requested) {
    if (!inCalibration.has(id)) {
      const label = cohorts.find((c) => c.id === id)?.label ?? id;
      throw new AppError(
        'TOO_FEW_RESPONSES',
        `Cohort "${label}" has no scored answers in calibration ${record.id}. A cohort needs respondents before it can be reported; collect answers, then calibrate again.`,
        { cohortId: id, calibrationId: record.id },
      );
    }
  }
  const responses = await listScoredResponses(db, studyId, record.responsesUntil);
  const composed = composeReport({
    study: { id: study.id, title: study.title },
    cohorts: cohorts.map((c) => ({ id: c.id, label: c.label })),
    calibration,
    responses,
    attempts: await countAttemptsByCohort(db, studyId),
    newerResponses,
    itemInfo,
    options,
  });
  // Rater agreement reads every double score so far (scores are about raters, not the calibration).
  const rubricItemIds = await listRubricScoredItemIds(db, studyId);
  // Pilot charts: calibrated onto this calibration's scale with the bank anchored (never the reverse).
  const pilots = await buildPilotSection(db, studyId, calibration, responses, composed);
  const withPilots: Report = pilots === undefined ? composed : { ...composed, pilots };
  const report: Report =
    rubricItemIds.length > 0
      ? {
          ...withPilots,
          rubric: rubricAgreementSection(
            rubricItemIds,
            await listDoubleScores(db, studyId),
            calibration.settings.partialCredit?.items ?? [],
          ),
        }
      : withPilots;
  if (!options.fairness) return report;
  const fairness = await buildFairnessSection(
    db,
    studyId,
    study.settings,
    cohorts,
    calibration,
    responses,
    options.fairness,
  );
  return { ...report, fairness };
}
