/**
 * Where pilot charts sit inside an attempt, and which screen is due.
 *
 * A pilot entry `{ pilotId, at }` in the attempt's form is shown just before the bank item at
 * position `at`, that is once `at` bank items are answered (or as soon as the bank part is over,
 * whichever comes first, so a pilot is never skipped by an early stop). The bank part is untouched:
 * bank positions, the count of bank answers that drives the attempt's step, and the adaptive
 * engine's state and stop rules never see a pilot.
 */
import { createHash } from 'node:crypto';
import { seededRandom } from '../../scoring/seeded-random.js';
import { adaptiveStudySettingsSchema } from '../adaptive/adaptive-settings.js';
import type { AttemptForm } from '../attempt-form.js';
import type { StudySettings } from '../study-settings.js';

/** One pilot of an attempt as its form records it. */
export type FormPilot = NonNullable<AttemptForm['pilots']>[number];

/** A uint32 seed from the attempt's seed and a purpose, so each use draws its own stream. */
function seedOf(formSeed: string, purpose: string): number {
  return createHash('sha256').update(`${formSeed}:${purpose}`).digest().readUInt32BE(0);
}

/** Pilots per attempt: the study's `pilotsPerAttempt`, else 1 (only when the study has active pilots). */
export function pilotsPerAttemptOf(settings: StudySettings): number {
  return settings.pilotsPerAttempt ?? 1;
}

/**
 * Picks `count` pilots for a new attempt: those with the fewest answers so far, ties broken at
 * random (seeded by the attempt), so pilots fill up evenly.
 *
 * @example choosePilots([{ id: 'a', answers: 5 }, { id: 'b', answers: 2 }], 1, 'seed') // ['b']
 */
export function choosePilots(
  candidates: readonly { readonly id: string; readonly answers: number }[],
  count: number,
  formSeed: string,
): string[] {
  const random = seededRandom(seedOf(formSeed, 'pilot-choice'));
  return candidates
    .map((c) => ({ ...c, tie: random.uniform() }))
    .sort((a, b) => a.answers - b.answers || a.tie - b.tie)
    .slice(0, Math.max(0, count))
    .map((c) => c.id);
}

/**
 * How many places a pilot may take (`at` from 0 to the result − 1).
 * - fixed, rotated: among the form's positions (before any of its bank items);
 * - adaptive: within the first minItems positions (and maxItems), which every attempt reaches
 *   unless its time runs out.
 */
export function pilotPlaceCount(settings: StudySettings, formLength: number): number {
  if (settings.design === 'adaptive') {
    return Math.max(
      1,
      Math.min((settings.adaptive ?? adaptiveStudySettingsSchema.parse({})).minItems, settings.maxItems),
    );
  }
  return Math.max(1, formLength);
}

/**
 * Random places for `count` pilots among `places` (seeded by the attempt): distinct while there
 * are enough places, ascending.
 */
export function pilotPlaces(count: number, places: number, formSeed: string): number[] {
  const random = seededRandom(seedOf(formSeed, 'pilot-places'));
  const pool = Array.from({ length: places }, (_, i) => i);
  const chosen: number[] = [];
  for (let k = 0; k < count; k++) {
    if (pool.length === 0) chosen.push(random.integer(places));
    else chosen.push(pool.splice(random.integer(pool.length), 1)[0]!);
  }
  return chosen.sort((a, b) => a - b);
}

/** The form entries of a new attempt's pilots. */
export function formPilots(pilotIds: readonly string[], places: readonly number[]): FormPilot[] {
  return pilotIds.map((pilotId, k) => ({ pilotId, at: places[k]!, presentedAt: null, answered: false }));
}

/**
 * The pilot due now, or undefined when the next screen is a bank item (or nothing).
 *
 * @param answered bank answers stored so far.
 */
export function duePilot(form: AttemptForm, answered: number): FormPilot | undefined {
  const bankOver = answered >= form.items.length;
  return form.pilots?.find((p) => !p.answered && (p.at <= answered || bankOver));
}

/** Pilots the attempt answered. */
export function pilotsAnswered(form: AttemptForm): number {
  return form.pilots?.filter((p) => p.answered).length ?? 0;
}

/** Pilots in the attempt. */
export function pilotCount(form: AttemptForm): number {
  return form.pilots?.length ?? 0;
}

/**
 * Records when the screen now due was first shown (the start of its server_ms): the due pilot's
 * `presentedAt`, else the bank item's `presentedAt[answered]`. Returns true when it wrote.
 */
export function markScreenShown(form: AttemptForm, answered: number, now: string): boolean {
  const pilot = duePilot(form, answered);
  if (pilot !== undefined) {
    if (pilot.presentedAt !== null) return false;
    pilot.presentedAt = now;
    return true;
  }
  if (answered >= form.items.length || form.presentedAt[answered] !== null) return false;
  form.presentedAt[answered] = now;
  return true;
}
