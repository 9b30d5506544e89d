import { randomUUID } from 'node:crypto';
import { AppError } from '../errors.js';
import { updateAttempt } from '../storage/attempt-repository.js';
import { type DbHandle, nowIso } from '../storage/db-handle.js';
import { findResponse, insertResponse } from '../storage/response-repository.js';
import { advanceAdaptiveForm, loadAdaptiveDelivery } from './adaptive-delivery.js';
import { type Answer, canonicalAnswer, sameAnswer } from './answer.js';
import type { AttemptContext } from './attempt-service.js';
import { currentState } from './attempt-service.js';
import type { AttemptState } from './attempt-state.js';
import { attemptStep } from './attempt-state.js';
import { checkAnswer } from './check-answer.js';
import type { DeliveryBank } from './delivery-bank.js';
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
  if (problem) {
    throw new AppError('VALIDATION_FAILED', `${problem.field}: ${problem.problem}`, { problems: [problem] });
  }

  const existing = await findResponse(db, attempt.id, submitted.itemId);
  if (existing) {
    const stored: Answer =
      existing.answerKind === 'dont-know' ? { kind: 'dont-know' } : (existing.answer as Answer);
    if (!sameAnswer(stored, submitted.answer)) {
      throw new AppError(
        'ANSWER_ALREADY_STORED',
        'A different answer to this question was already saved. The first answer stands.',
        { itemId: submitted.itemId },
      );
    }
    return { status: 'already-stored', state: await currentState(db, bank, context) };
  }

  // Let a passed time limit finish the attempt before deciding whether it takes answers.
  const before = await currentState(db, bank, context);
  if (before.step === 'finished' || attempt.status !== 'started') {
    throw new AppError('ATTEMPT_FINISHED', 'This attempt is finished; no more answers can be saved.');
  }
  // currentState just counted the stored responses (in this transaction); no second count.
  const answered = before.progress.answered;
  const step = attemptStep(attempt, form, settings, answered);
  if (step !== 'item') {
    throw new AppError(
      'STEP_NOT_CURRENT',
      step === 'consent' ? 'Agree to take part first.' : 'Answer the background questions first.',
      { step },
    );
  }
  if (position !== answered) {
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
  } else {
    await updateAttempt(db, attempt.id, { lastSeenAt: now });
  }
  return { status: 'stored', state: await currentState(db, bank, context) };
}
