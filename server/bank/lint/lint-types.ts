import type { StoredMap } from '../../charts/chart-spec.js';
import type { LabelBox } from '../../charts/label-box.js';
import type { Theme } from '../../charts/theme.js';
import type { Item, Scenario } from '../item-schema.js';

/** One finding: `file: field: message`. Errors fail `bank:check`; warnings are printed only. */
export interface BankProblem {
  readonly file: string;
  /** Dotted path inside the item (`chart.data.3.visitors`), or `-` for the whole file. */
  readonly field: string;
  readonly message: string;
  readonly severity: 'error' | 'warning';
}

/** One item file: its raw JSON (or the reason it is not JSON) and, when the schema accepts it, the item. */
export interface ItemEntry {
  /** Path relative to the bank root's parent, e.g. `items/isle/isle-ferry-busiest-day.json`. */
  readonly file: string;
  readonly raw: unknown;
  readonly jsonError?: string;
  /** The parsed item; absent when the file is not JSON or fails the schema. */
  readonly item?: Item;
}

/** Everything a rule may look at. */
export interface LintContext {
  readonly entries: readonly ItemEntry[];
  readonly scenarios: readonly Scenario[];
  readonly maps: ReadonlyMap<string, StoredMap>;
  /** The theme charts are drawn with (colours checked for contrast). */
  readonly theme: Theme;
  /** Label boxes of one chart as the renderer places them; the overlap rule is skipped without it. */
  readonly labelBoxes?: (item: Item) => readonly LabelBox[];
}

/** A lint rule: a name (kebab-case, like its file) and a pure check over the whole bank. */
export interface LintRule {
  readonly name: string;
  readonly check: (context: LintContext) => BankProblem[];
}

/** Calls `check` for every entry whose item parsed, collecting its problems. */
export function eachItem(
  context: LintContext,
  check: (item: Item, file: string) => BankProblem[],
): BankProblem[] {
  return context.entries.flatMap((entry) => (entry.item === undefined ? [] : check(entry.item, entry.file)));
}

export function error(file: string, field: string, message: string): BankProblem {
  return { file, field, message, severity: 'error' };
}

export function warning(file: string, field: string, message: string): BankProblem {
  return { file, field, message, severity: 'warning' };
}
