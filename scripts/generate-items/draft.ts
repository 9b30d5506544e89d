/**
 * The shape item modules write (a draft), and small helpers for options. `build-item.ts` turns a
 * draft into an item file; the writer (`index.ts`) balances key positions and checks every key.
 */

import type { DistractorKind, ItemInput, TaskLevel } from '../../server/bank/item-schema.js';
import type { KeyQuery } from '../../server/bank/key-query-schema.js';

export type ChartInput = ItemInput['chart'];

export type ScenarioId = 'isle' | 'town' | 'science-centre' | 'bike-shop' | 'garden';

export interface DraftOption {
  readonly id: string;
  readonly text: string;
  readonly value?: string | number;
}

/** Read items: the key is a query; `expect` is the answer the author expects (checked by code). */
export interface QueryKey {
  readonly query: KeyQuery;
  readonly expect: string | number;
}

/** Interpret and envision items: the keyed option's id. */
export interface OptionKey {
  readonly option: string;
}

/**
 * Short-text items, scored later by people: what an answer scoring 0, 1 and 2 looks like, and the
 * longest answer accepted. The draft's `options` stay empty.
 */
export interface RubricKey {
  readonly rubric: readonly [string, string, string];
  readonly maxLength: number;
}

export interface Draft {
  readonly id: string;
  readonly scenario: ScenarioId;
  readonly level: TaskLevel;
  readonly chart: ChartInput;
  readonly prompt: string;
  readonly options: readonly DraftOption[];
  /** `fixed` for ordered numeric options; `any` (default) lets the writer move the key. */
  readonly order?: 'any' | 'fixed';
  readonly key: QueryKey | OptionKey | RubricKey;
  readonly alt: string;
  readonly rationale: string;
  readonly distractors: readonly DistractorKind[];
  readonly multiStep?: boolean;
  readonly precision?: boolean;
}

/** Option id for a number: `n350`, `n12-5`, `minus-3`. */
export function numberOptionId(value: number): string {
  const text = String(Math.abs(value)).replace('.', '-');
  return value < 0 ? `minus-${text}` : `n${text}`;
}

/** Ordered numeric options with a unit, ascending; each carries its value for the key query. */
export function numberOptions(values: readonly number[], unit: string): DraftOption[] {
  return [...values]
    .sort((a, b) => a - b)
    .map((value) => ({ id: numberOptionId(value), text: `${value.toLocaleString('en-GB')} ${unit}`, value }));
}

/** Option id for a category name: `old-market`. */
export function categoryOptionId(name: string): string {
  return name
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');
}

/** Category options; `value` is the category as it appears in the chart data. */
export function categoryOptions(
  names: readonly string[],
  text: (name: string) => string = (n) => n,
): DraftOption[] {
  return names.map((name) => ({ id: categoryOptionId(name), text: text(name), value: name }));
}

/** Statement options for interpret and envision items: [id, text] pairs. */
export function statements(pairs: ReadonlyArray<readonly [string, string]>): DraftOption[] {
  return pairs.map(([id, text]) => ({ id, text }));
}
