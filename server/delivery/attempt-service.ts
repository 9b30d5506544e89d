import { randomBytes, randomUUID } from 'node:crypto';
import { AppError } from '../errors.js';
import {
  type AttemptRecord,
  countAttemptsInStudy,
  insertAttempt,
  lockAttemptByTokenHash,
  updateAttempt,
} from '../storage/attempt-repository.js';
import {
  type CohortRecord,
  findCohortByJoinCode,
  findCohortWithStudy,
} from '../storage/cohort-repository.js';
import { type DbHandle, nowIso } from '../storage/db-handle.js';
import { listRetiredItemIds } from '../storage/item-status-repository.js';
import { syncItemVersions } from '../storage/item-version-repository.js';
import { countAttemptResponses } from '../storage/response-repository.js';
import { findStudyById, type StudyRecord } from '../storage/study-repository.js';
import { loadAdaptiveDelivery, startAdaptiveForm } from './adaptive-delivery.js';
import { type AttemptForm, attemptFormSchema } from './attempt-form.js';
import { type AttemptState, attemptStep, buildAttemptState } from './attempt-state.js';
import { hashAttemptToken, looksLikeAttemptToken, newAttemptToken } from './attempt-token.js';
import { bookletForAttempt, buildBooklets } from './build-booklets.js';
import type { DeliveryBank } from './delivery-bank.js';
import { normaliseJoinCode } from './join-code.js';
import { loadDuePilot, startAttemptPilots } from './pilots/pilot-delivery.js';
import { markScreenShown } from './pilots/pilot-slots.js';
import { selectItemPool } from './select-item-pool.js';
import { preferNotToSay, type StudySettings, studySettingsSchema } from './study-settings.js';
import { studyWithSettings } from './study-settings-cache.js';

/** Everything a respondent request needs about its attempt, loaded from the token. */
export interface AttemptContext {
  attempt: AttemptRecord;
  form: AttemptForm;
  cohort: CohortRecord;
  study: StudyRecord;
  settings: StudySettings;
}

const sessionEnded = 'This session has ended. Start again with the join code.';

/** Parses stored study settings (they were validated when written). */
export function parseStudySettings(study: StudyRecord): StudySettings {
  return studySettingsSchema.parse(study.settings);
}

/**
 * Loads (and locks, for the rest of the transaction) the attempt a token opens, or answers 401: a missing, malformed or unknown (forged) token,
 * and the token of an ended attempt (declined or left: replaying it opens nothing).
 */
export async function loadAttempt(
  db: DbHandle,
  token: string | undefined,
  options: { allowEnded?: boolean } = {},
): Promise<AttemptContext> {
  if (token === undefined || !looksLikeAttemptToken(token)) {
    throw new AppError('UNAUTHORIZED', 'Join with a code first (no valid attempt token was sent).');
  }
  const tokenHash = hashAttemptToken(token);
  const attempt = await lockAttemptByTokenHash(db, tokenHash);
  if (!attempt)
    throw new AppError('UNAUTHORIZED', 'This attempt token is not known. Join with a code again.');
  const form = attemptFormSchema.parse(attempt.form);
  if (form.ended !== null && !options.allowEnded) throw new AppError('UNAUTHORIZED', sessionEnded);
  const found = await findCohortWithStudy(db, attempt.cohortId);
  if (!found) throw new AppError('UNAUTHORIZED', sessionEnded);
  // Settings parsed once per stored text (shared, frozen): the respondent path only reads them.
  return { attempt, form, cohort: found.cohort, ...studyWithSettings(found.study) };
}

/**
 * Brings an attempt's stored record up to date before answering: finishes it when its time limit
 * has passed, and records when the item now due was first shown (the start of its server_ms).
 * Writes only when something changed; says whether it wrote.
 */
async function settle(db: DbHandle, context: AttemptContext, answered: number): Promise<boolean> {
  const { attempt, form, settings } = context;
  const now = nowIso();
  if (
    settings.timeLimitSeconds !== undefined &&
    attempt.status === 'started' &&
    attempt.consentedAt !== null &&
    Date.parse(now) - Date.parse(attempt.consentedAt) > settings.timeLimitSeconds * 1000
  ) {
    attempt.status = 'finished';
    attempt.finishedAt = now;
    await updateAttempt(db, attempt.id, { status: 'finished', finishedAt: now, lastSeenAt: now });
    return true;
  }
  let wrote = false;
  const step = attemptStep(attempt, form, settings, answered);
  if (step === 'finished' && attempt.status === 'started') {
    attempt.status = 'finished';
    attempt.finishedAt = now;
    await updateAttempt(db, attempt.id, { status: 'finished', finishedAt: now, lastSeenAt: now });
    wrote = true;
  }
  // The screen now due (a bank item or a pilot) records when it was first shown.
  if (step === 'item' && markScreenShown(form, answered, now)) {
    await updateAttempt(db, attempt.id, { form, lastSeenAt: now });
    wrote = true;
  }
  return wrote;
}

