import { describe, expect, it } from 'vitest';
import { calibrateCml } from '../../../server/scoring/rasch/calibrate-cml.js';
import { calibrateLltm, LltmDesignError } from '../../../server/scoring/rasch/calibrate-lltm.js';
import { fixtureMatrix, loadFixture, maxAbsDifference } from './erm-fixtures.js';
import { lltmInputs, loadLltmFixture } from './lltm-fixtures.js';

const centre = (v: ArrayLike<number>) => {
  const values = Array.from(v);
  const mean = values.reduce((a, b) => a + b, 0) / values.length;
  return values.map((x) => x - mean);
};

describe('calibrateLltm against eRm LLTM', () => {
  for (const name of ['lltmdat2', 'lltmdat1', 'simulated']) {
    it(`${name}: η, SE(η), log-likelihood and LR test within 1e-3 of eRm 1.0-2`, () => {
      // eRm LLTM reports easiness, betapar = W etapar; our η are difficulty weights, so η = −etapar.
      // eRm's betapar carry no constant, ours are centred: compare −betapar after centring.
      const fixture = loadLltmFixture(name);
      const { matrix, design } = lltmInputs(fixture);
      const fit = calibrateLltm(matrix, design);
      expect(fit.converged).toBe(true);
      expect(
        maxAbsDifference(
          fit.weights,
          fixture.erm.etapar.map((e) => -e),
        ),
      ).toBeLessThan(1e-3);
      expect(maxAbsDifference(fit.weightStandardErrors, fixture.erm.seEta)).toBeLessThan(1e-3);
      expect(maxAbsDifference(fit.difficulty, centre(fixture.erm.betapar.map((b) => -b)))).toBeLessThan(1e-3);
      expect(Math.abs(fit.logLikelihood - fixture.erm.logLikelihood)).toBeLessThan(1e-3);
      expect(Math.abs(fit.rasch.logLikelihood - fixture.rasch.logLikelihood)).toBeLessThan(1e-3);
      // LR = 2 (log L_RM − log L_LLTM) from eRm's two log-likelihoods (the deviance difference of
      // eRm's anova(RM, LLTM)); eRm 1.0-2's anova prints half of it as "LR" (no factor 2), so the
      // statistic here is twice that column. df = npar(RM) − npar(LLTM) = (I − 1) − p as in eRm.
      expect(Math.abs(fit.likelihoodRatio.statistic - fixture.likelihoodRatio.statistic)).toBeLessThan(2e-3);
      expect(fit.likelihoodRatio.statistic / 2).toBeCloseTo(fixture.likelihoodRatio.ermAnovaLR, 2);
      expect(fit.likelihoodRatio.degreesOfFreedom).toBe(fixture.likelihoodRatio.df);
      expect(Math.abs(fit.likelihoodRatio.pValue - fixture.likelihoodRatio.pValue)).toBeLessThan(1e-3);
    });
  }

  it('lltmdat2 matches its doc example', () => {
    const fit = calibrateLltm(...(Object.values(lltmInputs(loadLltmFixture('lltmdat2'))) as [never, never]));
    expect(fit.weights[0]).toBeCloseTo(0.0978, 4);
    expect(fit.weights[1]).toBeCloseTo(-0.1141, 4);
    expect(fit.likelihoodRatio.statistic).toBeCloseTo(1.049, 3);
  });
});

describe('calibrateLltm with a saturated design', () => {
  it('reproduces the Rasch CML when W is the identity on I − 1 items (the constant takes the last)', () => {
    // check-values §10 [C]: a full-rank W gives the Rasch CML; LR = 0 on 0 df
    const matrix = fixtureMatrix(loadFixture('raschdat1'));
    const n = matrix.itemIds.length;
    const weights = new Float64Array(n * (n - 1));
    for (let j = 0; j < n - 1; j++) weights[j * (n - 1) + j] = 1;
    const fit = calibrateLltm(matrix, {
      featureNames: matrix.itemIds.slice(0, n - 1),
      weights,
    });
    const rasch = calibrateCml(matrix);
    expect(maxAbsDifference(fit.difficulty, rasch.difficulty)).toBeLessThan(1e-7);
    expect(maxAbsDifference(fit.difficultyStandardError, rasch.standardError)).toBeLessThan(1e-6);
    expect(fit.logLikelihood).toBeCloseTo(rasch.logLikelihood, 7);
    expect(fit.likelihoodRatio.statistic).toBeLessThan(1e-6);
    expect(fit.likelihoodRatio.degreesOfFreedom).toBe(0);
  });
});

describe('calibrateLltm bad designs', () => {
  const { matrix } = lltmInputs(loadLltmFixture('simulated'));
  const build = (names: string[], column: (item: number) => number[]) => ({
    featureNames: names,
    weights: Float64Array.from(Array.from({ length: 12 }, (_, i) => column(i)).flat()),
  });

  it('names one-hot features that sum to the constant', () => {
    const design = build(['bar', 'line', 'pie', 'marks'], (i) => [
      i % 3 === 0 ? 1 : 0,
      i % 3 === 1 ? 1 : 0,
      i % 3 === 2 ? 1 : 0,
      i,
    ]);
    let error: unknown;
    try {
      calibrateLltm(matrix, design);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(LltmDesignError);
    expect((error as LltmDesignError).message).toBe(
      'calibrateLltm design matrix is singular: feature "pie" is a linear combination of the constant and "bar", "line"',
    );
    expect((error as LltmDesignError).features).toEqual(['pie', 'bar', 'line']);
  });

  it('names a feature shared by every item and a feature that doubles another', () => {
    expect(() =>
      calibrateLltm(
        matrix,
        build(['marks', 'legend'], (i) => [i, 1]),
      ),
    ).toThrow('feature "legend" is the same for every item (collinear with the constant)');
    // 0.7 averaged over 12 items is not exactly 0.7 in floating point: the centred column is rounding
    // noise (about 1e-16), not zeros, and must still count as constant
    expect(() =>
      calibrateLltm(
        matrix,
        build(['marks', 'legend'], (i) => [i, 0.7]),
      ),
    ).toThrow('feature "legend" is the same for every item (collinear with the constant)');
    expect(() =>
      calibrateLltm(
        matrix,
        build(['marks', 'series', 'ink'], (i) => [i, i % 2, 2 * i + 3]),
      ),
    ).toThrow('feature "ink" is a linear combination of the constant and "marks"');
  });

  it('rejects more features than items can carry and a design of the wrong shape', () => {
    expect(() => calibrateLltm(matrix, { featureNames: ['a'], weights: new Float64Array(5) })).toThrow(
      'weights of length items × features',
    );
  });
});
