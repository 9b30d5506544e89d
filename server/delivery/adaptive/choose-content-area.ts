/**
 * Content balancing: the content area whose administered share lags its target most.
 *
 * With n items given so far and c_a of them in area a (t_a its target share), the lag of area a is
 * measured at the position being filled: t_a·(n + 1) − c_a, the items area a is short of its
 * target once n + 1 items are given. (Measuring at n instead, t_a − c_a/n, lets an area drift more
 * than one item from its target; the test with random targets shows the difference.) Only areas
 * with a positive target and an item still available compete. Ties go to the larger target, then
 * to the earlier area, so the choice is deterministic.
 *
 * @see Kingsbury, G. G., & Zara, A. R. (1989). Procedures for selecting items for computerized
 *   adaptive tests. Applied Measurement in Education 2(4), 359–375 (choose the area whose
 *   administered proportion is furthest below its target, then the best item within it).
 */
import type { AdaptiveBank } from './adaptive-bank.js';

/**
 * Chooses the next content area. Cost O(items) in the worst case (scans each area for an
 * available item, stopping at the first).
 *
 * @param bank the adaptive bank.
 * @param areaCounts items given so far per area (bank.areas order).
 * @param unavailable 1 for each item the attempt may not take (given or passed over).
 * @returns the area index, or -1 when no area with a positive target has an item left.
 * @throws when areaCounts or unavailable do not match the bank.
 * @example
 * // targets read 0.5, interpret 0.3, envision 0.2; nothing given yet → read (index 0)
 * chooseContentArea(bank, Int32Array.of(0, 0, 0), new Uint8Array(bank.ids.length)); // 0
 */
export function chooseContentArea(
  bank: AdaptiveBank,
  areaCounts: ArrayLike<number>,
  unavailable: Uint8Array,
): number {
  const areaTotal = bank.areas.length;
  if (areaCounts.length !== areaTotal) throw new Error('chooseContentArea requires one count per area');
  if (unavailable.length !== bank.ids.length) throw new Error('chooseContentArea requires one flag per item');
  let given = 0;
  for (let a = 0; a < areaTotal; a++) given += areaCounts[a]!;
  let best = -1;
  let bestLag = Number.NEGATIVE_INFINITY;
  for (let a = 0; a < areaTotal; a++) {
    const target = bank.targets[a]!;
    if (!(target > 0)) continue;
    const lag = target * (given + 1) - areaCounts[a]!;
    if (lag < bestLag || (lag === bestLag && target <= bank.targets[best]!)) continue;
    if (!hasAvailable(bank.members[a]!, unavailable)) continue;
    best = a;
    bestLag = lag;
  }
  return best;
}

function hasAvailable(members: Int32Array, unavailable: Uint8Array): boolean {
  for (let k = 0; k < members.length; k++) if (unavailable[members[k]!] === 0) return true;
  return false;
}
