import { stringify } from 'csv-stringify/sync';
import { AppError } from '../errors.js';
import { findLatestCalibration, listScoredResponses } from '../storage/calibration-repository.js';
import { listCohorts } from '../storage/cohort-repository.js';
import type { DbHandle } from '../storage/db-handle.js';
import { listStudyResponses } from '../storage/response-repository.js';
import { loadStudyCalibration, storedRubricSteps } from './calibrate-study.js';
import { personEstimates } from './person-estimates.js';
import type { Report } from './report-types.js';
import { studyResponseMatrix } from './study-response-matrix.js';

export type EstimateCell = string | number | boolean | null;

/** A table for CSV or JSON export. */
export interface EstimateTable {
  readonly columns: readonly string[];
  readonly rows: readonly EstimateCell[][];
}

/** The report's item table as an export: one row per calibrated item. */
export function exportItemParameters(report: Report): EstimateTable {
  return {
    columns: [
      'item_id',
      'chart_type',
      'level',
      'difficulty',
      'standard_error',
      'infit',
      'outfit',
      'responses',
      'dont_know_share',
      'anchored',
      'calibration_id',
    ],
    rows: report.items.map((i) => [
      i.itemId,
      i.chartType,
      i.level,
      i.difficulty,
      i.standardError,
      i.infit,
      i.outfit,
      i.responses,
      i.dontKnowShare,
      i.anchored,
      report.calibration.id,
    ]),
  };
}

/**
 * Person estimates (WLE, logits) from the study's latest calibration: one row per attempt with its
 * cohort, estimate, SE, answers and raw score. Background answers are added (as `bg_<id>` columns)
 * only when asked: they are data about people and are left out by default.
 *
 * @throws AppError TOO_FEW_RESPONSES when the study has no calibration yet
 */
export async function exportPersonEstimates(
  db: DbHandle,
  studyId: string,
  options: { background?: boolean } = {},
): Promise<EstimateTable> {
  const record = await findLatestCalibration(db, studyId);
  if (!record) {
    throw new AppError(
      'TOO_FEW_RESPONSES',
      'This study has no calibration yet: calibrate it first (plotgauge calibrate --study <id>).',
    );
  }
  const calibration = await loadStudyCalibration(db, record);
  const difficultyOf = new Map(calibration.items.map((i) => [i.itemId, i.difficulty]));
  const responses = await listScoredResponses(db, studyId, record.responsesUntil);
  const { matrix, cohortOfPerson } = studyResponseMatrix(responses, (id) => difficultyOf.has(id));
  const labelOf = new Map((await listCohorts(db, studyId)).map((c) => [c.id, c.label]));
  const cohortOf = new Map(matrix.personIds.map((id, p) => [id, cohortOfPerson[p]!]));
  const rubricSteps = storedRubricSteps(calibration.settings);
  const estimates = personEstimates(
    matrix,
    Float64Array.from(matrix.itemIds, (id) => difficultyOf.get(id)!),
    rubricSteps.size > 0 ? matrix.itemIds.map((id) => rubricSteps.get(id)) : undefined,
  );
  const backgroundOf = new Map<string, Record<string, string>>();
  if (options.background) {
    for (const r of await listStudyResponses(db, studyId)) backgroundOf.set(r.attemptId, r.background);
  }
  const backgroundIds = [...new Set([...backgroundOf.values()].flatMap((b) => Object.keys(b)))].sort();
  const round = (x: number) => Math.round(x * 1000) / 1000;
  return {
    columns: [
      'attempt_id',
      'cohort_label',
      'ability',
      'standard_error',
      'answered',
      'raw_score',
      'calibration_id',
      ...backgroundIds.map((id) => `bg_${id}`),
    ],
    rows: estimates.map((p) => [
      p.personId,
      labelOf.get(cohortOf.get(p.personId)!) ?? null,
      round(p.ability),
      round(p.standardError),
      p.answered,
      p.rawScore,
      record.id,
      ...backgroundIds.map((id) => backgroundOf.get(p.personId)?.[id] ?? null),
    ]),
  };
}

/** An export table as CSV (header row, CRLF, empty cell for none). */
export function estimatesToCsv(table: EstimateTable): string {
  return stringify([[...table.columns], ...table.rows.map((r) => r.map((c) => (c === null ? '' : c)))], {
    record_delimiter: 'windows',
    cast: { boolean: (value) => (value ? 'true' : 'false') },
  });
}
