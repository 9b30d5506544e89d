import { standardDeviation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { bootstrapAbilityDistributions } from '../../server/reports/bootstrap-ability-distributions.js';
import { percentileInterval } from '../../server/reports/percentile-interval.js';
import { calibrateMml } from '../../server/scoring/rasch/calibrate-mml.js';
import { createRandom, normalSample, simulateRasch, spacedDifficulties } from '../helpers/random.js';

describe('bootstrapAbilityDistributions', () => {
  const random = createRandom(4242);
  const difficulty = spacedDifficulties(16, -2, 2);
  const abilities = new Float64Array([
    ...normalSample(random, 250, 0.4, 1),
    ...normalSample(random, 250, -0.3, 0.8),
  ]);
  const matrix = simulateRasch({ difficulty, abilities, random });
  const groups = {
    index: Int32Array.from(abilities, (_, p) => (p < 250 ? 0 : 1)),
    labels: ['weekend', 'weekday'],
  };
  const anchors = new Map(matrix.itemIds.map((id, i) => [id, difficulty[i]!]));
  const replicates = bootstrapAbilityDistributions(matrix, anchors, groups, { replicates: 120, seed: 9 });

  it('is reproducible under a seed, and gives one distribution per group per replicate', () => {
    expect(replicates).toHaveLength(120);
    expect(replicates[0]!.map((g) => g.label)).toEqual(['weekend', 'weekday']);
    const again = bootstrapAbilityDistributions(matrix, anchors, groups, { replicates: 3, seed: 9 });
    expect(again).toEqual(replicates.slice(0, 3));
  });

  it("its spread of the group means agrees with MML's information-based SE (items fixed) within 30%", () => {
    // Two estimates of the same sampling SD: the bootstrap (Efron & Tibshirani 1993, ch. 6) and the
    // inverse observed information of the anchored MML fit (Louis 1982). 120 replicates estimate an
    // SD to about ±6.5% (1/sqrt(2·119)); 30% leaves room for the asymptotic approximation at n = 250.
    const fit = calibrateMml(matrix, { anchors, groups });
    for (let g = 0; g < 2; g++) {
      const bootstrapSd = standardDeviation(replicates.map((r) => r[g]!.mean));
      const informationSe = fit.groups[g]!.meanStandardError;
      expect(Math.abs(bootstrapSd / informationSe - 1)).toBeLessThan(0.3);
    }
  });

  it('percentile intervals cover the generating means', () => {
    const weekend = percentileInterval(replicates.map((r) => r[0]!.mean));
    const weekday = percentileInterval(replicates.map((r) => r[1]!.mean));
    expect(weekend[0]).toBeLessThan(0.4);
    expect(weekend[1]).toBeGreaterThan(0.4);
    expect(weekday[0]).toBeLessThan(-0.3);
    expect(weekday[1]).toBeGreaterThan(-0.3);
    // And they separate the two cohorts, whose means differ by 0.7 logits.
    expect(weekday[1]).toBeLessThan(weekend[0]);
  });
});

describe('percentileInterval', () => {
  it('matches the doc example and R quantile type 7', () => {
    expect(percentileInterval([1, 2, 3, 4, 5], 0.5)).toEqual([2, 4]);
    // Reference: base R 4.2.2, quantile(1:10, c(0.1, 0.9), type = 7) prints 1.9 and 9.1.
    const [low, high] = percentileInterval([10, 9, 8, 7, 6, 5, 4, 3, 2, 1], 0.8);
    expect(low).toBeCloseTo(1.9, 12);
    expect(high).toBeCloseTo(9.1, 12);
  });

  it('refuses too few values or a bad level', () => {
    expect(() => percentileInterval([1])).toThrow('percentileInterval requires at least two values');
    expect(() => percentileInterval([1, 2], 1)).toThrow('percentileInterval requires a level in (0, 1)');
  });
});
