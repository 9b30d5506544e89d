import { altText } from './lint/alt-text.js';
import { colourVision } from './lint/colour-vision.js';
import { contrast } from './lint/contrast.js';
import { distractorDuplicates } from './lint/distractor-duplicates.js';
import { distractorRange } from './lint/distractor-range.js';
import { duplicateIds } from './lint/duplicate-ids.js';
import { encodingFields } from './lint/encoding-fields.js';
import { fieldKinds } from './lint/field-kinds.js';
import { itemLocation } from './lint/item-location.js';
import { keyBalance } from './lint/key-balance.js';
import { labelOverlap } from './lint/label-overlap.js';
import type { BankProblem, LintContext, LintRule } from './lint/lint-types.js';
import { readKey } from './lint/read-key.js';
import { schemaErrors } from './lint/schema-errors.js';
import { unknownScenario } from './lint/unknown-scenario.js';

/** Rules the server also enforces at start: a bank that breaks one of these is never served. */
export const structuralRules: readonly LintRule[] = [
  schemaErrors,
  itemLocation,
  duplicateIds,
  unknownScenario,
  encodingFields,
  readKey,
];

/** Every rule `bank:check` runs. */
export const allRules: readonly LintRule[] = [
  ...structuralRules,
  fieldKinds,
  distractorDuplicates,
  distractorRange,
  contrast,
  colourVision,
  altText,
  labelOverlap,
  keyBalance,
];

/**
 * Runs lint rules over a bank and returns every problem, sorted by file, field and message
 * (errors and warnings together; `severity` tells them apart).
 *
 * @param context - the bank's files, scenarios, maps and theme
 * @param rules - the rules to run; default {@link allRules}
 */
export function lintBank(context: LintContext, rules: readonly LintRule[] = allRules): BankProblem[] {
  return rules.flatMap((rule) => rule.check(context)).sort(compareProblems);
}

export function compareProblems(a: BankProblem, b: BankProblem): number {
  return a.file.localeCompare(b.file) || a.field.localeCompare(b.field) || a.message.localeCompare(b.message);
}

/** `file: field: message` (with `warning: ` before the message for warnings). */
export function formatProblem(problem: BankProblem): string {
  const prefix = problem.severity === 'warning' ? 'warning: ' : '';
  return `${problem.file}: ${problem.field}: ${prefix}${problem.message}`;
}
