import type { ResolvedKey } from '../bank/resolve-key.js';
import type { Answer } from './answer.js';
import type { DeliverableItem } from './delivery-bank.js';

/**
 * Scores a checked answer from the item's resolved key: 1 or 0, or null when people score it later.
 * - choice: 1 when exactly the keyed options are chosen (no more, no fewer);
 * - number: 1 when |answer − key| ≤ the item's tolerance;
 * - text: null until scored against the rubric;
 * - "I don't know": 0 (stored as its own answer kind).
 *
 * @example scoreAnswer(item, { answer: null, optionIds: ['b'], value: null }, { kind: 'choice', optionIds: ['b'] }) // 1
 */
export function scoreAnswer(item: DeliverableItem, key: ResolvedKey, answer: Answer): 0 | 1 | null {
  switch (answer.kind) {
    case 'dont-know':
      return 0;
    case 'text':
      return null;
    case 'choice': {
      const chosen = new Set(answer.optionIds);
      const keyed = new Set(key.optionIds);
      if (keyed.size === 0) throw new Error(`scoreAnswer: item ${item.id} has no keyed options`);
      return chosen.size === keyed.size && [...chosen].every((id) => keyed.has(id)) ? 1 : 0;
    }
    case 'number': {
      if (item.response.kind !== 'numeric' || key.value === null)
        throw new Error(`scoreAnswer: item ${item.id} has no numeric key`);
      // A small allowance for binary rounding (0.1 + 0.2 within 0.3 of 0.6 must count).
      return Math.abs(answer.value - key.value) <= item.response.tolerance + 1e-9 ? 1 : 0;
    }
  }
}
