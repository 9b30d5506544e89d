/**
 * Category probabilities of one item under the partial credit model (PCM):
 * P(X = x | θ) = exp Σ_{k=0..x}(θ − δ_k) / Σ_{h=0..m} exp Σ_{k=0..h}(θ − δ_k), with the k = 0 term 0.
 * The δ_k are the step (threshold) difficulties; a dichotomous item is the case m = 1, δ_1 = b.
 * Computed with the largest exponent subtracted, so no term overflows.
 *
 * @see Masters, G. N. (1982). A Rasch model for partial credit scoring. Psychometrika 47(2),
 *   149-174, eq. 3.
 * @see de Ayala, R. J. (2009). The Theory and Practice of Item Response Theory. Guilford, p. 204
 *   (worked example θ = 0, δ = (−1, 1); read in a secondary source, check-values §10).
 * @param theta ability, logits.
 * @param steps δ_1..δ_m, logits.
 * @returns P(X = 0..m), summing to 1.
 * @throws when there is no step or a value is not finite.
 * @example
 * Array.from(pcmCategoryProbabilities(0, Float64Array.of(-1, 1))); // [0.2119416, 0.5761169, 0.2119416] (7 d.p.)
 */
export function pcmCategoryProbabilities(theta: number, steps: ArrayLike<number>): Float64Array {
  const m = steps.length;
  if (m === 0) throw new Error('pcmCategoryProbabilities requires at least one step');
  if (!Number.isFinite(theta)) throw new Error('pcmCategoryProbabilities requires a finite ability');
  const exponents = new Float64Array(m + 1);
  let largest = 0;
  for (let x = 1; x <= m; x++) {
    const step = steps[x - 1]!;
    if (!Number.isFinite(step)) throw new Error('pcmCategoryProbabilities requires finite steps');
    exponents[x] = exponents[x - 1]! + theta - step;
    largest = Math.max(largest, exponents[x]!);
  }
  let total = 0;
  for (let x = 0; x <= m; x++) {
    exponents[x] = Math.exp(exponents[x]! - largest);
    total += exponents[x]!;
  }
  for (let x = 0; x <= m; x++) exponents[x] = exponents[x]! / total;
  return exponents;
}
