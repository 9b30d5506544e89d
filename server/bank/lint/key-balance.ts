import { resolveKey } from '../resolve-key.js';
import { type BankProblem, type LintRule, warning } from './lint-types.js';

/** Fewest single-choice items before key positions are judged. */
export const KEY_BALANCE_MIN_ITEMS = 12;
/** A position is flagged when it holds more than this multiple of its expected share of keys. */
export const KEY_BALANCE_FACTOR = 1.5;

/**
 * Bank-level warning: the key's position among single-choice options is balanced across the bank,
 * so "always pick the second" earns nothing (item-writing guide). A position's expected share is
 * the sum over items of 1 / (number of options) where that position exists.
 */
export const keyBalance: LintRule = {
  name: 'key-balance',
  check: (context) => {
    const observed = [0, 0, 0, 0, 0];
    const expected = [0, 0, 0, 0, 0];
    let items = 0;
    for (const entry of context.entries) {
      const item = entry.item;
      if (item === undefined || item.status === 'retired' || item.response.kind !== 'single-choice') continue;
      const resolved = resolveKey(item);
      if (!resolved.ok) continue;
      const options = item.response.options;
      const position = options.findIndex((o) => o.id === resolved.key.optionIds[0]);
      if (position < 0) continue;
      items += 1;
      observed[position]! += 1;
      for (let p = 0; p < options.length; p += 1) expected[p]! += 1 / options.length;
    }
    if (items < KEY_BALANCE_MIN_ITEMS) return [];
    const problems: BankProblem[] = [];
    observed.forEach((count, position) => {
      const share = expected[position]!;
      if (share > 0 && count > KEY_BALANCE_FACTOR * share) {
        const letter = String.fromCharCode(65 + position);
        problems.push(
          warning(
            'items',
            'key',
            `key position ${letter} holds ${count} of ${items} single-choice keys, expected about ${share.toFixed(1)}; move some keys`,
          ),
        );
      }
    });
    return problems;
  },
};
