import { AppError } from '../errors.js';
import { exportTableToCsv, longResponseTable, wideResponseTable } from '../reports/export-responses.js';
import { findCohortById } from '../storage/cohort-repository.js';
import type { DbHandle } from '../storage/db-handle.js';
import { listStudyResponses } from '../storage/response-repository.js';
import { parseStudySettings } from './attempt-service.js';
import { requireStudy } from './study-service.js';

export const exportFormats = ['long', 'wide'] as const;
export type ExportFormat = (typeof exportFormats)[number];

/**
 * The responses of a study (optionally one cohort) as CSV, long (one row per response) or wide
 * (attempt × item, 1/0/blank).
 * @throws AppError STUDY_NOT_FOUND, COHORT_NOT_FOUND
 */
export async function exportStudyResponses(
  db: DbHandle,
  studyId: string,
  options: { format: ExportFormat; cohortId?: string | undefined },
): Promise<string> {
  const study = await requireStudy(db, studyId);
  if (options.cohortId !== undefined) {
    const cohort = await findCohortById(db, options.cohortId);
    if (!cohort || cohort.studyId !== studyId) {
      throw new AppError('COHORT_NOT_FOUND', `No cohort ${options.cohortId} in this study.`, {
        field: 'cohort',
      });
    }
  }
  const responses = await listStudyResponses(db, studyId, options.cohortId);
  const settings = parseStudySettings(study);
  const table =
    options.format === 'long'
      ? longResponseTable(
          responses,
          settings.background.map((q) => q.id),
        )
      : wideResponseTable(responses);
  return exportTableToCsv(table);
}
