/**
 * The next item of an adaptive attempt: maximum Fisher information at the current ability
 * estimate, within the content area that lags its target most, with randomesque exposure control
 * and optional Sympson–Hetter exposure control.
 *
 * Rasch information P(1 − P) is a strictly decreasing function of |θ − b|, so the k most
 * informative items are the k items nearest θ; the loop compares |θ − b| and needs no exp().
 * Ties go to the earlier item in bank order.
 *
 * @see Kingsbury, G. G., & Zara, A. R. (1989). Procedures for selecting items for computerized
 *   adaptive tests. Applied Measurement in Education 2(4), 359–375 (randomesque: pick at random
 *   among the k most informative; content balancing).
 * @see Sympson, J. B., & Hetter, R. D. (1985). Controlling item-exposure rates in computerized
 *   adaptive testing. Proceedings of the 27th annual meeting of the Military Testing Association,
 *   973–977 (each selected item is given with probability K_i, otherwise passed over).
 * @see Linacre, J. M. (2006). Rasch Measurement Transactions 20:2 (I = P(1 − P), largest at θ = b).
 */
import type { AdaptiveBank } from './adaptive-bank.js';
import { chooseContentArea } from './choose-content-area.js';

/** The random source selection draws from (a SeededRandom satisfies it). */
export interface SelectionRandom {
  /** Uniform on [0, 1). */
  uniform(): number;
}

export interface SelectionInput {
  /** Current ability estimate (EAP), logits. */
  readonly ability: number;
  /** 1 for each item the attempt may not take: already given or passed over earlier. */
  readonly unavailable: Uint8Array;
  /** Items given so far per area (bank.areas order). */
  readonly areaCounts: ArrayLike<number>;
  /** Randomesque k: pick uniformly among the k most informative items (1 = pure maximum information). */
  readonly randomesque: number;
  /** Sympson–Hetter K_i per item, in [0, 1]; absent = every selected item is given. */
  readonly exposureControl?: Float64Array;
  readonly random: SelectionRandom;
}

export interface Selection {
  /** Bank index of the chosen item. */
  readonly index: number;
  /** Area index of the chosen item. */
  readonly area: number;
  /**
   * Items the Sympson–Hetter lottery passed over on the way (bank indices): the attempt must not
   * offer them again. Empty without exposure control.
   */
  readonly passedOver: number[];
}

/**
 * Selects the next item.
 *
 * When the Sympson–Hetter lottery passes over every item of the chosen area, the most
 * informative of them is given anyway (the attempt never stalls on exposure control).
 *
 * Cost O(items in the area × k) for the top-k scan, plus one more scan per passed-over item.
 *
 * @param bank the adaptive bank.
 * @param input ability, availability, area counts, k, optional K_i, random source.
 * @returns the selection, or null when no area with a positive target has an item left.
 * @throws when k is not a positive integer or the arrays do not match the bank.
 * @example
 * // bank difficulties −2, −1, 0, 1, 2 in one area; ability 0.9, k = 1 → the item at b = 1
 * selectNextItem(bank, { ability: 0.9, unavailable: new Uint8Array(5), areaCounts: [0],
 *   randomesque: 1, random: seededRandom(1) }).index; // 3
 */
export function selectNextItem(bank: AdaptiveBank, input: SelectionInput): Selection | null {
  const { ability, unavailable, randomesque: k, exposureControl, random } = input;
  if (!Number.isInteger(k) || k < 1)
    throw new Error('selectNextItem requires a positive integer randomesque k');
  if (exposureControl !== undefined && exposureControl.length !== bank.ids.length) {
    throw new Error('selectNextItem requires one exposure parameter per item');
  }
  const area = chooseContentArea(bank, input.areaCounts, unavailable);
  if (area < 0) return null;
  const members = bank.members[area]!;
  const difficulty = bank.difficulty;
  const topIndex = new Int32Array(k);
  const topDistance = new Float64Array(k);
  const passedOver: number[] = [];
  for (let round = 0; round <= members.length; round++) {
    // The k items nearest θ among those still open: insertion into a sorted buffer of length ≤ k.
    let found = 0;
    for (let m = 0; m < members.length; m++) {
      const i = members[m]!;
      if (unavailable[i] !== 0 || (passedOver.length > 0 && passedOver.includes(i))) continue;
      const d = Math.abs(ability - difficulty[i]!);
      if (found === k && d >= topDistance[k - 1]!) continue;
      let slot = found < k ? found++ : k - 1;
      while (slot > 0 && topDistance[slot - 1]! > d) {
        topDistance[slot] = topDistance[slot - 1]!;
        topIndex[slot] = topIndex[slot - 1]!;
        slot--;
      }
      topDistance[slot] = d;
      topIndex[slot] = i;
    }
    if (found === 0) break;
    const pick = topIndex[Math.min(found - 1, Math.floor(random.uniform() * found))]!;
    if (exposureControl === undefined || random.uniform() < exposureControl[pick]!) {
      return { index: pick, area, passedOver };
    }
    passedOver.push(pick);
  }
  // Every open item of the area was passed over: give the most informative of them.
  let best = passedOver[0]!;
  for (const i of passedOver) {
    const d = Math.abs(ability - difficulty[i]!);
    const bestD = Math.abs(ability - difficulty[best]!);
    if (d < bestD || (d === bestD && i < best)) best = i;
  }
  return { index: best, area, passedOver: passedOver.filter((i) => i !== best) };
}