/** Settles the attempt and describes it for the page. */
export async function currentState(
  db: DbHandle,
  bank: DeliveryBank,
  context: AttemptContext,
): Promise<AttemptState> {
  return settledState(db, bank, context, await countAttemptResponses(db, context.attempt.id));
}

/**
 * `currentState` from response counts the caller already knows (an answer just stored: one count
 * query fewer). With `touch`, `last_seen_at` is written when settling wrote nothing, so an answer's
 * own update of the attempt row folds into the settle write (one statement instead of two).
 */
export async function settledState(
  db: DbHandle,
  bank: DeliveryBank,
  context: AttemptContext,
  counts: { answered: number; correct: number },
  options: { touch?: boolean } = {},
): Promise<AttemptState> {
  // settle() writes only the attempt row, never a response, so the counts stay valid after it.
  const pilot = await loadDuePilot(db, context.attempt.id, context.form, counts.answered);
  const wrote = await settle(db, context, counts.answered);
  if (options.touch === true && !wrote) await updateAttempt(db, context.attempt.id, { lastSeenAt: nowIso() });
  return buildAttemptState({ ...context, ...counts, bank, pilot });
}

/**
 * `POST /api/join`: a new attempt in the cohort whose join code was typed. Picks the attempt's items
 * (the fixed order, or the next booklet of a rotated design), records their versions, and returns
 * the new token (only its hash is stored).
 */
export async function joinByCode(
  db: DbHandle,
  bank: DeliveryBank,
  typedCode: string,
  log?: (warning: string) => void,
): Promise<{ token: string; state: AttemptState }> {
  const code = normaliseJoinCode(typedCode);
  const cohort = code === undefined ? undefined : await findCohortByJoinCode(db, code);
  if (!cohort) {
    throw new AppError('JOIN_CODE_NOT_FOUND', 'That join code was not found. Check it and try again.', {
      field: 'body.code',
    });
  }
  const study = await findStudyById(db, cohort.studyId);
  if (!study) throw new AppError('JOIN_CODE_NOT_FOUND', 'That join code was not found.');
  if (study.status !== 'open') {
    throw new AppError('STUDY_CLOSED', 'This activity has closed. Thank you for your interest.');
  }
  const settings = parseStudySettings(study);
  const { itemIds: pool } = selectItemPool(
    bank.items.map((entry) => entry.item),
    settings.pool,
    await listRetiredItemIds(db),
  );
  if (pool.length === 0) {
    throw new AppError('CONFLICT', 'This activity has no questions available right now.', {
      reason: 'the item pool of the study is empty in the loaded bank',
    });
  }
  let itemIds: string[];
  let booklet = 0;
  const seed = randomBytes(8).toString('hex');
  let adaptive: Pick<AttemptForm, 'items' | 'adaptive'> | undefined;
  if (settings.design === 'adaptive') {
    const delivery = await loadAdaptiveDelivery(db, bank, study.id, settings);
    const started = startAdaptiveForm(delivery, cohort.id, seed);
    if (started.warning !== null) log?.(started.warning);
    adaptive = { items: started.items, adaptive: started.adaptive };
    itemIds = [];
  } else if (settings.design === 'rotated') {
    // common items still in the pool (one retired since the study was made simply drops out)
    const common = (settings.commonItems ?? []).filter((id) => pool.includes(id));
    const booklets = buildBooklets(pool, settings.maxItems, common);
    booklet = bookletForAttempt(await countAttemptsInStudy(db, study.id), booklets.length);
    itemIds = booklets[booklet]!;
  } else {
    itemIds = pool.slice(0, settings.maxItems);
  }
  const at = nowIso();
  const versions = await syncItemVersions(
    db,
    itemIds.map((id) => {
      const entry = bank.get(id)!;
      return { id, contentHash: entry.contentHash, status: entry.item.status };
    }),
    at,
  );
  const items = adaptive?.items ?? itemIds.map((itemId) => ({ itemId, version: versions.get(itemId)! }));
  const pilots = await startAttemptPilots(db, study.id, settings, items.length, seed);
  const form: AttemptForm = {
    design: settings.design,
    booklet,
    items,
    presentedAt: items.map(() => null),
    backgroundDone: settings.background.length === 0,
    ended: null,
    seed,
    ...(adaptive?.adaptive === undefined ? {} : { adaptive: adaptive.adaptive }),
    ...(pilots.length === 0 ? {} : { pilots }),
  };
  const token = newAttemptToken();
  const id = randomUUID();
  await insertAttempt(db, { id, cohortId: cohort.id, tokenHash: hashAttemptToken(token), form, at });
  const state = buildAttemptState({
    attempt: { status: 'started', consentedAt: null },
    form,
    settings,
    answered: 0,
    correct: 0,
    bank,
  });
  return { token, state };
}

