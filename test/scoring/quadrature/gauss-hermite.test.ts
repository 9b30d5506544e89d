import { describe, expect, it } from 'vitest';
import { gaussHermite, normalQuadrature } from '../../../server/scoring/quadrature/gauss-hermite.js';

// Abramowitz & Stegun (1964), Table 25.10 (from Salzer, Zucker & Capuano 1952), positive nodes
// and their weights; the negative nodes mirror them. Values as listed in check-values.md section 11.
const TABLE_25_10: Record<number, ReadonlyArray<readonly [number, number]>> = {
  5: [
    [0, 0.945308720482942],
    [0.958572464613819, 0.393619323152241],
    [2.020182870456086, 0.019953242059046],
  ],
  10: [
    [0.342901327223705, 0.610862633735326],
    [1.036610829789514, 0.240138611082315],
    [1.756683649299882, 0.033874394455481],
    [2.53273167423279, 0.001343645746781],
    [3.436159118837738, 7.640432855233e-6],
  ],
};

describe('gaussHermite', () => {
  for (const [n, rows] of Object.entries(TABLE_25_10)) {
    it(`matches Abramowitz & Stegun Table 25.10 for n=${n} within 1e-12`, () => {
      const size = Number(n);
      const { nodes, weights } = gaussHermite(size);
      const start = size - rows.length;
      rows.forEach(([x, w], k) => {
        // Ascending order: the upper half holds the table's non-negative nodes.
        expect(Math.abs(nodes[start + k]! - x)).toBeLessThan(1e-12);
        expect(Math.abs(weights[start + k]! - w)).toBeLessThan(1e-12);
        // Symmetry of the rule (A&S list only x >= 0 for that reason).
        expect(nodes[size - 1 - start - k]).toBeCloseTo(-x, 14);
        expect(weights[size - 1 - start - k]).toBeCloseTo(w, 14);
      });
    });
  }

  it('has weights summing to √π (the integral of e^(−x²)) for 1..200 points', () => {
    for (const n of [1, 2, 3, 7, 20, 41, 80, 200]) {
      const { weights } = gaussHermite(n);
      const sum = weights.reduce((a, b) => a + b, 0);
      // Check value: sqrt(pi) = 1.7724538509055159 (check-values.md section 11).
      expect(Math.abs(sum - 1.7724538509055159)).toBeLessThan(1e-13);
    }
  });

  it('integrates polynomials up to degree 2n−1 exactly with the 41-point default', () => {
    // ∫ x^(2k) e^(−x²) dx = Γ(k + 1/2) = (2k−1)!! √π / 2^k  (A&S 6.1.12, 25.4.46).
    const { nodes, weights } = gaussHermite(41);
    let doubleFactorial = 1;
    for (let k = 1; k <= 20; k++) {
      doubleFactorial *= 2 * k - 1;
      const exact = (doubleFactorial * Math.sqrt(Math.PI)) / 2 ** k;
      let sum = 0;
      for (let i = 0; i < 41; i++) sum += weights[i]! * nodes[i]! ** (2 * k);
      expect(Math.abs(sum / exact - 1)).toBeLessThan(1e-11);
    }
    // An odd moment vanishes by symmetry.
    let odd = 0;
    for (let i = 0; i < 41; i++) odd += weights[i]! * nodes[i]! ** 3;
    expect(Math.abs(odd)).toBeLessThan(1e-12);
  });

  it('rejects a non-integer or out-of-range size', () => {
    expect(() => gaussHermite(0)).toThrow('gaussHermite requires');
    expect(() => gaussHermite(2.5)).toThrow('gaussHermite requires');
    expect(() => gaussHermite(201)).toThrow('gaussHermite requires');
  });
});

describe('normalQuadrature', () => {
  it('gives the closed-form 5-point rule for N(0,1)', () => {
    // Derived from A&S Table 25.10 with nodes √2·x, weights w/√π (check-values.md section 11):
    // nodes 0, ±√(5∓√10); weights 8/15, (7 ± 2√10)/60.
    const { nodes, weights } = normalQuadrature(5);
    expect(nodes[2]).toBe(0);
    expect(nodes[3]).toBeCloseTo(Math.sqrt(5 - Math.sqrt(10)), 13);
    expect(nodes[4]).toBeCloseTo(Math.sqrt(5 + Math.sqrt(10)), 13);
    expect(weights[2]).toBeCloseTo(8 / 15, 14);
    expect(weights[3]).toBeCloseTo((7 + 2 * Math.sqrt(10)) / 60, 14);
    expect(weights[4]).toBeCloseTo((7 - 2 * Math.sqrt(10)) / 60, 14);
  });

  it('reproduces the mean, variance and fourth moment of N(mu, sd)', () => {
    const { nodes, weights } = normalQuadrature(41, 0.7, 1.3);
    let m1 = 0;
    let m2 = 0;
    let m4 = 0;
    for (let i = 0; i < 41; i++) {
      m1 += weights[i]! * nodes[i]!;
      m2 += weights[i]! * (nodes[i]! - 0.7) ** 2;
      m4 += weights[i]! * (nodes[i]! - 0.7) ** 4;
    }
    expect(m1).toBeCloseTo(0.7, 12);
    expect(m2).toBeCloseTo(1.3 ** 2, 12);
    // Fourth central moment of a normal is 3σ⁴ (common practice, no source).
    expect(m4).toBeCloseTo(3 * 1.3 ** 4, 11);
  });

  it('rejects a non-positive sd', () => {
    expect(() => normalQuadrature(41, 0, 0)).toThrow('normalQuadrature requires');
  });

  it('hands out copies of the computed rule, so changing one leaves the next call intact', () => {
    const first = gaussHermite(5);
    first.nodes[2] = 99;
    first.weights[2] = 99;
    const second = gaussHermite(5);
    // A&S Table 25.10, n = 5: the middle node is 0 with weight 0.945308720482942.
    expect(second.nodes[2]).toBe(0);
    expect(second.weights[2]).toBeCloseTo(0.945308720482942, 14);
  });
});
