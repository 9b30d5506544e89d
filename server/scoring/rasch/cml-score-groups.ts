import { MISSING, type ResponseMatrix } from '../response-matrix.js';
import type { Exclusion } from './types.js';

/** Persons who answered the same items: their score counts are all CML needs from them. */
export interface Booklet {
  /** Indices into {@link CmlScoreGroups.itemIndex} of the items in this booklet. */
  readonly items: Int32Array;
  /** counts[r] = included persons with raw score r in this booklet (r = 0..items.length). */
  readonly counts: Float64Array;
}

/** The sufficient statistics of a response matrix for conditional maximum likelihood. */
export interface CmlScoreGroups {
  /** Matrix column of each kept item. */
  readonly itemIndex: Int32Array;
  /** s_i: number correct on each kept item over included persons. */
  readonly itemTotals: Float64Array;
  readonly booklets: readonly Booklet[];
  /** Booklet of each person (matrix row), or -1 when excluded. */
  readonly personBooklet: Int32Array;
  /** Raw score of each person over kept items (also set for excluded persons). */
  readonly personScore: Int32Array;
  readonly excludedItems: readonly Exclusion[];
  readonly excludedPersons: readonly Exclusion[];
}

/**
 * Groups persons by the set of kept items they answered (booklets) and counts raw scores per
 * booklet. Persons with no responses or an extreme score in their booklet, and items with no
 * responses or a constant response among included persons, are excluded and reported; the
 * exclusion repeats until stable because dropping an item can make a person's score extreme.
 * Items in `keep` are never excluded for being constant (anchored items carry known values).
 *
 * @see Andersen, E. B. (1973). Conditional inference and models for measuring. Mentalhygiejnisk
 *   Forlag (raw scores are sufficient; extreme scores carry no conditional information).
 * @param matrix responses (0/1 or MISSING).
 * @param keep matrix columns that are never excluded as constant.
 * @returns booklets, score counts, item totals and exclusions.
 * @example
 * // two persons, two items: [1, 0] and [0, 1] form one booklet with one person at score 1 twice
 * groupScoreGroups({ personIds: ['a', 'b'], itemIds: ['x', 'y'], scores: Uint8Array.of(1, 0, 0, 1) })
 *   .booklets[0].counts; // Float64Array [0, 2, 0]
 */
export function groupScoreGroups(
  matrix: ResponseMatrix,
  keep: ReadonlySet<number> = new Set(),
): CmlScoreGroups {
  const { scores } = matrix;
  const nPersons = matrix.personIds.length;
  const nItems = matrix.itemIds.length;
  if (scores.length !== nPersons * nItems)
    throw new Error('groupScoreGroups requires scores of length persons × items');
  const itemState = new Uint8Array(nItems); // 0 active, else 1 + index into reasons
  const itemReason: Exclusion['reason'][] = [];
  const personReason = new Array<Exclusion['reason'] | undefined>(nPersons);
  const personScore = new Int32Array(nPersons);
  const personAnswered = new Int32Array(nPersons);
  const answeredCount = new Int32Array(nItems);
  const correctCount = new Int32Array(nItems);
  let active = Int32Array.from(matrix.itemIds.keys());
  for (let pass = 0; pass <= nItems; pass++) {
    answeredCount.fill(0);
    correctCount.fill(0);
    const nActive = active.length;
    for (let p = 0; p < nPersons; p++) {
      const row = p * nItems;
      let answered = 0;
      let score = 0;
      // Count every person first and take extreme persons back out: they are rare.
      for (let k = 0; k < nActive; k++) {
        const i = active[k]!;
        const x = scores[row + i]!;
        if (x === MISSING) continue;
        answered++;
        score += x;
        answeredCount[i]!++;
        correctCount[i]! += x;
      }
      personScore[p] = score;
      personAnswered[p] = answered;
      const reason =
        answered === 0
          ? 'no-responses'
          : score === 0
            ? 'all-wrong'
            : score === answered
              ? 'all-correct'
              : undefined;
      personReason[p] = reason;
      if (reason === undefined || answered === 0) continue;
      for (let k = 0; k < nActive; k++) {
        const i = active[k]!;
        const x = scores[row + i]!;
        if (x === MISSING) continue;
        answeredCount[i]!--;
        correctCount[i]! -= x;
      }
    }
    let changed = false;
    for (const i of active) {
      const n = answeredCount[i]!;
      const s = correctCount[i]!;
      let reason: Exclusion['reason'] | undefined;
      if (n === 0) reason = keep.has(i) ? undefined : 'no-responses';
      else if (!keep.has(i)) reason = s === 0 ? 'all-wrong' : s === n ? 'all-correct' : undefined;
      if (reason === undefined) continue;
      itemReason.push(reason);
      itemState[i] = itemReason.length;
      changed = true;
    }
    if (!changed) break;
    active = active.filter((i) => itemState[i] === 0);
  }

  const itemIndex = active;
  const itemTotals = Float64Array.from(itemIndex, (i) => correctCount[i]!);
  const personBooklet = new Int32Array(nPersons).fill(-1);
  const bookletByKey = new Map<string, number>();
  const bookletItems: Int32Array[] = [];
  const bookletCounts: Float64Array[] = [];
  const words = new Uint16Array(Math.ceil(nItems / 16));
  const nActive = itemIndex.length;
  let completeBooklet = -1;
  for (let p = 0; p < nPersons; p++) {
    if (personReason[p] !== undefined) continue;
    let booklet: number | undefined;
    // Persons who answered every kept item share one booklet without building a key.
    if (personAnswered[p] === nActive && completeBooklet >= 0) booklet = completeBooklet;
    else {
      const row = p * nItems;
      words.fill(0);
      for (let k = 0; k < nActive; k++) {
        const i = itemIndex[k]!;
        if (scores[row + i] !== MISSING) words[i >> 4]! |= 1 << (i & 15);
      }
      const key = String.fromCharCode(...words);
      booklet = bookletByKey.get(key);
      if (booklet === undefined) {
        const items: number[] = [];
        for (let k = 0; k < nActive; k++) if (scores[row + itemIndex[k]!] !== MISSING) items.push(k);
        booklet = bookletItems.length;
        bookletByKey.set(key, booklet);
        bookletItems.push(Int32Array.from(items));
        bookletCounts.push(new Float64Array(items.length + 1));
        if (items.length === nActive) completeBooklet = booklet;
      }
    }
    personBooklet[p] = booklet;
    bookletCounts[booklet]![personScore[p]!]!++;
  }
  const excludedItems: Exclusion[] = [];
  for (let i = 0; i < nItems; i++) {
    const state = itemState[i]!;
    if (state !== 0) excludedItems.push({ id: matrix.itemIds[i]!, reason: itemReason[state - 1]! });
  }
  const excludedPersons: Exclusion[] = [];
  for (let p = 0; p < nPersons; p++) {
    const reason = personReason[p];
    if (reason !== undefined) excludedPersons.push({ id: matrix.personIds[p]!, reason });
  }
  return {
    itemIndex,
    itemTotals,
    booklets: bookletItems.map((items, b) => ({ items, counts: bookletCounts[b]! })),
    personBooklet,
    personScore,
    excludedItems,
    excludedPersons,
  };
}
