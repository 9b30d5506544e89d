import { describe, expect, it } from 'vitest';
import { expectedShareCorrect } from '../../server/reports/expected-share-correct.js';
import { shareAtOrAbove } from '../../server/scoring/statistics/share-at-or-above.js';
import { createRandom, normalSample } from '../helpers/random.js';
import pnorm from '../reference/pnorm.json' with { type: 'json' };

const logistic = (x: number) => 1 / (1 + Math.exp(-x));

describe('expectedShareCorrect', () => {
  it('is 0.5 when the item sits at the mean ability (symmetry of the logistic and the normal)', () => {
    expect(expectedShareCorrect([0.4], { mean: 0.4, sd: 1.3 })).toBeCloseTo(0.5, 12);
  });

  it('equals the plain Rasch probability when the audience has no spread', () => {
    expect(expectedShareCorrect([-1, 0.5], { mean: 0.2, sd: 0 })).toBeCloseTo(
      (logistic(1.2) + logistic(-0.3)) / 2,
      12,
    );
  });

  it('agrees with a Monte Carlo simulation within 4 simulation standard errors', () => {
    const difficulties = [-1.5, -0.2, 0.9, 2.1];
    const distribution = { mean: 0.3, sd: 1.4 };
    const random = createRandom(7001);
    const n = 200_000;
    const thetas = normalSample(random, n, distribution.mean, distribution.sd);
    let sum = 0;
    let sumSquares = 0;
    for (const theta of thetas) {
      let p = 0;
      for (const b of difficulties) p += logistic(theta - b);
      p /= difficulties.length;
      sum += p;
      sumSquares += p * p;
    }
    const mean = sum / n;
    const standardError = Math.sqrt((sumSquares / n - mean * mean) / n);
    const quadrature = expectedShareCorrect(difficulties, distribution);
    expect(Math.abs(quadrature - mean)).toBeLessThan(4 * standardError);
    // The tolerance is meaningful: far smaller than the gap to a wrong answer such as the
    // probability of a person at the mean ability, which ignores the spread.
    expect(4 * standardError).toBeLessThan(2e-3);
    const hard = { mean: 0.3, sd: 1.4 };
    expect(expectedShareCorrect([2.1], hard) - logistic(0.3 - 2.1)).toBeGreaterThan(0.05);
  });

  it('agrees with a fine trapezoid integration to 1e-9 (41 points)', () => {
    const distribution = { mean: -0.4, sd: 0.9 };
    const b = 0.7;
    let integral = 0;
    const step = 0.001;
    for (let z = -10; z <= 10; z += step) {
      const density = Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
      integral += step * density * logistic(distribution.mean + distribution.sd * z - b);
    }
    expect(Math.abs(expectedShareCorrect([b], distribution) - integral)).toBeLessThan(1e-9);
  });
});

describe('shareAtOrAbove', () => {
  it('is 1 − Φ((θ₀ − μ)/σ): one SD above the mean leaves 1 − pnorm(1) (R)', () => {
    const pnormAt1 = pnorm.p[pnorm.z.indexOf(1)]!; // base R pnorm(1), test/reference/pnorm.json
    expect(shareAtOrAbove(1.5, { mean: 0.5, sd: 1 })).toBeCloseTo(1 - pnormAt1, 6);
    expect(shareAtOrAbove(0, { mean: 0, sd: 1 })).toBe(0.5);
  });

  it('matches the share of a large simulated normal audience', () => {
    const random = createRandom(99);
    const n = 100_000;
    const thetas = normalSample(random, n, -0.2, 1.1);
    const location = 0.6;
    const simulated = thetas.filter((t) => t >= location).length / n;
    const expected = shareAtOrAbove(location, { mean: -0.2, sd: 1.1 });
    // Binomial SE of a simulated share; 4 SE.
    expect(Math.abs(simulated - expected)).toBeLessThan(4 * Math.sqrt((expected * (1 - expected)) / n));
  });

  it('treats SD 0 as a point mass', () => {
    expect(shareAtOrAbove(0.1, { mean: 0.2, sd: 0 })).toBe(1);
    expect(shareAtOrAbove(0.3, { mean: 0.2, sd: 0 })).toBe(0);
  });
});
