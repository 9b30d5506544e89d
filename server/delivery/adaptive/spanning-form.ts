/**
 * A fixed form of a given length drawn from the bank as a team would draw one for a mixed
 * audience: content-balanced (each area gets its target share of the items, rounded by largest
 * remainder) and spanning each area's difficulty range (the items at evenly spaced quantiles of the
 * area's sorted difficulties). The same form serves every audience; it is the comparison the
 * simulation study leads with.
 *
 * This is the classical "peaked versus spread" choice for a conventional test: a form spread over
 * the range of the population measures everyone moderately well, where a form peaked at one ability
 * measures that ability best (Lord 1980, Applications of item response theory to practical
 * testing problems; from memory). The peaked form is `fixedFormOrder` in simulate-adaptive.ts.
 *
 * @see Weiss, D. J. (1982). Improving measurement quality and efficiency with adaptive testing.
 *   Applied Psychological Measurement 6(4), 473–492 (adaptive tests compared with conventional
 *   tests spanning the ability range).
 */
import type { AdaptiveBank } from './adaptive-bank.js';

/**
 * Items per area for a form of `length` items: target share × length, rounded by largest
 * remainder (ties to the earlier area), never more than the area has; what an area cannot take
 * goes to the others by the same rule.
 *
 * @example
 * // targets 0.4, 0.3, 0.3 and 10 items → 4, 3, 3
 */
export function areaQuotas(bank: AdaptiveBank, length: number): Int32Array {
  const areaTotal = bank.areas.length;
  const quota = new Int32Array(areaTotal);
  let left = Math.min(length, bank.ids.length);
  // Largest remainder, repeated while an area's quota exceeds its items (rare: tiny areas).
  for (let pass = 0; left > 0 && pass <= areaTotal; pass++) {
    let weight = 0;
    for (let a = 0; a < areaTotal; a++) {
      if (quota[a]! < bank.members[a]!.length && bank.targets[a]! > 0) weight += bank.targets[a]!;
    }
    if (!(weight > 0)) break;
    const share = new Float64Array(areaTotal);
    let given = 0;
    for (let a = 0; a < areaTotal; a++) {
      if (quota[a]! >= bank.members[a]!.length || !(bank.targets[a]! > 0)) continue;
      share[a] = (left * bank.targets[a]!) / weight;
      const whole = Math.min(Math.floor(share[a]!), bank.members[a]!.length - quota[a]!);
      quota[a]! += whole;
      given += whole;
      share[a]! -= whole;
    }
    let rest = left - given;
    const byRemainder = Array.from({ length: areaTotal }, (_, a) => a)
      .filter((a) => quota[a]! < bank.members[a]!.length && bank.targets[a]! > 0)
      .sort((x, y) => share[y]! - share[x]! || x - y);
    for (const a of byRemainder) {
      if (rest === 0) break;
      quota[a]!++;
      rest--;
    }
    left = rest;
  }
  return quota;
}

/**
 * The spanning, content-balanced fixed form of `length` items (bank indices, area by area, easiest
 * first within an area). Within an area of m items sorted by difficulty, the j-th of k chosen
 * items is the one at position ⌊(j + ½)·m/k⌋.
 *
 * Cost O(items · log items).
 *
 * @param bank the adaptive bank (its targets are the content shares).
 * @param length items on the form (at most the bank's size; larger values take the whole bank).
 * @returns bank indices of the form.
 * @throws when length is not a positive integer.
 * @example
 * // one area, difficulties -2, -1, 0, 1, 2, length 2 → the items at -1 and 1 (positions 1 and 3)
 * spanningForm(bank, 2); // Int32Array [1, 3]
 */
export function spanningForm(bank: AdaptiveBank, length: number): Int32Array {
  if (!Number.isInteger(length) || length < 1) throw new Error('spanningForm requires a positive length');
  const quota = areaQuotas(bank, length);
  const form: number[] = [];
  bank.members.forEach((members, a) => {
    const k = quota[a]!;
    if (k === 0) return;
    const sorted = Array.from(members).sort((x, y) => bank.difficulty[x]! - bank.difficulty[y]! || x - y);
    const m = sorted.length;
    for (let j = 0; j < k; j++) form.push(sorted[Math.floor(((j + 0.5) * m) / k)]!);
  });
  return Int32Array.from(form);
}
