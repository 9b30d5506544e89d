import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { agreementTable } from '../../../server/scoring/agreement/agreement-table.js';
import { kappaWeightMatrix, weightedKappa } from '../../../server/scoring/agreement/weighted-kappa.js';

interface KappaValues {
  kappa: number;
  variance: number;
  nullVariance: number;
  observed: number;
  expected: number;
}
const load = (name: string) =>
  JSON.parse(readFileSync(new URL(`../../reference/kappa-${name}.json`, import.meta.url), 'utf8'));

describe('weightedKappa on Cohen (1968)', () => {
  const fixture = load('cohen-1968') as {
    counts: number[][];
    disagreementWeights: number[][];
    weighted: KappaValues;
    unweighted: KappaValues;
  };
  const table = Float64Array.from(fixture.counts.flat());
  const disagreement = fixture.disagreementWeights.flat();
  const agreement = Float64Array.from(disagreement, (v) => 1 - v / 6);

  it('reproduces the published κ = .492 and κ_w = .348', () => {
    // Cohen (1968), Psychological Bulletin 70(4), as transcribed in R psych 2.2.9's cohen.kappa
    // help ("cohen reports .492 and .348"); the paper itself was not read here
    expect(weightedKappa(table, 'none').kappa).toBeCloseTo(0.492, 3);
    expect(weightedKappa(table, agreement).kappa).toBeCloseTo(0.348, 3);
  });

  it('matches the Fleiss-Cohen-Everitt variances computed in base R, and psych for unweighted kappa', () => {
    // scripts/reference/weighted-kappa.R (R 4.2.2); psych 2.2.9 agrees on both kappas and the unweighted variance
    for (const [weights, values] of [
      [agreement, fixture.weighted],
      ['none', fixture.unweighted],
    ] as const) {
      const result = weightedKappa(table, weights);
      expect(result.kappa).toBeCloseTo(values.kappa, 11);
      expect(result.observed).toBeCloseTo(values.observed, 12);
      expect(result.expected).toBeCloseTo(values.expected, 12);
      expect(result.standardError).toBeCloseTo(Math.sqrt(values.variance), 11);
      expect(result.nullStandardError).toBeCloseTo(Math.sqrt(values.nullVariance), 11);
    }
  });
});

describe('weightedKappa on two raters of 0/1/2 rubric scores', () => {
  const fixture = load('simulated') as {
    first: number[];
    second: number[];
    linear: KappaValues;
    quadratic: KappaValues;
  };
  const table = agreementTable(fixture.first, fixture.second, 3);

  it('matches the base R formulas for linear and quadratic weights', () => {
    // scripts/reference/weighted-kappa.R (R 4.2.2); kappa also equals psych::cohen.kappa 2.2.9
    for (const scheme of ['linear', 'quadratic'] as const) {
      const result = weightedKappa(table, scheme);
      expect(result.kappa).toBeCloseTo(fixture[scheme].kappa, 11);
      expect(result.standardError).toBeCloseTo(Math.sqrt(fixture[scheme].variance), 11);
      expect(result.nullStandardError).toBeCloseTo(Math.sqrt(fixture[scheme].nullVariance), 11);
      expect(result.answers).toBe(300);
    }
  });

  it('gives 1 for perfect agreement and builds the named weight matrices', () => {
    expect(weightedKappa(agreementTable([0, 1, 2, 1], [0, 1, 2, 1], 3)).kappa).toBe(1);
    expect(Array.from(kappaWeightMatrix('linear', 3))).toEqual([1, 0.5, 0, 0.5, 1, 0.5, 0, 0.5, 1]);
    expect(Array.from(kappaWeightMatrix('quadratic', 3))).toEqual([1, 0.75, 0, 0.75, 1, 0.75, 0, 0.75, 1]);
  });

  it('rejects scores outside the rubric and mismatched raters', () => {
    expect(() => agreementTable([0, 3], [0, 1], 3)).toThrow('score 3 at answer 2 is outside the rubric 0..2');
    expect(() => agreementTable([0, 1], [0], 3)).toThrow('two scores per answer');
    expect(() => weightedKappa(agreementTable([1, 1], [1, 1], 3))).toThrow('chance agreement is 1');
  });
});
