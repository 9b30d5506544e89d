/**
 * Collapses a response matrix into the cells a Rasch marginal likelihood needs.
 *
 * Under the Rasch model the raw score is sufficient for θ given the items a person answered, so
 * two persons of the same group who answered the same item set (a booklet, or an adaptive path
 * that happened to coincide) and got the same raw score have the same posterior for θ. The
 * marginal log-likelihood is therefore
 * Σ_cells n_c log ∫ exp(r_c θ) / Π_{i∈S_c} (1 + e^(θ−b_i)) φ(θ) dθ − Σ_i s_i b_i,
 * with s_i the number of correct answers to item i. This module finds those cells in one pass.
 *
 * @see Andersen, E. B. (1977). Sufficient statistics and latent trait models. Psychometrika 42, 69–81.
 */
import { MISSING, type ResponseMatrix } from '../response-matrix.js';
import type { Exclusion } from './types.js';

/** Persons of one group who answered the same items, counted by raw score. */
export interface MmlScoreUnit {
  /** Group index. */
  readonly group: number;
  /** Kept-item indices (into {@link MmlScoreGroups.itemIds}) answered in this unit, ascending. */
  readonly items: Int32Array;
  /** counts[r] = persons with raw score r, r = 0..items.length. */
  readonly counts: Float64Array;
}

export interface MmlScoreGroups {
  /** Items kept for estimation, in matrix order. */
  readonly itemIds: readonly string[];
  /** Matrix column of each kept item. */
  readonly itemColumns: Int32Array;
  /** s_i: correct answers per kept item. */
  readonly itemCorrect: Float64Array;
  /** Answers (0 or 1) per kept item. */
  readonly itemAnswered: Float64Array;
  readonly units: readonly MmlScoreUnit[];
  /** Persons kept per group. */
  readonly groupPersons: Float64Array;
  readonly excludedItems: readonly Exclusion[];
  readonly excludedPersons: readonly Exclusion[];
}

/**
 * Builds the score cells of a response matrix.
 *
 * Items nobody answered are excluded ('no-responses'); items everyone answered correctly or
 * wrongly are excluded ('all-correct', 'all-wrong') because their difficulty has no finite
 * marginal maximum, unless they are in `keepConstant` (anchored items). Persons with no
 * answer to a kept item are excluded ('no-responses'); all-correct and all-wrong persons stay,
 * since they inform the ability distribution.
 *
 * @param matrix responses, 0/1 or MISSING.
 * @param groupIndex group of each person, 0..groupCount−1.
 * @param groupCount number of groups.
 * @param keepConstant item ids kept even when their answers are constant.
 * @returns the score cells, item totals and exclusions.
 * @throws when a score is not 0, 1 or MISSING or a group index is out of range.
 * @example
 * // Three persons, two items, one booklet: raw scores 1, 2 and 0.
 * const cells = collectMmlScoreGroups(
 *   { personIds: ['p', 'q', 'r'], itemIds: ['a', 'b'], scores: Uint8Array.of(1, 0, 1, 1, 0, 0) },
 *   new Int32Array(3), 1, new Set());
 * cells.units[0].counts; // Float64Array [1, 1, 1]
 */
