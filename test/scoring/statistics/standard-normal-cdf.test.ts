import { describe, expect, it } from 'vitest';
import { standardNormalCdf } from '../../../server/scoring/statistics/standard-normal-cdf.js';
import pnorm from '../../reference/pnorm.json' with { type: 'json' };

describe('standardNormalCdf', () => {
  it('matches base R pnorm within 1e-15 for |z| <= 3.5 (fixture from scripts/reference/normal-cdf.R)', () => {
    // Reference: R `pnorm`, version recorded in test/reference/pnorm.json.
    pnorm.z.forEach((z, i) => {
      expect(Math.abs(standardNormalCdf(z) - pnorm.p[i]!)).toBeLessThan(1e-15);
    });
  });

  it('matches base R pnorm in the far tail to a relative 1e-7', () => {
    pnorm.tail_z.forEach((z, i) => {
      expect(Math.abs(standardNormalCdf(z) / pnorm.tail_p[i]! - 1)).toBeLessThan(1e-7);
    });
  });

  it('matches the doc example', () => {
    expect(standardNormalCdf(1)).toBe(0.841344746068543);
  });

  it('is 0.5 at 0 and symmetric: Φ(−z) = 1 − Φ(z)', () => {
    expect(standardNormalCdf(0)).toBe(0.5);
    for (const z of [0.1, 0.7, 1.3, 2.2, 3.1]) {
      expect(standardNormalCdf(-z) + standardNormalCdf(z)).toBeCloseTo(1, 15);
    }
  });

  it('refuses a non-finite input', () => {
    expect(() => standardNormalCdf(Number.NaN)).toThrow('standardNormalCdf requires a finite number');
  });
});
