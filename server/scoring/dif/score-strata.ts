import { MISSING, type ResponseMatrix } from '../response-matrix.js';
import type { MantelHaenszelStratum } from './mantel-haenszel.js';

/** Group label of a person: the reference group, the focal group, or left out of the comparison. */
export const REFERENCE_GROUP = 0;
export const FOCAL_GROUP = 1;

/**
 * Score strata for the Mantel-Haenszel study of one item: persons who answered the item, in the
 * reference or focal group, matched on their total score over the items they answered, the
 * studied item included.
 *
 * The studied item is part of the matching score because Holland & Thayer (1988)
 * show that, when the Rasch model holds, α_MH on the total score including the studied item
 * estimates exp(b_focal − b_reference) of that item without bias and equals 1 when there is no
 * DIF, while leaving it out (the rest score) does not; ETS practice matches on this total
 * (Zwick 2012, RR-12-08). Persons who answered different sets of items (rotated or adaptive
 * forms) have scores on different scales, so the stratum is the pair (set of answered items,
 * score): only persons who took the same form are matched.
 *
 * @see Holland, P. W., & Thayer, D. T. (1988). Differential item performance and the
 *   Mantel-Haenszel procedure. In H. Wainer & H. I. Braun (Eds.), Test Validity, ch. 9.
 * @see Zwick, R. (2012). ETS Research Report RR-12-08.
 * @param matrix 0/1 responses or MISSING.
 * @param groups per person (aligned with `matrix.personIds`): 0 reference, 1 focal, any other
 *   number to leave the person out.
 * @param item column of the studied item.
 * @returns one stratum per (form, score) that holds at least one person, in first-seen order.
 * @throws when `groups` has the wrong length or `item` is out of range.
 * @example
 * // two persons per group, one item of two: strata by total score 1 and 2
 * scoreStrata(matrix, Int32Array.of(0, 0, 1, 1), 0);
 */
export function scoreStrata(
  matrix: ResponseMatrix,
  groups: ArrayLike<number>,
  item: number,
): MantelHaenszelStratum[] {
  const nItems = matrix.itemIds.length;
  const nPersons = matrix.personIds.length;
  if (groups.length !== nPersons) throw new Error('scoreStrata requires one group per person');
  if (!Number.isInteger(item) || item < 0 || item >= nItems) throw new Error('scoreStrata item out of range');
  const cells = new Map<string, [number, number, number, number]>();
  for (let p = 0; p < nPersons; p++) {
    const group = groups[p];
    if (group !== REFERENCE_GROUP && group !== FOCAL_GROUP) continue;
    const row = p * nItems;
    const answer = matrix.scores[row + item]!;
    if (answer === MISSING) continue;
    if (answer > 1) throw new Error('scoreStrata requires 0/1 responses');
    let score = 0;
    let form = '';
    let complete = true;
    for (let i = 0; i < nItems; i++) {
      const x = matrix.scores[row + i]!;
      if (x === MISSING) complete = false;
      else score += x;
    }
    if (!complete) for (let i = 0; i < nItems; i++) form += matrix.scores[row + i] === MISSING ? '0' : '1';
    const key = `${form}:${score}`;
    let cell = cells.get(key);
    if (cell === undefined) {
      cell = [0, 0, 0, 0];
      cells.set(key, cell);
    }
    cell[(group === FOCAL_GROUP ? 2 : 0) + (answer === 1 ? 0 : 1)]!++;
  }
  return [...cells.values()].map(([a, b, c, d]) => ({
    referenceRight: a,
    referenceWrong: b,
    focalRight: c,
    focalWrong: d,
  }));
}
