import { describe, expect, it } from 'vitest';
import {
  chiSquaredUpperTail,
  regularizedGammaUpper,
} from '../../../server/scoring/statistics/chi-squared-upper-tail.js';
import { logGamma } from '../../../server/scoring/statistics/log-gamma.js';

describe('logGamma', () => {
  it('matches factorials and Γ(1/2) = √π', () => {
    // Γ(n) = (n−1)! and Γ(1/2) = √π (Abramowitz & Stegun 1964, 6.1.6 and 6.1.8)
    expect(logGamma(5)).toBeCloseTo(Math.log(24), 13);
    expect(logGamma(21)).toBeCloseTo(Math.log(2432902008176640000), 12);
    expect(logGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 13);
    expect(logGamma(0.1)).toBeCloseTo(2.252712651734206, 12); // ln Γ(0.1), A&S table 6.1 gives Γ(0.1) = 9.513507699
    expect(() => logGamma(0)).toThrow('logGamma requires a positive finite argument');
  });
});

describe('chiSquaredUpperTail', () => {
  it.each([
    // critical values printed in the NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.4
    // (upper-tail chi-square table, 3 d.p.); the p-value at a 3-d.p. critical value is within 2e-4
    [3.841, 1, 0.05],
    [6.635, 1, 0.01],
    [10.828, 1, 0.001],
    [5.991, 2, 0.05],
    [11.07, 5, 0.05],
    [18.307, 10, 0.05],
    [43.773, 30, 0.05],
    [124.342, 100, 0.05],
  ])('gives p ≈ table value for x = %d, df = %d', (x, df, p) => {
    expect(Math.abs(chiSquaredUpperTail(x, df) - p)).toBeLessThan(2e-4 * Math.max(1, p / 0.01));
  });

  it.each([
    // R 4.2.2 pchisq(x, df, lower.tail = FALSE) (Debian r-base-core), 15 significant digits
    [3.841458820694124, 1, 0.05],
    [18.307038053275146, 10, 0.05],
    [124.342, 100, 0.0500007157699718],
    [0.5, 7, 0.9994464813904251],
    [250, 200, 0.0093791316688261],
    [0.001, 3, 0.999991592080942],
    [40, 3, 1.06550903342559e-8],
  ])('agrees with R pchisq at x = %d, df = %d', (x, df, p) => {
    expect(Math.abs(chiSquaredUpperTail(x, df) - p) / p).toBeLessThan(1e-10);
  });

  it('has the closed forms for 1 and 2 degrees of freedom and its doc examples', () => {
    // df = 2: P(X ≥ x) = e^{−x/2} (A&S 26.4.21 with ν = 2)
    for (const x of [0.1, 1, 7.3, 30]) expect(chiSquaredUpperTail(x, 2)).toBeCloseTo(Math.exp(-x / 2), 14);
    expect(regularizedGammaUpper(1, 2)).toBeCloseTo(0.1353352832366127, 15);
    expect(chiSquaredUpperTail(0, 4)).toBe(1);
    expect(() => chiSquaredUpperTail(-1, 4)).toThrow('chiSquaredUpperTail requires a non-negative statistic');
    expect(() => chiSquaredUpperTail(1, 0)).toThrow(
      'chiSquaredUpperTail requires positive degrees of freedom',
    );
  });
});
