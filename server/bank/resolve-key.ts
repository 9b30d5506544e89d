import type { Item } from './item-schema.js';
import { evaluateKeyQuery, KeyQueryError, sameCategory } from './key-query.js';
import type { KeyAnswer } from './key-query-schema.js';

/** The key of an item as scoring uses it: keyed option ids, or the keyed number. */
export interface ResolvedKey {
  /** What the key query answered (null for explicit and rubric keys). */
  readonly answer: KeyAnswer | null;
  /** Keyed option ids (choice items), in option order. */
  readonly optionIds: readonly string[];
  /** Keyed number (numeric items). */
  readonly value: number | null;
}

export type ResolveKeyResult =
  | { readonly ok: true; readonly key: ResolvedKey }
  | { readonly ok: false; readonly field: string; readonly message: string };

/**
 * Resolves an item's key: evaluates a key query over the chart's rows and selects the option(s)
 * whose `value` equals the answer, or passes an explicit key through. A query whose answer
 * matches no option, or (single choice) more than one, does not resolve.
 *
 * @param item - a parsed item
 * @returns the resolved key, or the field and the reason it cannot be resolved
 */
export function resolveKey(item: Item): ResolveKeyResult {
  const { key, response } = item;
  if (key.by === 'rubric') return ok(null, [], null);
  if (key.by === 'number') return ok(null, [], key.value);
  if (key.by === 'options') {
    if (response.kind !== 'single-choice' && response.kind !== 'multiple-choice') {
      return fail('key.by', 'key "options" is only for choice items');
    }
    const keyed = new Set(key.options);
    return ok(
      null,
      response.options.filter((o) => keyed.has(o.id)).map((o) => o.id),
      null,
    );
  }
  let answer: KeyAnswer;
  try {
    answer = evaluateKeyQuery(key.query, item.chart);
  } catch (error) {
    if (error instanceof KeyQueryError) return fail('key.query', `cannot be computed: ${error.message}`);
    throw error;
  }
  const shown = JSON.stringify(answer);
  if (response.kind === 'numeric') {
    if (typeof answer !== 'number')
      return fail('key.query', `answers ${shown}, a numeric item needs a number`);
    return ok(answer, [], answer);
  }
  if (response.kind === 'short-text') return fail('key.by', 'a short-text item is keyed by its rubric');
  const wanted: readonly (string | number)[] = Array.isArray(answer) ? answer : [answer as string | number];
  const keyed = response.options.filter(
    (o) => o.value !== undefined && wanted.some((w) => sameCategory(o.value, w)),
  );
  if (keyed.length === 0) return fail('key.query', `answers ${shown}, which matches no option value`);
  if (response.kind === 'single-choice') {
    if (Array.isArray(answer))
      return fail('key.query', `answers a list ${shown}, a single-choice item needs one value`);
    if (keyed.length > 1) {
      return fail(
        'key.query',
        `answers ${shown}, which matches ${keyed.length} options (${keyed.map((o) => o.id).join(', ')})`,
      );
    }
  }
  return ok(
    answer,
    keyed.map((o) => o.id),
    null,
  );
}

function ok(answer: KeyAnswer | null, optionIds: readonly string[], value: number | null): ResolveKeyResult {
  return { ok: true, key: { answer, optionIds, value } };
}

function fail(field: string, message: string): ResolveKeyResult {
  return { ok: false, field, message };
}
