import { z } from 'zod';

/** Longest text answer the API accepts at all; each item sets its own (smaller) maxLength. */
export const maxTextAnswerLength = 2000;

/** An answer as the respondent page sends it. */
export const answerSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('choice'), optionIds: z.array(z.string().min(1).max(60)).min(1).max(10) }),
  z.strictObject({ kind: z.literal('number'), value: z.number().finite() }),
  z.strictObject({ kind: z.literal('text'), text: z.string().max(maxTextAnswerLength) }),
  z.strictObject({ kind: z.literal('dont-know') }),
]);
export type Answer = z.infer<typeof answerSchema>;

/**
 * The canonical form of an answer, used to store it and to tell a retry from a changed answer:
 * option ids sorted and de-duplicated, text exactly as sent.
 */
export function canonicalAnswer(answer: Answer): Answer {
  if (answer.kind === 'choice') return { kind: 'choice', optionIds: [...new Set(answer.optionIds)].sort() };
  return answer;
}

/** True when two answers are the same answer (after canonicalising both). */
export function sameAnswer(a: Answer, b: Answer): boolean {
  return JSON.stringify(canonicalAnswer(a)) === JSON.stringify(canonicalAnswer(b));
}
