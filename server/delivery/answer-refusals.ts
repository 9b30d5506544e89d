/**
 * Why a submitted answer is refused, shared by bank answers (response-service.ts) and pilot answers
 * (pilots/pilot-answer-service.ts) so both say the same thing with the same error code.
 */
import { AppError } from '../errors.js';
import { type Answer, sameAnswer } from './answer.js';

/** 400 VALIDATION_FAILED for an answer that does not fit its question (`problem` names the field). */
export function answerDoesNotFit(problem: { field: string; problem: string }): AppError {
  return new AppError('VALIDATION_FAILED', `${problem.field}: ${problem.problem}`, { problems: [problem] });
}

/**
 * An answer posted again for a question already answered: the same answer is a retry and passes (the
 * caller returns the first result); a different one throws 409 ANSWER_ALREADY_STORED, the first stands.
 */
export function assertRetryOfStoredAnswer(
  existing: { answerKind: string; answer: unknown },
  submitted: Answer,
  itemId: string,
): void {
  const stored: Answer =
    existing.answerKind === 'dont-know' ? { kind: 'dont-know' } : (existing.answer as Answer);
  if (!sameAnswer(stored, submitted)) {
    throw new AppError(
      'ANSWER_ALREADY_STORED',
      'A different answer to this question was already saved. The first answer stands.',
      { itemId },
    );
  }
}

/** 409 STEP_NOT_CURRENT for an answer posted while the attempt still waits for consent or background. */
export function stepNotCurrent(step: string): AppError {
  return new AppError(
    'STEP_NOT_CURRENT',
    step === 'consent' ? 'Agree to take part first.' : 'Answer the background questions first.',
    { step },
  );
}
