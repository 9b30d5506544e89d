/**
 * Pilots in live attempts: which pilots a new attempt shows and where, and the pilot now due.
 * Answers are stored by pilot-answer-service.ts; the bank part of the attempt never sees a pilot.
 */
import { updateAttempt } from '../../storage/attempt-repository.js';
import type { DbHandle } from '../../storage/db-handle.js';
import { findPilotById, listPilots, type PilotRecord } from '../../storage/pilot-repository.js';
import { countPilotAnswers } from '../../storage/pilot-response-repository.js';
import type { AttemptForm } from '../attempt-form.js';
import type { StudySettings } from '../study-settings.js';
import {
  choosePilots,
  duePilot,
  type FormPilot,
  formPilots,
  pilotPlaceCount,
  pilotPlaces,
  pilotsPerAttemptOf,
} from './pilot-slots.js';

/**
 * The pilots of a new attempt: the study's active pilots with the fewest answers so far (ties at
 * random), `pilotsPerAttempt` of them (default 1), at random places seeded by the attempt.
 * Empty when the study has no active pilot or asks for none.
 *
 * @param formLength bank items of the new form (fixed, rotated); ignored when adaptive.
 */
export async function startAttemptPilots(
  db: DbHandle,
  studyId: string,
  settings: StudySettings,
  formLength: number,
  formSeed: string,
): Promise<FormPilot[]> {
  const count = pilotsPerAttemptOf(settings);
  if (count === 0) return [];
  const active = (await listPilots(db, studyId)).filter((p) => p.status === 'active');
  if (active.length === 0) return [];
  const answers = await countPilotAnswers(db, studyId);
  const chosen = choosePilots(
    active.map((p) => ({ id: p.id, answers: answers.get(p.id) ?? 0 })),
    count,
    formSeed,
  );
  const places = pilotPlaces(chosen.length, pilotPlaceCount(settings, formLength), formSeed);
  return formPilots(chosen, places);
}

/**
 * The stored pilot due now (its view is built from it), or undefined when a bank item is next.
 * A pilot removed from the study since the attempt started is dropped from the form (written
 * back), so the attempt moves on instead of failing.
 */
export async function loadDuePilot(
  db: DbHandle,
  attemptId: string,
  form: AttemptForm,
  answered: number,
): Promise<PilotRecord | undefined> {
  for (;;) {
    const due = duePilot(form, answered);
    if (due === undefined) return undefined;
    const pilot = await findPilotById(db, due.pilotId);
    if (pilot !== undefined) return pilot;
    form.pilots = form.pilots?.filter((p) => p !== due);
    await updateAttempt(db, attemptId, { form });
  }
}
