/**
 * Stores a respondent's answer to a pilot chart. The respondent posts it like any answer
 * (`POST /api/attempt/responses` with the pilot's id as `itemId`); `submitResponse` hands it here
 * when the id is a pilot of the attempt. The answer goes to `pilot_responses`, never to `responses`,
 * so no estimate, stop rule, calibration of the study or export of bank answers sees it.
 */
import { randomUUID } from 'node:crypto';
import { AppError } from '../../errors.js';
import { updateAttempt } from '../../storage/attempt-repository.js';
import { type DbHandle, nowIso } from '../../storage/db-handle.js';
import { findPilotById, type PilotRecord } from '../../storage/pilot-repository.js';
import { findPilotResponse, insertPilotResponse } from '../../storage/pilot-response-repository.js';
import { type Answer, canonicalAnswer } from '../answer.js';
import { answerDoesNotFit, assertRetryOfStoredAnswer, stepNotCurrent } from '../answer-refusals.js';
import { type AttemptContext, currentState } from '../attempt-service.js';
import type { AttemptState } from '../attempt-state.js';
import type { DeliveryBank } from '../delivery-bank.js';
import { duePilot, pilotsAnswered } from './pilot-slots.js';

/** True when `itemId` names a pilot of this attempt (so the answer is a pilot answer). */
export function isPilotOfAttempt(context: Pick<AttemptContext, 'form'>, itemId: string): boolean {
  return context.form.pilots?.some((p) => p.pilotId === itemId) ?? false;
}

/** The field and problem when an answer does not fit a pilot (single choice), else undefined. */
export function checkPilotAnswer(
  pilot: Pick<PilotRecord, 'options'>,
  answer: Answer,
): { field: string; problem: string } | undefined {
  if (answer.kind === 'dont-know') return undefined;
  if (answer.kind !== 'choice')
    return { field: 'body.answer.kind', problem: 'this question needs a choice answer' };
  const ids = new Set(pilot.options.map((o) => o.id));
  const unknown = answer.optionIds.find((id) => !ids.has(id));
  if (unknown !== undefined)
    return { field: 'body.answer.optionIds', problem: `"${unknown}" is not one of this question's options` };
  if (answer.optionIds.length !== 1)
    return { field: 'body.answer.optionIds', problem: 'choose exactly one option' };
  return undefined;
}

/** 1 when the keyed option alone was chosen, 0 otherwise ("I don't know" is 0). */
export function scorePilotAnswer(pilot: Pick<PilotRecord, 'key'>, answer: Answer): 0 | 1 {
  return answer.kind === 'choice' && answer.optionIds.length === 1 && answer.optionIds[0] === pilot.key
    ? 1
    : 0;
}

/**
 * Stores one pilot answer (call inside the transaction that locked the attempt). Same checks and
 * idempotency as a bank answer: the answer fits (400); an answer already stored returns the first
 * result when it is the same (200 `already-stored`) and 409 ANSWER_ALREADY_STORED when it differs;
 * the attempt takes answers (409 ATTEMPT_FINISHED, STEP_NOT_CURRENT); the pilot is the screen now
 * shown (409 ITEM_NOT_CURRENT).
 */
export async function submitPilotResponse(
  db: DbHandle,
  bank: DeliveryBank,
  context: AttemptContext,
  submitted: { itemId: string; answer: Answer },
): Promise<{ status: 'stored' | 'already-stored'; state: AttemptState }> {
  const { attempt, form } = context;
  const entry = form.pilots?.find((p) => p.pilotId === submitted.itemId);
  const pilot = entry === undefined ? undefined : await findPilotById(db, entry.pilotId);
  if (entry === undefined || pilot === undefined) {
    throw new AppError('ITEM_NOT_IN_ATTEMPT', 'That question is not part of this attempt.', {
      field: 'body.itemId',
    });
  }
  const problem = checkPilotAnswer(pilot, submitted.answer);
  if (problem) throw answerDoesNotFit(problem);
  const existing = await findPilotResponse(db, attempt.id, pilot.id);
  if (existing) {
    assertRetryOfStoredAnswer(existing, submitted.answer, submitted.itemId);
    return { status: 'already-stored', state: await currentState(db, bank, context) };
  }

  const before = await currentState(db, bank, context);
  if (before.step === 'finished' || attempt.status !== 'started') {
    throw new AppError('ATTEMPT_FINISHED', 'This attempt is finished; no more answers can be saved.');
  }
  if (before.step !== 'item') throw stepNotCurrent(before.step);
  const bankAnswered = before.progress.answered - pilotsAnswered(form);
  if (duePilot(form, bankAnswered)?.pilotId !== pilot.id) {
    throw new AppError('ITEM_NOT_CURRENT', 'That question has not been shown yet. Answer the current one.', {
      field: 'body.itemId',
    });
  }

  const now = nowIso();
  const answer = canonicalAnswer(submitted.answer);
  await insertPilotResponse(db, {
    id: randomUUID(),
    attemptId: attempt.id,
    pilotId: pilot.id,
    position: before.progress.answered,
    answerKind: answer.kind === 'dont-know' ? 'dont-know' : 'answer',
    answer: answer.kind === 'dont-know' ? null : answer,
    score: scorePilotAnswer(pilot, answer),
    serverMs: entry.presentedAt ? Math.max(0, Date.parse(now) - Date.parse(entry.presentedAt)) : null,
    receivedAt: now,
  });
  entry.answered = true;
  await updateAttempt(db, attempt.id, { form, lastSeenAt: now });
  return { status: 'stored', state: await currentState(db, bank, context) };
}
