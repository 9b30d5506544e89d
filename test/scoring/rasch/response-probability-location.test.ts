import { describe, expect, it } from 'vitest';
import { responseProbabilityLocation } from '../../../server/scoring/rasch/response-probability-location.js';

describe('responseProbabilityLocation', () => {
  // Offsets θ_RP − b = ln(RP/(1−RP)) for the RP conventions in use (NAEP item maps 0.65/0.72/0.74,
  // PISA 0.62, bookmark 2/3). Derived values [C], computed from the Rasch formula (check-values.md §9),
  // not published numbers. Tolerance 1e-4.
  it.each([
    [0.5, 0],
    [0.62, 0.4895],
    [0.65, 0.619],
    // biome-ignore lint/suspicious/noApproximativeNumericConstant: the 4-d.p. table value ln 2 is what is checked
    [2 / 3, 0.6931],
    [0.67, 0.7082],
    [0.72, 0.9445],
    [0.74, 1.046],
    [0.8, 1.3863],
  ])('RP %f sits %f logits above the difficulty', (rp, offset) => {
    expect(Math.abs(responseProbabilityLocation(0.25, rp) - 0.25 - offset)).toBeLessThan(1e-4);
  });

  it('matches the doc example', () => {
    expect(responseProbabilityLocation(0, 0.8)).toBe(1.3862943611198908);
  });

  it('a person at θ_RP answers with probability RP under the Rasch model', () => {
    const b = -0.8;
    const theta = responseProbabilityLocation(b, 0.67);
    expect(1 / (1 + Math.exp(-(theta - b)))).toBeCloseTo(0.67, 12);
  });

  it('refuses RP outside (0, 1)', () => {
    expect(() => responseProbabilityLocation(0, 1)).toThrow('strictly between 0 and 1');
    expect(() => responseProbabilityLocation(0, 0)).toThrow('strictly between 0 and 1');
  });
});
