import { MISSING, type ResponseMatrix } from '../response-matrix.js';
import type { ExclusionReason } from './types.js';

/** Why an item or person took no part in a partial credit calibration. */
export interface PcmExclusion {
  readonly id: string;
  /** 'unobserved-category': some score 0..m of the item was given by no included person. */
  readonly reason: ExclusionReason | 'unobserved-category';
}

/** Persons who answered the same items; counts[r] = persons with total score r (r = 0..Σ m). */
export interface PcmBooklet {
  readonly items: Int32Array;
  readonly counts: Float64Array;
}

/** Sufficient statistics of a polytomous response matrix for CML. */
export interface PcmScoreGroups {
  /** Matrix column of each kept item. */
  readonly itemIndex: Int32Array;
  /** m_i, the highest score of each kept item. */
  readonly maxScores: Int32Array;
  /** Start of item i's categories 1..m_i in the stacked parameter vector. */
  readonly offsets: Int32Array;
  /** N_ih: included persons with score h ≥ 1 on item i, stacked like the parameters. */
  readonly categoryCounts: Float64Array;
  readonly booklets: readonly PcmBooklet[];
  readonly excludedItems: readonly PcmExclusion[];
  readonly excludedPersons: readonly PcmExclusion[];
}

/**
 * Groups persons by the set of kept items they answered and counts total scores per booklet, for
 * the partial credit model. A person is excluded at total 0 or at the highest total of their
 * items (no conditional information); an item is excluded when no included person answered it or
 * some score 0..m_i never occurs among included persons (its step parameter has no finite CML
 * estimate). Exclusions repeat until stable.
 *
 * @see Andersen, E. B. (1977). Sufficient statistics and latent trait models. Psychometrika 42,
 *   69-81 (total scores are sufficient; extreme totals carry no conditional information).
 * @param matrix scores 0..m_i or MISSING.
 * @param maxScores m_i per matrix column; default the highest score observed in the column.
 * @returns booklets, category counts and exclusions.
 * @throws when a score exceeds its item's maximum or maxScores has the wrong length.
 * @example
 * // persons [0, 2] and [1, 1] on two 0..2 items: one booklet, two persons at total 2
 * groupPcmScoreGroups({ personIds: ['a', 'b'], itemIds: ['x', 'y'], scores: Uint8Array.of(0, 2, 1, 1) });
 */
export function groupPcmScoreGroups(matrix: ResponseMatrix, maxScores?: ArrayLike<number>): PcmScoreGroups {
  const { scores } = matrix;
  const nPersons = matrix.personIds.length;
  const nItems = matrix.itemIds.length;
  if (scores.length !== nPersons * nItems)
    throw new Error('groupPcmScoreGroups requires scores of length persons × items');
  const maxima = new Int32Array(nItems);
  if (maxScores !== undefined) {
    if (maxScores.length !== nItems)
      throw new Error('groupPcmScoreGroups requires one maximum score per item');
    for (let i = 0; i < nItems; i++) maxima[i] = maxScores[i]!;
  } else {
    for (let k = 0; k < scores.length; k++) {
      const x = scores[k]!;
      if (x !== MISSING) maxima[k % nItems] = Math.max(maxima[k % nItems]!, x);
    }
  }
  for (let k = 0; k < scores.length; k++) {
    const x = scores[k]!;
    if (x !== MISSING && x > maxima[k % nItems]!)
      throw new Error(
        `groupPcmScoreGroups score ${x} is above the maximum of item ${matrix.itemIds[k % nItems]}`,
      );
  }
  const itemReason = new Map<number, PcmExclusion['reason']>();
  const personReason = new Array<PcmExclusion['reason'] | undefined>(nPersons);
  const personScore = new Int32Array(nPersons);
  for (let i = 0; i < nItems; i++) if (maxima[i] === 0) itemReason.set(i, 'all-wrong');
  let active = Int32Array.from(matrix.itemIds.keys()).filter((i) => !itemReason.has(i));
  const seen = new Float64Array(nItems * 256);
  for (let pass = 0; pass <= nItems; pass++) {
    seen.fill(0);
    for (let p = 0; p < nPersons; p++) {
      const row = p * nItems;
      let answered = 0;
      let score = 0;
      let top = 0;
      for (const i of active) {
        const x = scores[row + i]!;
        if (x === MISSING) continue;
        answered++;
        score += x;
        top += maxima[i]!;
      }
      personScore[p] = score;
      personReason[p] =
        answered === 0
          ? 'no-responses'
          : score === 0
            ? 'all-wrong'
            : score === top
              ? 'all-correct'
              : undefined;
      if (personReason[p] !== undefined) continue;
      for (const i of active) {
        const x = scores[row + i]!;
        if (x !== MISSING) seen[i * 256 + x]!++;
      }
    }
    let changed = false;
    for (const i of active) {
      let answered = 0;
      let missingCategory = false;
      for (let h = 0; h <= maxima[i]!; h++) {
        answered += seen[i * 256 + h]!;
        if (seen[i * 256 + h] === 0) missingCategory = true;
      }
      if (answered > 0 && !missingCategory) continue;
      itemReason.set(i, answered === 0 ? 'no-responses' : 'unobserved-category');
      changed = true;
    }
    if (!changed) break;
    active = active.filter((i) => !itemReason.has(i));
  }

  const itemIndex = active;
  const nActive = itemIndex.length;
  const kept = Int32Array.from(itemIndex, (i) => maxima[i]!);
  const offsets = new Int32Array(nActive + 1);
  for (let k = 0; k < nActive; k++) offsets[k + 1] = offsets[k]! + kept[k]!;
  const categoryCounts = new Float64Array(offsets[nActive]!);
  const bookletByKey = new Map<string, number>();
  const booklets: { items: Int32Array; counts: Float64Array }[] = [];
  for (let p = 0; p < nPersons; p++) {
    if (personReason[p] !== undefined) continue;
    const row = p * nItems;
    const items: number[] = [];
    let top = 0;
    for (let k = 0; k < nActive; k++) {
      const x = scores[row + itemIndex[k]!]!;
      if (x === MISSING) continue;
      items.push(k);
      top += kept[k]!;
      if (x > 0) categoryCounts[offsets[k]! + x - 1]!++;
    }
    const key = items.join(',');
    let b = bookletByKey.get(key);
    if (b === undefined) {
      b = booklets.length;
      bookletByKey.set(key, b);
      booklets.push({ items: Int32Array.from(items), counts: new Float64Array(top + 1) });
    }
    booklets[b]!.counts[personScore[p]!]!++;
  }
  const excludedItems: PcmExclusion[] = [...itemReason.entries()]
    .sort(([a], [b]) => a - b)
    .map(([i, reason]) => ({ id: matrix.itemIds[i]!, reason }));
  const excludedPersons: PcmExclusion[] = [];
  for (let p = 0; p < nPersons; p++) {
    const reason = personReason[p];
    if (reason !== undefined) excludedPersons.push({ id: matrix.personIds[p]!, reason });
  }
  return { itemIndex, maxScores: kept, offsets, categoryCounts, booklets, excludedItems, excludedPersons };
}
