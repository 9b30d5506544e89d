/**
 * Standard normal cumulative distribution function Φ(z), to double precision.
 *
 * Hart's (1968) algorithm 5666 in the form published by West (2005): a ratio of two polynomials
 * times e^(−z²/2) for |z| < 7.07, a continued fraction beyond, and Φ(z) = 1 − Φ(−z) for z > 0.
 * The coefficients were written from memory and are confirmed by the test against base R's
 * `pnorm` (`test/reference/pnorm.json`): absolute error below 1e-15 for |z| ≤ 3.5 and relative
 * error below 1e-7 in the far tail.
 *
 * @see West, G. (2005). Better approximations to cumulative normal functions. Wilmott Magazine,
 *   May 2005, 70–76 (Figure 2, after Hart, J. F., et al. (1968), Computer Approximations, Wiley).
 * @param z a finite number
 * @returns Φ(z) in [0, 1]
 * @throws when z is not finite
 * @example
 * standardNormalCdf(1); // 0.841344746068543
 */
export function standardNormalCdf(z: number): number {
  if (!Number.isFinite(z)) throw new Error('standardNormalCdf requires a finite number');
  const x = Math.abs(z);
  let lowerTail = 0; // Φ(−|z|)
  if (x <= 37) {
    const exponential = Math.exp((-x * x) / 2);
    if (x < 7.07106781186547) {
      let numerator = 3.52624965998911e-2 * x + 0.700383064443688;
      numerator = numerator * x + 6.37396220353165;
      numerator = numerator * x + 33.912866078383;
      numerator = numerator * x + 112.079291497871;
      numerator = numerator * x + 221.213596169931;
      numerator = numerator * x + 220.206867912376;
      let denominator = 8.83883476483184e-2 * x + 1.75566716318264;
      denominator = denominator * x + 16.064177579207;
      denominator = denominator * x + 86.7807322029461;
      denominator = denominator * x + 296.564248779674;
      denominator = denominator * x + 637.333633378831;
      denominator = denominator * x + 793.826512519948;
      denominator = denominator * x + 440.413735824752;
      lowerTail = (exponential * numerator) / denominator;
    } else {
      let fraction = x + 0.65;
      fraction = x + 4 / fraction;
      fraction = x + 3 / fraction;
      fraction = x + 2 / fraction;
      fraction = x + 1 / fraction;
      lowerTail = exponential / fraction / 2.506628274631;
    }
  }
  return z > 0 ? 1 - lowerTail : lowerTail;
}
