import { MISSING, type ResponseMatrix } from '../response-matrix.js';

/** Mean-square fit and its standardized form for one item or one person. */
export interface FitStatistics {
  /** Responses that entered the sums. */
  readonly count: Int32Array;
  /** Outfit mean-square Σ z² / N (unweighted). NaN where count is 0. */
  readonly outfit: Float64Array;
  /** Infit mean-square Σ (x − P)² / Σ W (information-weighted). NaN where count is 0. */
  readonly infit: Float64Array;
  /** Outfit standardized by the Wilson-Hilferty cube-root transform. */
  readonly outfitZ: Float64Array;
  /** Infit standardized by the Wilson-Hilferty cube-root transform. */
  readonly infitZ: Float64Array;
}

export interface RaschFit {
  readonly items: FitStatistics;
  readonly persons: FitStatistics;
}

function emptyFit(n: number) {
  return {
    count: new Int32Array(n),
    squared: new Float64Array(n), // Σ z²
    residual: new Float64Array(n), // Σ (x − P)²
    variance: new Float64Array(n), // Σ W
    kurtosisOverW2: new Float64Array(n), // Σ C / W²
    kurtosisMinusW2: new Float64Array(n), // Σ (C − W²)
  };
}

function finish(sums: ReturnType<typeof emptyFit>): FitStatistics {
  const n = sums.count.length;
  const outfit = new Float64Array(n);
  const infit = new Float64Array(n);
  const outfitZ = new Float64Array(n);
  const infitZ = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const count = sums.count[k]!;
    if (count === 0) {
      outfit[k] = infit[k] = outfitZ[k] = infitZ[k] = Number.NaN;
      continue;
    }
    outfit[k] = sums.squared[k]! / count;
    infit[k] = sums.residual[k]! / sums.variance[k]!;
    // Model variances of the mean-squares (Wright & Masters 1982, ch. 5):
    // q²_out = Σ C/W² / N² − 1/N, q²_in = Σ (C − W²) / (Σ W)², C = E(x − P)⁴.
    const qOut = Math.sqrt(Math.max(sums.kurtosisOverW2[k]! / (count * count) - 1 / count, 0));
    const qIn = Math.sqrt(Math.max(sums.kurtosisMinusW2[k]! / sums.variance[k]! ** 2, 0));
    outfitZ[k] = wilsonHilferty(outfit[k]!, qOut);
    infitZ[k] = wilsonHilferty(infit[k]!, qIn);
  }
  return { count: sums.count, outfit, infit, outfitZ, infitZ };
}

/** t = (MS^{1/3} − 1)(3/q) + q/3; NaN when q is 0 (a single response carries no spread). */
function wilsonHilferty(meanSquare: number, q: number): number {
  return q > 0 ? (Math.cbrt(meanSquare) - 1) * (3 / q) + q / 3 : Number.NaN;
}

/**
 * Infit and outfit mean-squares of items and persons, with standardized values.
 *
 * For each response x_ni with model probability P_ni = 1/(1 + exp(b_i − θ_n)): W = P(1 − P),
 * z = (x − P)/√W and C = E(x − P)⁴ = P(1 − P)⁴ + (1 − P)P⁴. Outfit = Σ z²/N, infit = Σ (x − P)²/Σ W.
 * Each mean-square is standardized by the Wilson-Hilferty cube-root transform
 * t = (MS^{1/3} − 1)(3/q) + q/3, where q is the model SD of the mean-square:
 * q² = Σ C/W² / N² − 1/N for outfit and q² = Σ (C − W²) / (Σ W)² for infit
 * (Wright & Masters 1982, ch. 5; the same formulas as eRm 1.0-2 `itemfit`/`personfit`,
 * which the reference fixtures confirm).
 *
 * @see Wright, B. D., & Masters, G. N. (1982). Rating Scale Analysis. MESA Press, ch. 5 (fit mean-squares
 *   and their standardization).
 * @see Wilson, E. B., & Hilferty, M. M. (1931). The distribution of chi-square. PNAS 17(12), 684-688.
 * @param matrix responses, 0/1 or MISSING.
 * @param difficulties b_i aligned with `matrix.itemIds`; NaN leaves an item out.
 * @param abilities θ_n aligned with `matrix.personIds`; NaN leaves a person out (e.g. extreme scores).
 * @returns item and person statistics, NaN where nothing entered.
 * @throws when the arrays do not match the matrix.
 * @example
 * // one item at b = 0, four persons at θ = 0 answering 1, 1, 0, 0: every z² = 1
 * const fit = computeFitStatistics(
 *   { personIds: ['a', 'b', 'c', 'd'], itemIds: ['x'], scores: Uint8Array.of(1, 1, 0, 0) },
 *   Float64Array.of(0), new Float64Array(4));
 * [fit.items.outfit[0], fit.items.infit[0]]; // [1, 1]
 */
export function computeFitStatistics(
  matrix: ResponseMatrix,
  difficulties: Float64Array,
  abilities: Float64Array,
): RaschFit {
  const nItems = matrix.itemIds.length;
  const nPersons = matrix.personIds.length;
  if (difficulties.length !== nItems)
    throw new Error('computeFitStatistics requires one difficulty per item');
  if (abilities.length !== nPersons) throw new Error('computeFitStatistics requires one ability per person');
  const items = emptyFit(nItems);
  const persons = emptyFit(nPersons);
  for (let n = 0; n < nPersons; n++) {
    const theta = abilities[n]!;
    if (Number.isNaN(theta)) continue;
    for (let i = 0; i < nItems; i++) {
      const x = matrix.scores[n * nItems + i]!;
      const b = difficulties[i]!;
      if (x === MISSING || Number.isNaN(b)) continue;
      const p = 1 / (1 + Math.exp(b - theta)); // P_ni
      const w = p * (1 - p); // W_ni
      const c = w * ((1 - p) ** 3 + p ** 3); // C_ni = P(1−P)⁴ + (1−P)P⁴
      const r2 = (x - p) ** 2;
      const z2 = r2 / w;
      const cOverW2 = c / (w * w);
      const cMinusW2 = c - w * w;
      items.count[i]!++;
      items.squared[i]! += z2;
      items.residual[i]! += r2;
      items.variance[i]! += w;
      items.kurtosisOverW2[i]! += cOverW2;
      items.kurtosisMinusW2[i]! += cMinusW2;
      persons.count[n]!++;
      persons.squared[n]! += z2;
      persons.residual[n]! += r2;
      persons.variance[n]! += w;
      persons.kurtosisOverW2[n]! += cOverW2;
      persons.kurtosisMinusW2[n]! += cMinusW2;
    }
  }
  return { items: finish(items), persons: finish(persons) };
}
