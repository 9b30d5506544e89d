import { MISSING, type ResponseMatrix } from '../response-matrix.js';

/**
 * Point-measure correlation of each item: the Pearson correlation between the responses to the
 * item and the ability measures of the persons who answered it. A negative or near-zero value
 * flags an item that runs against the rest of the test (miskeyed, or measuring something else).
 *
 * @see Linacre, J. M. (2008). The expected value of a point-biserial (or similar) correlation.
 *   Rasch Measurement Transactions 22(1), 1154 (point-measure correlation; from memory).
 * @param matrix responses, 0/1 or MISSING.
 * @param abilities θ_n aligned with `matrix.personIds`; NaN leaves a person out.
 * @returns one correlation per item; NaN when fewer than two persons answered or a column is constant.
 * @throws when `abilities` does not match the matrix.
 * @example
 * pointMeasureCorrelation(
 *   { personIds: ['a', 'b', 'c'], itemIds: ['x'], scores: Uint8Array.of(0, 1, 1) },
 *   Float64Array.of(-1, 0, 1))[0]; // 0.8660254037844387
 */
export function pointMeasureCorrelation(matrix: ResponseMatrix, abilities: Float64Array): Float64Array {
  const nItems = matrix.itemIds.length;
  const nPersons = matrix.personIds.length;
  if (abilities.length !== nPersons)
    throw new Error('pointMeasureCorrelation requires one ability per person');
  const result = new Float64Array(nItems);
  for (let i = 0; i < nItems; i++) {
    let n = 0;
    let meanX = 0;
    let meanT = 0;
    for (let p = 0; p < nPersons; p++) {
      const x = matrix.scores[p * nItems + i]!;
      const t = abilities[p]!;
      if (x === MISSING || Number.isNaN(t)) continue;
      n++;
      meanX += x;
      meanT += t;
    }
    if (n < 2) {
      result[i] = Number.NaN;
      continue;
    }
    meanX /= n;
    meanT /= n;
    let sxx = 0;
    let stt = 0;
    let sxt = 0;
    for (let p = 0; p < nPersons; p++) {
      const x = matrix.scores[p * nItems + i]!;
      const t = abilities[p]!;
      if (x === MISSING || Number.isNaN(t)) continue;
      sxx += (x - meanX) ** 2;
      stt += (t - meanT) ** 2;
      sxt += (x - meanX) * (t - meanT);
    }
    result[i] = sxx > 0 && stt > 0 ? sxt / Math.sqrt(sxx * stt) : Number.NaN;
  }
  return result;
}
