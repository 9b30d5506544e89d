/**
 * Turns drafts into item files: fills in the fixed fields, balances the key's position among
 * shuffle-able options, parses each item with the bank schema and checks that the bank's own key
 * resolution picks the option the author meant.
 */
import { type ItemInput, itemSchema } from '../../server/bank/item-schema.js';
import { resolveKey } from '../../server/bank/resolve-key.js';
import type { Draft, DraftOption, RubricKey } from './draft.js';

/** Id of the option that is the key (by the expected answer for read items). */
export function keyOptionId(draft: Draft): string {
  if ('rubric' in draft.key) throw new Error(`${draft.id}: a short-text item has no keyed option`);
  if ('option' in draft.key) {
    const id = draft.key.option;
    if (!draft.options.some((o) => o.id === id))
      throw new Error(`${draft.id}: key option ${id} is not an option`);
    return id;
  }
  const expected = draft.key.expect;
  const matches = draft.options.filter((o) => o.value === expected);
  if (matches.length !== 1) {
    throw new Error(`${draft.id}: ${matches.length} options carry the expected answer ${String(expected)}`);
  }
  return matches[0]!.id;
}

/** Moves the key to `position` keeping the distractors' order (rotation). */
function placeKey(options: readonly DraftOption[], keyId: string, position: number): DraftOption[] {
  const from = options.findIndex((o) => o.id === keyId);
  const n = options.length;
  const shift = (((position - from) % n) + n) % n;
  return options.map((_, i) => options[(i - shift + n) % n]!);
}

/** A short-text item: free text scored by people with a three-level rubric (no options, no key balancing). */
function buildShortTextItem(draft: Draft, key: RubricKey): ItemInput {
  if (draft.options.length > 0) throw new Error(`${draft.id}: a short-text item takes no options`);
  const item: ItemInput = {
    id: draft.id,
    scenario: draft.scenario,
    status: 'active',
    level: draft.level,
    chart: draft.chart,
    prompt: draft.prompt,
    response: {
      kind: 'short-text',
      maxLength: key.maxLength,
      rubric: key.rubric.map((description, score) => ({ score: score as 0 | 1 | 2, description })),
    },
    key: { by: 'rubric' },
    alt: draft.alt,
    rationale: draft.rationale,
    features: {
      distractorKinds: [...draft.distractors],
      ...(draft.multiStep === undefined ? {} : { multiStep: draft.multiStep }),
    },
  };
  const parsed = itemSchema.safeParse(item);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
    throw new Error(`${draft.id}: ${problems}`);
  }
  return item;
}

export function buildItems(drafts: readonly Draft[]): ItemInput[] {
  const turn = new Map<number, number>();
  return drafts.map((draft) => {
    if ('rubric' in draft.key) return buildShortTextItem(draft, draft.key);
    const keyId = keyOptionId(draft);
    const order = draft.order ?? 'any';
    let options = [...draft.options];
    if (order === 'any') {
      const n = options.length;
      const position = turn.get(n) ?? 0;
      turn.set(n, (position + 1) % n);
      options = placeKey(options, keyId, position);
    }
    const item: ItemInput = {
      id: draft.id,
      scenario: draft.scenario,
      status: 'active',
      level: draft.level,
      chart: draft.chart,
      prompt: draft.prompt,
      response: {
        kind: 'single-choice',
        options: options.map((o) => (o.value === undefined ? { id: o.id, text: o.text } : { ...o })),
        optionOrder: order,
      },
      key:
        'option' in draft.key
          ? { by: 'options', options: [draft.key.option] }
          : { by: 'query', query: draft.key.query },
      alt: draft.alt,
      rationale: draft.rationale,
      features: {
        distractorKinds: [...draft.distractors],
        ...(draft.multiStep === undefined ? {} : { multiStep: draft.multiStep }),
        ...(draft.precision === undefined ? {} : { precision: draft.precision }),
      },
    };
    const parsed = itemSchema.safeParse(item);
    if (!parsed.success) {
      const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
      throw new Error(`${draft.id}: ${problems}`);
    }
    // The bank's own key resolution must pick the option the author meant.
    const resolved = resolveKey(parsed.data);
    if (!resolved.ok) throw new Error(`${draft.id}: ${resolved.field}: ${resolved.message}`);
    if (resolved.key.optionIds.join() !== keyId) {
      throw new Error(
        `${draft.id}: key resolves to ${resolved.key.optionIds.join()} but the author meant ${keyId}`,
      );
    }
    return item;
  });
}
