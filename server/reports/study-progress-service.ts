import { parseStudySettings } from '../delivery/attempt-service.js';
import type { DeliveryBank } from '../delivery/delivery-bank.js';
import { studyExposureControls } from '../delivery/exposure-control-service.js';
import { selectItemPool } from '../delivery/select-item-pool.js';
import { requireStudy } from '../delivery/study-service.js';
import type { DbHandle } from '../storage/db-handle.js';
import { nowIso } from '../storage/db-handle.js';
import { listRetiredItemIds } from '../storage/item-status-repository.js';
import {
  countAnswersByItem,
  countAttemptsByCohort,
  countAttemptsWithAnswers,
  countPilotAnswers,
  listAnswerTimes,
} from '../storage/progress-repository.js';
import { composeStudyProgress, type StudyProgress } from './study-progress.js';

/**
 * Reads a study's live progress from storage and composes it (server/reports/study-progress.ts).
 * @throws AppError STUDY_NOT_FOUND
 */
export async function readStudyProgress(
  db: DbHandle,
  bank: DeliveryBank,
  studyId: string,
): Promise<StudyProgress> {
  const record = await requireStudy(db, studyId);
  const settings = parseStudySettings(record);
  const pool = selectItemPool(
    bank.items.map((entry) => entry.item),
    settings.pool,
    await listRetiredItemIds(db),
  );
  const [cohorts, attemptsWithAnswers, answersByItem, answerTimes, pilots, exposure] = await Promise.all([
    countAttemptsByCohort(db, studyId),
    countAttemptsWithAnswers(db, studyId),
    countAnswersByItem(db, studyId),
    listAnswerTimes(db, studyId),
    countPilotAnswers(db, studyId),
    settings.design === 'adaptive' ? studyExposureControls(db, studyId) : undefined,
  ]);
  // An adaptive study's tuned exposure control (the one new attempts start with) sets the limit.
  const inUse = exposure?.controls.find((control) => control.id === exposure.inUse);
  return composeStudyProgress({
    study: { id: record.id, title: record.title, design: settings.design, status: record.status },
    poolItemIds: pool.itemIds,
    cohorts,
    attemptsWithAnswers,
    answersByItem,
    answerTimes,
    pilots,
    at: nowIso(),
    tunedExposureLimit: inUse?.targetMaxExposure,
  });
}
