import { describe, expect, it } from 'vitest';
import {
  elementarySymmetricFunctions,
  elementarySymmetricFunctionsWithDerivatives,
  logElementarySymmetricFunctions,
} from '../../../server/scoring/rasch/elementary-symmetric-functions.js';

/** Exact γ_r of integers a_i by the summation algorithm in BigInt arithmetic. */
function exactIntegerEsf(a: readonly bigint[]): bigint[] {
  const g: bigint[] = [1n];
  for (const value of a) {
    g.push(0n);
    for (let r = g.length - 1; r > 0; r--) g[r] = g[r]! + value * g[r - 1]!;
  }
  return g;
}

/** Natural log of a positive BigInt, to about 1e-15 relative. */
function logBigInt(x: bigint): number {
  const bits = x.toString(2).length;
  const shift = Math.max(0, bits - 62);
  return Math.log(Number(x >> BigInt(shift))) + shift * Math.LN2;
}

/** ε_i = a_i / 64 with integer a_i spread over 1..4096, i.e. b_i = −ln(a_i/64) in [−4.16, 4.16]. */
function rationalItems(n: number): { a: bigint[]; difficulties: Float64Array } {
  const a: bigint[] = [];
  const difficulties = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const value = 1 + Math.floor(4095 * ((i * 0.6180339887498949) % 1));
    a.push(BigInt(value));
    difficulties[i] = -Math.log(value / 64);
  }
  return { a, difficulties };
}

describe('elementarySymmetricFunctions', () => {
  it('matches its doc example: ε = (1, 1) gives γ = (1, 2, 1) over Π(1 + ε) = 4', () => {
    const esf = elementarySymmetricFunctions(Float64Array.of(0, 0));
    expect(Array.from(esf.scaled)).toEqual([0.25, 0.5, 0.25]);
    expect(Math.exp(esf.logScale)).toBeCloseTo(4, 14);
    expect(
      Array.from(logElementarySymmetricFunctions(Float64Array.of(0, 0, 0)), Math.exp).map(
        (v) => +v.toFixed(12),
      ),
    ).toEqual([1, 3, 3, 1]);
  });

  it('gives binomial coefficients for equal parameters and the right powers for ε = 2', () => {
    // γ_r of n equal ε is C(n, r) ε^r (common practice, no source: the definition)
    const logs = logElementarySymmetricFunctions(new Float64Array(10).fill(-Math.log(2)));
    const binomial = [1, 10, 45, 120, 210, 252, 210, 120, 45, 10, 1];
    binomial.forEach((c, r) => {
      expect(logs[r]).toBeCloseTo(Math.log(c) + r * Math.log(2), 12);
    });
  });

  it.each([300, 500])('agrees with exact BigInt arithmetic at %i items spread over ±4.16 logits', (n) => {
    // independent high-precision computation: integer ESF of a_i, then γ_r(a/64) = Γ_r / 64^r
    const { a, difficulties } = rationalItems(n);
    const exact = exactIntegerEsf(a);
    const logs = logElementarySymmetricFunctions(difficulties);
    let worst = 0;
    for (let r = 0; r <= n; r++) {
      const expected = logBigInt(exact[r]!) - r * Math.log(64);
      worst = Math.max(worst, Math.abs(logs[r]! - expected) / Math.max(1, Math.abs(expected)));
    }
    expect(worst).toBeLessThan(1e-12);
    expect(logs.every(Number.isFinite)).toBe(true);
  });

  it('keeps first derivatives γ^(i)_{r-1} exact at 300 items', () => {
    const n = 300;
    const { a, difficulties } = rationalItems(n);
    const esf = elementarySymmetricFunctionsWithDerivatives(difficulties);
    for (const i of [0, 17, 150, 299]) {
      const exact = exactIntegerEsf(a.filter((_, k) => k !== i));
      for (const r of [1, 2, 50, 150, 251, 300]) {
        const value = esf.derivatives[i * (n + 1) + r]!;
        const logValue = Math.log(value) + esf.logScale - (r - 1) * esf.shift;
        const expected = logBigInt(exact[r - 1]!) - (r - 1) * Math.log(64);
        expect(Math.abs(logValue - expected) / Math.max(1, Math.abs(expected))).toBeLessThan(1e-12);
      }
    }
  });

  it('satisfies the identities γ_r = γ^(i)_r + ε_i γ^(i)_{r-1} and Σ_i ε_i γ^(i)_{r-1} = r γ_r', () => {
    // identities of the elementary symmetric functions (Fischer & Molenaar 1995, ch. 3, eq. 3.12 and Euler's theorem)
    const difficulties = Float64Array.of(-2.1, -0.4, 0.3, 0.9, 1.7, -1.2, 2.6);
    const n = difficulties.length;
    const esf = elementarySymmetricFunctionsWithDerivatives(difficulties);
    const epsilon = Array.from(difficulties, (b) => Math.exp(-(b - esf.shift)));
    for (let r = 1; r <= n; r++) {
      let sum = 0;
      for (let i = 0; i < n; i++) sum += epsilon[i]! * esf.derivatives[i * (n + 1) + r]!;
      expect(sum).toBeCloseTo(r * esf.scaled[r]!, 14);
      for (let i = 0; i < n; i++) {
        const withoutI = r < n ? esf.derivatives[i * (n + 1) + r + 1]! : 0; // γ^(i)_r
        expect(withoutI + epsilon[i]! * esf.derivatives[i * (n + 1) + r]!).toBeCloseTo(esf.scaled[r]!, 14);
      }
    }
  });

  it('matches its derivative doc example and rejects non-finite input', () => {
    const esf = elementarySymmetricFunctionsWithDerivatives(Float64Array.of(0, 0, 0));
    expect(Array.from(esf.derivatives.subarray(0, 4), (d) => d * 8)).toEqual([0, 1, 2, 1]);
    expect(() => elementarySymmetricFunctions(Float64Array.of(0, Number.NaN))).toThrow(
      'elementarySymmetricFunctions requires finite difficulties',
    );
  });
});
