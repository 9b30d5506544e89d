import { describe, expect, it } from 'vitest';
import { selectResponseMatrix } from '../../../server/scoring/build-response-matrix.js';
import { calibrateCml } from '../../../server/scoring/rasch/calibrate-cml.js';
import { estimateAbilityMle } from '../../../server/scoring/rasch/estimate-ability-mle.js';
import { computeFitStatistics } from '../../../server/scoring/rasch/fit-statistics.js';
import { pointMeasureCorrelation } from '../../../server/scoring/rasch/point-measure-correlation.js';
import { fixtureMatrix, loadFixture, maxAbsDifference, nonExtremeRows } from './erm-fixtures.js';

describe('computeFitStatistics against eRm itemfit/personfit', () => {
  for (const name of ['raschdat1', 'simulated-complete'] as const) {
    const fixture = loadFixture(name);
    const matrix = fixtureMatrix(fixture);
    const rows = nonExtremeRows(matrix);
    const itemFit = fixture.itemFit!;
    const personFit = fixture.personFit!;

    it(`${name}: same inputs as eRm give its mean-squares and Z within 1e-3`, () => {
      // eRm 1.0-2 itemfit(person.parameter(RM(X))): MLE thetas, extreme persons left out
      const abilities = new Float64Array(matrix.personIds.length).fill(Number.NaN);
      rows.forEach((p, k) => {
        abilities[p] = fixture.persons.theta[k]!;
      });
      const fit = computeFitStatistics(matrix, Float64Array.from(fixture.erm.difficulty), abilities);
      expect(maxAbsDifference(fit.items.outfit, itemFit.outfit)).toBeLessThan(1e-3);
      expect(maxAbsDifference(fit.items.infit, itemFit.infit)).toBeLessThan(1e-3);
      expect(maxAbsDifference(fit.items.outfitZ, itemFit.outfitZ)).toBeLessThan(1e-3);
      expect(maxAbsDifference(fit.items.infitZ, itemFit.infitZ)).toBeLessThan(1e-3);
      const persons = (values: Float64Array) => rows.map((p) => values[p]!);
      expect(maxAbsDifference(persons(fit.persons.outfit), personFit.outfit)).toBeLessThan(1e-3);
      expect(maxAbsDifference(persons(fit.persons.infit), personFit.infit)).toBeLessThan(1e-3);
      expect(maxAbsDifference(persons(fit.persons.outfitZ), personFit.outfitZ)).toBeLessThan(1e-3);
      expect(maxAbsDifference(persons(fit.persons.infitZ), personFit.infitZ)).toBeLessThan(1e-3);
    });

    it(`${name}: our own CML + MLE pipeline lands within 1e-3 of eRm's item fit`, () => {
      const cal = calibrateCml(matrix);
      const abilities = new Float64Array(matrix.personIds.length).fill(Number.NaN);
      const nItems = matrix.itemIds.length;
      for (const p of rows) {
        const result = estimateAbilityMle(
          cal.difficulty,
          Array.from(matrix.scores.subarray(p * nItems, (p + 1) * nItems)),
        );
        if (result.kind === 'estimate') abilities[p] = result.estimate;
      }
      const fit = computeFitStatistics(matrix, cal.difficulty, abilities);
      expect(maxAbsDifference(fit.items.outfit, itemFit.outfit)).toBeLessThan(1e-3);
      expect(maxAbsDifference(fit.items.infit, itemFit.infit)).toBeLessThan(1e-3);
      expect(maxAbsDifference(fit.items.infitZ, itemFit.infitZ)).toBeLessThan(1e-3);
    });
  }
});

describe('computeFitStatistics', () => {
  it('matches its doc example and the hand formulas of Wright & Masters (1982)', () => {
    const fit = computeFitStatistics(
      { personIds: ['a', 'b', 'c', 'd'], itemIds: ['x'], scores: Uint8Array.of(1, 1, 0, 0) },
      Float64Array.of(0),
      new Float64Array(4),
    );
    expect([fit.items.outfit[0], fit.items.infit[0]]).toEqual([1, 1]);
    // at P = 0.5, C = W² so q²_infit = 0 and infit Z is undefined: reported as NaN, not a number
    expect(Number.isNaN(fit.items.infitZ[0]!)).toBe(true);
  });

  it('gives a large outfit to a surprising response and is about 1 for model-like data', () => {
    // one very able person failing a very easy item: z² = exp(θ − b) = e^4 (Wright & Masters 1982, ch. 5)
    const fit = computeFitStatistics(
      { personIds: ['a'], itemIds: ['x', 'y'], scores: Uint8Array.of(0, 1) },
      Float64Array.of(-2, 0),
      Float64Array.of(2),
    );
    const p = 1 / (1 + Math.exp(-4));
    const py = 1 / (1 + Math.exp(-2));
    expect(fit.items.outfit[0]).toBeCloseTo(p / (1 - p), 10);
    expect(fit.persons.outfit[0]).toBeCloseTo((p / (1 - p) + (1 - py) / py) / 2, 10);
  });

  it('rejects arrays that do not match the matrix', () => {
    const matrix = { personIds: ['a'], itemIds: ['x'], scores: Uint8Array.of(1) };
    expect(() => computeFitStatistics(matrix, new Float64Array(2), new Float64Array(1))).toThrow(
      'computeFitStatistics requires one difficulty per item',
    );
  });
});

describe('pointMeasureCorrelation', () => {
  it('matches its doc example and a direct Pearson correlation', () => {
    const r = pointMeasureCorrelation(
      { personIds: ['a', 'b', 'c'], itemIds: ['x'], scores: Uint8Array.of(0, 1, 1) },
      Float64Array.of(-1, 0, 1),
    );
    expect(r[0]).toBeCloseTo(Math.sqrt(3) / 2, 14); // cov 1/3, sd_x √(2/9), sd_θ √(2/3)
  });

  it('is positive for every item of model-fitting data and flips sign for a reversed item', () => {
    const fixture = loadFixture('simulated-complete');
    const matrix = fixtureMatrix(fixture);
    const rows = nonExtremeRows(matrix);
    const subset = selectResponseMatrix(matrix, rows);
    const abilities = Float64Array.from(fixture.persons.theta);
    const r = pointMeasureCorrelation(subset, abilities);
    expect(Math.min(...r)).toBeGreaterThan(0.2);
    const flipped = {
      ...subset,
      scores: subset.scores.map((x, k) => (k % subset.itemIds.length === 0 ? 1 - x : x)),
    };
    expect(pointMeasureCorrelation(flipped, abilities)[0]).toBeCloseTo(-r[0]!, 12);
  });
});