export function collectMmlScoreGroups(
  matrix: ResponseMatrix,
  groupIndex: Int32Array,
  groupCount: number,
  keepConstant: ReadonlySet<string>,
): MmlScoreGroups {
  const personCount = matrix.personIds.length;
  const itemCount = matrix.itemIds.length;
  const scores = matrix.scores;
  if (scores.length !== personCount * itemCount) {
    throw new Error('calibrateMml requires scores of length persons x items');
  }
  if (groupIndex.length !== personCount) {
    throw new Error('calibrateMml requires one group index per person');
  }
  const answered = new Float64Array(itemCount);
  const correct = new Float64Array(itemCount);
  for (let p = 0; p < personCount; p++) {
    const g = groupIndex[p]!;
    if (g < 0 || g >= groupCount) throw new Error('calibrateMml group index out of range');
    const row = p * itemCount;
    for (let i = 0; i < itemCount; i++) {
      const x = scores[row + i]!;
      if (x === MISSING) continue;
      if (x > 1) throw new Error('calibrateMml requires dichotomous scores (0, 1 or MISSING)');
      answered[i]! += 1;
      correct[i]! += x;
    }
  }

  const excludedItems: Exclusion[] = [];
  const columns: number[] = [];
  for (let i = 0; i < itemCount; i++) {
    const id = matrix.itemIds[i]!;
    const n = answered[i]!;
    const s = correct[i]!;
    if (n === 0) excludedItems.push({ id, reason: 'no-responses' });
    else if (s === n && !keepConstant.has(id)) excludedItems.push({ id, reason: 'all-correct' });
    else if (s === 0 && !keepConstant.has(id)) excludedItems.push({ id, reason: 'all-wrong' });
    else columns.push(i);
  }
  const kept = columns.length;
  const itemColumns = Int32Array.from(columns);
  const itemCorrect = new Float64Array(kept);
  const itemAnswered = new Float64Array(kept);
  for (let k = 0; k < kept; k++) {
    itemCorrect[k] = correct[itemColumns[k]!]!;
    itemAnswered[k] = answered[itemColumns[k]!]!;
  }

  const units: { group: number; items: Int32Array; counts: Float64Array }[] = [];
  const byHash = new Map<number, number[]>();
  const groupPersons = new Float64Array(groupCount);
  const excludedPersons: Exclusion[] = [];
  const scratch = new Int32Array(kept);
  const allKept = Int32Array.from({ length: kept }, (_, k) => k);
  const completeUnit = new Int32Array(groupCount).fill(-1);
  for (let p = 0; p < personCount; p++) {
    const row = p * itemCount;
    const g = groupIndex[p]!;
    // Fast path: a person who answered every kept item joins the group's complete cell.
    let length = 0;
    let raw = 0;
    for (let k = 0; k < kept; k++) {
      const x = scores[row + itemColumns[k]!]!;
      if (x === MISSING) continue;
      length++;
      raw += x;
    }
    if (length === 0) {
      excludedPersons.push({ id: matrix.personIds[p]!, reason: 'no-responses' });
      continue;
    }
    groupPersons[g]! += 1;
    if (length === kept) {
      let unitId = completeUnit[g]!;
      if (unitId < 0) {
        unitId = units.length;
        completeUnit[g] = unitId;
        units.push({ group: g, items: allKept, counts: new Float64Array(kept + 1) });
      }
      units[unitId]!.counts[raw]! += 1;
      continue;
    }
    length = 0;
    // Two independent 32-bit FNV-style hashes of (group, answered item set).
    let h1 = (2166136261 ^ g) >>> 0;
    let h2 = (0x9e3779b9 ^ Math.imul(g, 0x85ebca6b)) >>> 0;
    for (let k = 0; k < kept; k++) {
      if (scores[row + itemColumns[k]!] === MISSING) continue;
      scratch[length++] = k;
      h1 = Math.imul(h1 ^ k, 16777619);
      h2 = Math.imul(h2 ^ (k + 0x7f4a7c15), 0x27d4eb2d) ^ (h2 >>> 15);
    }
    const key = (h1 >>> 0) * 2097152 + ((h2 >>> 0) & 0x1fffff) + length;
    let bucket = byHash.get(key);
    let unitId = -1;
    if (bucket) {
      for (const candidate of bucket) {
        const unit = units[candidate]!;
        if (unit.group === g && sameItems(unit.items, scratch, length)) {
          unitId = candidate;
          break;
        }
      }
    } else {
      bucket = [];
      byHash.set(key, bucket);
    }
    if (unitId < 0) {
      unitId = units.length;
      units.push({ group: g, items: scratch.slice(0, length), counts: new Float64Array(length + 1) });
      bucket.push(unitId);
    }
    units[unitId]!.counts[raw]! += 1;
  }
  return {
    itemIds: columns.map((i) => matrix.itemIds[i]!),
    itemColumns,
    itemCorrect,
    itemAnswered,
    units,
    groupPersons,
    excludedItems,
    excludedPersons,
  };
}

function sameItems(items: Int32Array, scratch: Int32Array, length: number): boolean {
  if (items.length !== length) return false;
  for (let k = 0; k < length; k++) if (items[k] !== scratch[k]) return false;
  return true;
}
