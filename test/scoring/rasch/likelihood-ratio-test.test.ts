import { describe, expect, it } from 'vitest';
import { likelihoodRatioTest, medianSplit } from '../../../server/scoring/rasch/likelihood-ratio-test.js';
import { fixtureMatrix, fixtureNames, loadFixture } from './erm-fixtures.js';

describe('likelihoodRatioTest against eRm LRtest(splitcr = "median")', () => {
  for (const name of fixtureNames) {
    it(`${name}: statistic within 1e-2, same df, p within 1e-3`, () => {
      // eRm 1.0-2 LRtest; for data with missing cells eRm splits at the median within each missing pattern
      const fixture = loadFixture(name);
      const result = likelihoodRatioTest(fixtureMatrix(fixture));
      expect(Math.abs(result.statistic - fixture.likelihoodRatio.statistic)).toBeLessThan(1e-2);
      expect(result.degreesOfFreedom).toBe(fixture.likelihoodRatio.df);
      expect(Math.abs(result.pValue - fixture.likelihoodRatio.pValue)).toBeLessThan(1e-3);
    });
  }

  it('drops items a group cannot estimate, as eRm does (simulated-booklets: I05, I06, I07)', () => {
    // eRm 1.0-2 LRtest warned "The following items were excluded ... I05 I06 I07" on this set
    expect(likelihoodRatioTest(fixtureMatrix(loadFixture('simulated-booklets'))).excludedItems).toEqual([
      'I05',
      'I06',
      'I07',
    ]);
  });
});

describe('likelihoodRatioTest', () => {
  it('accepts a supplied grouping and is near zero when both groups are the same data', () => {
    const matrix = fixtureMatrix(loadFixture('raschdat1'));
    const n = matrix.personIds.length;
    // duplicate the data: group 0 = original, group 1 = copy; identical group estimates give LR = 0
    const doubled = {
      personIds: [...matrix.personIds, ...matrix.personIds.map((id) => `${id}b`)],
      itemIds: matrix.itemIds,
      scores: Uint8Array.from([...matrix.scores, ...matrix.scores]),
    };
    const groups = Int32Array.from({ length: 2 * n }, (_, p) => (p < n ? 0 : 1));
    const result = likelihoodRatioTest(doubled, { groups });
    expect(result.statistic).toBeCloseTo(0, 6);
    expect(result.degreesOfFreedom).toBe(29);
    expect(result.pValue).toBeCloseTo(1, 6);
  });

  it('splits above the median against the rest', () => {
    const labels = medianSplit({
      personIds: ['a', 'b', 'c', 'd'],
      itemIds: ['x', 'y'],
      scores: Uint8Array.of(0, 0, 1, 0, 1, 0, 1, 1),
    });
    expect(Array.from(labels)).toEqual([0, 0, 0, 1]); // scores 0, 1, 1, 2; median 1
    expect(() =>
      likelihoodRatioTest({ personIds: ['a'], itemIds: ['x'], scores: Uint8Array.of(1) }, { groups: [0] }),
    ).toThrow('likelihoodRatioTest requires at least two groups');
  });
});
