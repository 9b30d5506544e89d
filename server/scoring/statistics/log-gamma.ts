/**
 * Natural logarithm of the gamma function for x > 0, by the Lanczos approximation with g = 7 and
 * nine coefficients (relative error about 1e-15), with the reflection formula below 0.5.
 *
 * @see Lanczos, C. (1964). A precision approximation of the gamma function. SIAM Journal on
 *   Numerical Analysis B 1, 86-96.
 * @see Godfrey, P. (2001). A note on the computation of the convergent Lanczos complex gamma
 *   approximation (the g = 7, n = 9 coefficients used here; from memory).
 * @param x a positive number.
 * @returns ln Γ(x).
 * @throws if x is not positive and finite.
 * @example
 * logGamma(5); // ln 24 = 3.1780538303479458
 */
export function logGamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new Error('logGamma requires a positive finite argument');
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const z = x - 1;
  let sum = COEFFICIENTS[0]!;
  for (let k = 1; k < COEFFICIENTS.length; k++) sum += COEFFICIENTS[k]! / (z + k);
  const t = z + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

const COEFFICIENTS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
] as const;