/** `POST /api/attempt/consent`: agree (move on) or decline (the attempt ends, nothing is asked). */
export async function giveConsent(
  db: DbHandle,
  bank: DeliveryBank,
  context: AttemptContext,
  agree: boolean,
): Promise<AttemptState> {
  const { attempt, form } = context;
  if (attempt.status === 'finished')
    throw new AppError('ATTEMPT_FINISHED', 'This attempt is already finished.');
  const now = nowIso();
  if (!agree) {
    if (attempt.consentedAt !== null) {
      throw new AppError('STEP_NOT_CURRENT', 'Consent was already given; to stop, leave the attempt.');
    }
    form.ended = 'declined';
    attempt.status = 'abandoned';
    await updateAttempt(db, attempt.id, { form, status: 'abandoned', lastSeenAt: now });
    return currentState(db, bank, context);
  }
  if (attempt.consentedAt === null) {
    attempt.consentedAt = now;
    await updateAttempt(db, attempt.id, { consentedAt: now, lastSeenAt: now });
  }
  return currentState(db, bank, context);
}

/**
 * `POST /api/attempt/background`: answers to the study's own questions, each an option id or
 * "prefer-not-to-say". Every question must be answered; unknown questions or options are refused
 * with the field named.
 */
export async function answerBackground(
  db: DbHandle,
  bank: DeliveryBank,
  context: AttemptContext,
  answers: Record<string, string>,
): Promise<AttemptState> {
  const { attempt, form, settings } = context;
  const questions = new Map(settings.background.map((q) => [q.id, q]));
  const problems: { field: string; problem: string }[] = [];
  for (const [id, value] of Object.entries(answers)) {
    const question = questions.get(id);
    if (!question)
      problems.push({ field: `body.answers.${id}`, problem: 'this study asks no such question' });
    else if (value !== preferNotToSay && !question.options.some((o) => o.id === value))
      problems.push({
        field: `body.answers.${id}`,
        problem: `"${value}" is not one of this question's options`,
      });
  }
  for (const id of questions.keys()) {
    if (!(id in answers))
      problems.push({ field: `body.answers.${id}`, problem: `answer it or choose "${preferNotToSay}"` });
  }
  if (problems.length > 0) {
    throw new AppError('VALIDATION_FAILED', `${problems[0]!.field}: ${problems[0]!.problem}`, { problems });
  }
  const answered = (await countAttemptResponses(db, attempt.id)).answered;
  const step = attemptStep(attempt, form, settings, answered);
  if (step !== 'background') {
    const same = JSON.stringify(sortKeys(attempt.background)) === JSON.stringify(sortKeys(answers));
    if (form.backgroundDone && same && settings.background.length > 0) return currentState(db, bank, context);
    if (step === 'finished') throw new AppError('ATTEMPT_FINISHED', 'This attempt is already finished.');
    throw new AppError(
      'STEP_NOT_CURRENT',
      step === 'consent' ? 'Agree to take part first.' : 'The background questions are already answered.',
      { step },
    );
  }
  form.backgroundDone = true;
  const background = sortKeys(answers);
  attempt.background = background;
  await updateAttempt(db, attempt.id, { form, background, lastSeenAt: nowIso() });
  return currentState(db, bank, context);
}

/** `POST /api/attempt/leave`: the attempt ends here (kiosk start-over, idle reset). Idempotent. */
export async function leaveAttempt(
  db: DbHandle,
  bank: DeliveryBank,
  context: AttemptContext,
): Promise<AttemptState> {
  const { attempt, form } = context;
  if (form.ended === null) {
    form.ended = 'left';
    const status = attempt.status === 'started' ? 'abandoned' : attempt.status;
    attempt.status = status;
    await updateAttempt(db, attempt.id, { form, status, lastSeenAt: nowIso() });
  }
  const counts = await countAttemptResponses(db, attempt.id);
  return buildAttemptState({ ...context, ...counts, bank });
}

function sortKeys(record: Record<string, string>): Record<string, string> {
  return Object.fromEntries(Object.entries(record).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}
