import { MISSING, type ResponseMatrix } from '../response-matrix.js';

/**
 * Kuder-Richardson formula 20 for complete dichotomous data:
 * KR-20 = k/(k − 1) · (1 − Σ p_i q_i / s_X²), with s_X² the population variance (÷N) of the raw
 * scores, so both variances use the same divisor.
 *
 * @see Kuder, G. F., & Richardson, M. W. (1937). The theory of the estimation of test reliability.
 *   Psychometrika 2(3), 151-160, formula 20.
 * @param matrix complete 0/1 responses.
 * @returns KR-20.
 * @throws with missing cells, fewer than two items or persons, or zero score variance.
 * @example
 * // Wuensch's KR20 data (check-values section 7): 0.6963
 */
export function kuderRichardson20(matrix: ResponseMatrix): number {
  const nItems = matrix.itemIds.length;
  const nPersons = matrix.personIds.length;
  if (nItems < 2 || nPersons < 2)
    throw new Error('kuderRichardson20 requires at least two items and two persons');
  const correct = new Float64Array(nItems);
  let sum = 0;
  let sumSquares = 0;
  for (let p = 0; p < nPersons; p++) {
    let score = 0;
    for (let i = 0; i < nItems; i++) {
      const x = matrix.scores[p * nItems + i]!;
      if (x === MISSING) throw new Error('kuderRichardson20 requires complete data');
      if (x > 1) throw new Error('kuderRichardson20 requires 0/1 scores');
      correct[i]! += x;
      score += x;
    }
    sum += score;
    sumSquares += score * score;
  }
  const mean = sum / nPersons;
  const variance = sumSquares / nPersons - mean * mean;
  if (!(variance > 0)) throw new Error('kuderRichardson20 requires raw scores that vary');
  let itemVariance = 0;
  for (const c of correct) {
    const p = c / nPersons;
    itemVariance += p * (1 - p);
  }
  return (nItems / (nItems - 1)) * (1 - itemVariance / variance);
}
