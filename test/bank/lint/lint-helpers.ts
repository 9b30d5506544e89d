import { type ItemInput, itemSchema } from '../../../server/bank/item-schema.js';
import type { BankProblem, ItemEntry, LintContext, LintRule } from '../../../server/bank/lint/lint-types.js';
import type { StoredMap } from '../../../server/charts/chart-spec.js';
import { defaultTheme } from '../../../server/charts/theme.js';
import { validItem } from '../valid-item.js';

export const scenarios = [{ id: 'isle', name: 'An island', summary: 'An invented island.' }];

/** A file entry as the reader makes it: raw JSON, plus the parsed item when the schema accepts it. */
export function entryOf(raw: unknown, file?: string): ItemEntry {
  const record = raw as { id?: string; scenario?: string };
  const path = file ?? `items/${record.scenario}/${record.id}.json`;
  const parsed = itemSchema.safeParse(raw);
  return parsed.success ? { file: path, raw, item: parsed.data } : { file: path, raw };
}

export function contextOf(raws: readonly unknown[], extra: Partial<LintContext> = {}): LintContext {
  return {
    entries: raws.map((raw) => entryOf(raw)),
    scenarios,
    maps: new Map<string, StoredMap>(),
    theme: defaultTheme,
    ...extra,
  };
}

/** Runs one rule over one item (or several) and returns its problems. */
export function runRule(
  rule: LintRule,
  raws: readonly unknown[],
  extra: Partial<LintContext> = {},
): BankProblem[] {
  return rule.check(contextOf(raws, extra));
}

/** A copy of the valid base item, changed by `edit`. */
export function broken(edit: (item: ItemInput & Record<string, unknown>) => void): ItemInput {
  const item = structuredClone(validItem()) as ItemInput & Record<string, unknown>;
  edit(item);
  return item;
}

/** Narrows the base item's chart to a bar chart for edits. */
export function barChart(item: ItemInput): Extract<ItemInput['chart'], { type: 'bar' }> {
  if (item.chart.type !== 'bar') throw new Error('the base item is a bar chart');
  return item.chart;
}

export function singleChoice(item: ItemInput): Extract<ItemInput['response'], { kind: 'single-choice' }> {
  if (item.response.kind !== 'single-choice') throw new Error('the base item is single choice');
  return item.response;
}
