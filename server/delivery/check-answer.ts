import type { Item } from '../bank/item-schema.js';
import type { Answer } from './answer.js';
import type { DeliverableItem } from './delivery-bank.js';

/** Which answer kind each item response kind takes ("I don't know" fits every item). */
export const answerKindFor = {
  'single-choice': 'choice',
  'multiple-choice': 'choice',
  numeric: 'number',
  'short-text': 'text',
} as const satisfies Record<Item['response']['kind'], Answer['kind']>;

/**
 * Checks an answer against the item it answers. Returns the field and a plain problem, or undefined
 * when the answer fits: the right kind, only the item's options (exactly one for single choice),
 * a number inside the item's min and max, text no longer than its maxLength.
 *
 * @example checkAnswer(item, { kind: 'number', value: 5 }) // { field: 'body.answer.kind', problem: 'this question needs a choice answer' }
 */
export function checkAnswer(
  item: DeliverableItem,
  answer: Answer,
): { field: string; problem: string } | undefined {
  if (answer.kind === 'dont-know') return undefined;
  const response = item.response;
  const wanted = answerKindFor[response.kind];
  if (answer.kind !== wanted)
    return { field: 'body.answer.kind', problem: `this question needs a ${wanted} answer` };
  switch (response.kind) {
    case 'single-choice':
    case 'multiple-choice': {
      if (answer.kind !== 'choice') return undefined;
      const ids = new Set(response.options.map((o) => o.id));
      const unknown = answer.optionIds.find((id) => !ids.has(id));
      if (unknown !== undefined)
        return {
          field: 'body.answer.optionIds',
          problem: `"${unknown}" is not one of this question's options`,
        };
      if (new Set(answer.optionIds).size !== answer.optionIds.length)
        return { field: 'body.answer.optionIds', problem: 'an option is chosen twice' };
      if (response.kind === 'single-choice' && answer.optionIds.length !== 1)
        return { field: 'body.answer.optionIds', problem: 'choose exactly one option' };
      return undefined;
    }
    case 'numeric': {
      if (answer.kind !== 'number') return undefined;
      if (response.min !== undefined && answer.value < response.min)
        return { field: 'body.answer.value', problem: `must be at least ${response.min}` };
      if (response.max !== undefined && answer.value > response.max)
        return { field: 'body.answer.value', problem: `must be at most ${response.max}` };
      return undefined;
    }
    case 'short-text': {
      if (answer.kind !== 'text') return undefined;
      if (answer.text.trim().length === 0) return { field: 'body.answer.text', problem: 'must not be empty' };
      if (answer.text.length > response.maxLength)
        return { field: 'body.answer.text', problem: `must be at most ${response.maxLength} characters` };
      return undefined;
    }
  }
}
