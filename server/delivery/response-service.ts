import { randomUUID } from 'node:crypto';
import { AppError } from '../errors.js';
import { updateAttempt } from '../storage/attempt-repository.js';
import { type DbHandle, nowIso } from '../storage/db-handle.js';
import { findResponse, insertResponse } from '../storage/response-repository.js';
import { tallyAttemptResponses } from '../storage/response-tally-repository.js';
import { advanceAdaptiveForm, loadAdaptiveDelivery } from './adaptive-delivery.js';
import { type Answer, canonicalAnswer } from './answer.js';
import { answerDoesNotFit, assertRetryOfStoredAnswer, stepNotCurrent } from './answer-refusals.js';
import type { AttemptContext } from './attempt-service.js';
import { settledState } from './attempt-service.js';
import type { AttemptState } from './attempt-state.js';
import { attemptStep } from './attempt-state.js';
import { checkAnswer } from './check-answer.js';
import type { DeliveryBank } from './delivery-bank.js';
import { isPilotOfAttempt, submitPilotResponse } from './pilots/pilot-answer-service.js';
import { duePilot, pilotsAnswered } from './pilots/pilot-slots.js';
import { scoreAnswer } from './score-answer.js';

export interface SubmittedResponse {
  itemId: string;
  answer: Answer;
  clientMs?: number | undefined;
}

/**
 * `POST /api/attempt/responses`: stores one answer, scored on the server from the bank's key, with
 * the server's time since the item was shown beside the client's own. Call inside a transaction:
 * the answer is committed before the caller replies.
 *
 * Checks, in order: the item is in the attempt (409 ITEM_NOT_IN_ATTEMPT); the answer fits the item
 * (400 VALIDATION_FAILED); an answer already stored for the item is the same one (200,
 * `already-stored`, the first result) or not (409 ANSWER_ALREADY_STORED); the attempt still takes
 * answers (409 ATTEMPT_FINISHED); the item is the one now shown (409 STEP_NOT_CURRENT,
 * ITEM_NOT_CURRENT).
 */
export async function submitResponse(
  db: DbHandle,
  bank: DeliveryBank,
  context: AttemptContext,
  submitted: SubmittedResponse,
): Promise<{ status: 'stored' | 'already-stored'; state: AttemptState }> {
  const { attempt, form, settings } = context;
  // A pilot chart's answer is stored apart and never reaches the estimate (pilots/pilot-answer-service.ts).
  if (isPilotOfAttempt(context, submitted.itemId)) return submitPilotResponse(db, bank, context, submitted);
  const position = form.items.findIndex((entry) => entry.itemId === submitted.itemId);
  if (position < 0) {
    throw new AppError('ITEM_NOT_IN_ATTEMPT', 'That question is not part of this attempt.', {
      field: 'body.itemId',
    });
  }
  const entry = bank.get(submitted.itemId);
  if (!entry) {
    throw new AppError('ITEM_NOT_IN_ATTEMPT', 'That question is no longer available.', {
      field: 'body.itemId',
    });
  }
  const problem = checkAnswer(entry.item, submitted.answer);
  if (problem) throw answerDoesNotFit(problem);

  // One statement: the attempt's counts and whether this item already has an answer (a retry).
  const { itemAnswered, ...counts } = await tallyAttemptResponses(db, attempt.id, submitted.itemId);
  const existing = itemAnswered ? await findResponse(db, attempt.id, submitted.itemId) : undefined;
  if (existing) {
    assertRetryOfStoredAnswer(existing, submitted.answer, submitted.itemId);
    return { status: 'already-stored', state: await settledState(db, bank, context, counts) };
  }

  // Let a passed time limit finish the attempt before deciding whether it takes answers.
  const before = await settledState(db, bank, context, counts);
  if (before.step === 'finished' || attempt.status !== 'started') {
    throw new AppError('ATTEMPT_FINISHED', 'This attempt is finished; no more answers can be saved.');
  }
  // The tally just counted the stored responses (in this transaction); no second count. The
  // state's progress includes answered pilots, which the bank positions do not.
  const answered = before.progress.answered - pilotsAnswered(form);
  const step = attemptStep(attempt, form, settings, answered);
  if (step !== 'item') throw stepNotCurrent(step);
  if (position !== answered || duePilot(form, answered) !== undefined) {
    throw new AppError('ITEM_NOT_CURRENT', 'That question has not been shown yet. Answer the current one.', {
      field: 'body.itemId',
    });
  }

  const now = nowIso();
  const presentedAt = form.presentedAt[position];
  const answer = canonicalAnswer(submitted.answer);
  const score = scoreAnswer(entry.item, entry.key, answer);
  await insertResponse(db, {
    id: randomUUID(),
    attemptId: attempt.id,
    itemId: submitted.itemId,
    itemVersion: form.items[position]!.version,
    position,
    answerKind: answer.kind === 'dont-know' ? 'dont-know' : 'answer',
    answer: answer.kind === 'dont-know' ? null : answer,
    score,
    serverMs: presentedAt ? Math.max(0, Date.parse(now) - Date.parse(presentedAt)) : null,
    clientMs: submitted.clientMs === undefined ? null : Math.round(submitted.clientMs),
    receivedAt: now,
  });
  if (form.adaptive !== undefined) {
    // Adaptive: update the estimate and append the next item (or record the stop) in this transaction.
    const delivery = await loadAdaptiveDelivery(
      db,
      bank,
      context.study.id,
      settings,
      form.adaptive.calibrationId,
    );
    const first = form.presentedAt[0];
    const elapsedSeconds = first ? Math.max(0, Date.parse(now) - Date.parse(first)) / 1000 : 0;
    advanceAdaptiveForm(delivery, form, score, elapsedSeconds);
    await updateAttempt(db, attempt.id, { form, lastSeenAt: now });
  }
  // The counts after this insert are known: no second count. Settling the next screen writes the
  // attempt row anyway; `touch` writes last_seen_at only when it did not.
  const after = { answered: counts.answered + 1, correct: counts.correct + (score === 1 ? 1 : 0) };
  const state = await settledState(db, bank, context, after, { touch: form.adaptive === undefined });
  return { status: 'stored', state };
}
