import { MISSING, type ResponseMatrix } from '../response-matrix.js';
import { pcmCategoryProbabilities } from './pcm-category-probabilities.js';

/** Infit and outfit mean-squares of partial credit items (NaN where nothing entered). */
export interface PcmItemFit {
  readonly infit: Float64Array;
  readonly outfit: Float64Array;
}

/**
 * Infit and outfit mean-squares of partial credit items with persons at given abilities.
 *
 * For response x_ni with category probabilities P_nik (k = 0..m_i): E = Σ k P, W = Σ (k − E)² P,
 * outfit = Σ_n (x − E)²/W / N, infit = Σ_n (x − E)² / Σ_n W. For a right/wrong item (one step b)
 * E = P and W = P(1 − P), the Rasch mean-squares of fit-statistics.ts.
 *
 * @see Wright, B. D., & Masters, G. N. (1982). Rating Scale Analysis. MESA Press, ch. 5 (fit
 *   mean-squares for rating and partial credit items; from memory for the chapter).
 * @param matrix scores 0..m_i or MISSING.
 * @param steps δ_i1..δ_im of each column; undefined leaves the column out (NaN).
 * @param abilities θ_n of each row; NaN leaves the person out.
 * @returns per column infit and outfit, NaN where no response entered.
 * @throws when the arrays do not match the matrix, or a score is above its item's maximum.
 * @example
 * // one 0-1-2 item with steps (−1, 1) and two persons at θ = 0 scoring 0 and 2: E = 1, W = 2 · 0.2119416,
 * // (x − E)² = 1 for both, so outfit = infit = 1 / 0.4238832 = 2.359 (3 d.p.)
 */
export function pcmItemFit(
  matrix: ResponseMatrix,
  steps: readonly (ArrayLike<number> | undefined)[],
  abilities: Float64Array,
): PcmItemFit {
  const nItems = matrix.itemIds.length;
  const nPersons = matrix.personIds.length;
  if (steps.length !== nItems) throw new Error('pcmItemFit requires steps (or undefined) per item');
  if (abilities.length !== nPersons) throw new Error('pcmItemFit requires one ability per person');
  const infit = new Float64Array(nItems).fill(Number.NaN);
  const outfit = new Float64Array(nItems).fill(Number.NaN);
  for (let i = 0; i < nItems; i++) {
    const itemSteps = steps[i];
    if (itemSteps === undefined) continue;
    let count = 0;
    let squared = 0;
    let residual = 0;
    let variance = 0;
    for (let n = 0; n < nPersons; n++) {
      const theta = abilities[n]!;
      const x = matrix.scores[n * nItems + i]!;
      if (x === MISSING || Number.isNaN(theta)) continue;
      if (x > itemSteps.length) throw new Error(`pcmItemFit: score ${x} above the maximum of item ${i + 1}`);
      const p = pcmCategoryProbabilities(theta, itemSteps);
      let expected = 0;
      for (let k = 1; k < p.length; k++) expected += k * p[k]!;
      let w = 0;
      for (let k = 0; k < p.length; k++) w += (k - expected) ** 2 * p[k]!;
      const r2 = (x - expected) ** 2;
      count++;
      squared += r2 / w;
      residual += r2;
      variance += w;
    }
    if (count === 0) continue;
    outfit[i] = squared / count;
    infit[i] = residual / variance;
  }
  return { infit, outfit };
}
