import { formatNumber } from '../../charts/chart-data.js';
import type { Item } from '../item-schema.js';
import { resolveKey } from '../resolve-key.js';
import { type BankProblem, eachItem, error, type LintRule } from './lint-types.js';

/** Shortest alt text accepted: enough for the chart type, the variables and the scale (common practice, no source). */
export const MIN_ALT_LENGTH = 40;

const escapeRegExp = (text: string): string => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** Does `text` contain `token` as a whole word or number (not inside a longer one)? */
export function containsToken(text: string, token: string): boolean {
  if (token.trim() === '') return false;
  return new RegExp(
    `(^|[^\\p{L}\\p{N}.,])${escapeRegExp(token)}($|[^\\p{L}\\p{N}.,]|[.,](?!\\p{N}))`,
    'iu',
  ).test(text);
}

/** Spellings of an answer a reader might find in the alt text. */
function spellings(value: string | number): string[] {
  if (typeof value === 'number') return [...new Set([String(value), formatNumber(value)])];
  return [value];
}

/**
 * Alt text is present, long enough, and does not give the answer away: a numeric answer never
 * appears in it; a category answer (or the keyed option's text) appears only when every other
 * option appears too, so the alt text does not single out the key.
 */
export const altText: LintRule = {
  name: 'alt-text',
  check: (context) => eachItem(context, (item, file) => checkAlt(item, file)),
};

function checkAlt(item: Item, file: string): BankProblem[] {
  const alt = item.alt.trim();
  if (alt.length < MIN_ALT_LENGTH) {
    return [
      error(
        file,
        'alt',
        `alt text is ${alt.length} characters, needs at least ${MIN_ALT_LENGTH} to describe the chart`,
      ),
    ];
  }
  const resolved = resolveKey(item);
  if (!resolved.ok) return [];
  const { answer, optionIds, value } = resolved.key;
  const numeric = typeof answer === 'number' ? answer : value;
  if (numeric !== null && spellings(numeric).some((s) => containsToken(alt, s))) {
    return [error(file, 'alt', `alt text contains the key's answer ${formatNumber(numeric)}`)];
  }
  const response = item.response;
  if (response.kind !== 'single-choice' && response.kind !== 'multiple-choice') return [];
  const mentioned = (option: (typeof response.options)[number]): boolean =>
    containsToken(alt, option.text) ||
    (option.value !== undefined && typeof option.value === 'string' && containsToken(alt, option.value));
  const keyed = response.options.filter((o) => optionIds.includes(o.id));
  const others = response.options.filter((o) => !optionIds.includes(o.id));
  const giveaway = keyed.find((o) => mentioned(o) && !others.every(mentioned));
  return giveaway === undefined
    ? []
    : [error(file, 'alt', `alt text names the key "${giveaway.text}" but not every other option`)];
}
