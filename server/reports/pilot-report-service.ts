/**
 * Loads what the report's "Pilot charts" section needs (pilots, their answers up to the
 * calibration's watermark) and builds it (pilot-section.ts). Undefined for a study without pilots.
 */
import type { ScoredResponse } from '../storage/calibration-repository.js';
import type { DbHandle } from '../storage/db-handle.js';
import { listPilots } from '../storage/pilot-repository.js';
import { countPilotAnswers, listStudyPilotResponses } from '../storage/pilot-response-repository.js';
import type { StudyCalibration } from './calibrate-study.js';
import { type PilotSection, pilotSection } from './pilot-section.js';
import type { Report } from './report-types.js';

export async function buildPilotSection(
  db: DbHandle,
  studyId: string,
  calibration: StudyCalibration,
  bankResponses: readonly ScoredResponse[],
  report: Pick<Report, 'audiences' | 'settings'>,
): Promise<PilotSection | undefined> {
  const pilots = await listPilots(db, studyId);
  if (pilots.length === 0) return undefined;
  const cohorts = new Map<string, string>();
  for (const audience of report.audiences) for (const c of audience.cohorts) cohorts.set(c.id, c.label);
  return pilotSection({
    pilots: pilots.map((p) => ({
      id: p.id,
      prompt: p.prompt,
      status: p.status,
      minResponses: p.minResponses,
    })),
    answerCounts: await countPilotAnswers(db, studyId),
    pilotAnswers: await listStudyPilotResponses(db, studyId, calibration.record.responsesUntil),
    bankResponses,
    calibration,
    rungs: report.audiences[0]?.ladder.rungs ?? [],
    cohorts: [...cohorts].map(([id, label]) => ({ id, label })),
    responseProbability: report.settings.responseProbability,
  });
}
