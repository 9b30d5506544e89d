import { describe, expect, it } from 'vitest';
import { calibrateLltm, type LltmCalibration } from '../../../server/scoring/rasch/calibrate-lltm.js';
import { lltmResidualVariance, predictDifficulty } from '../../../server/scoring/rasch/predict-difficulty.js';
import type { ItemCalibration } from '../../../server/scoring/rasch/types.js';
import { lltmInputs, loadLltmFixture } from './lltm-fixtures.js';

/** A one-feature fit built by hand: η = 0.5, SE 0.1, feature mean 2 over four items. */
function handFit(): LltmCalibration {
  const rasch: ItemCalibration = {
    method: 'cml',
    itemIds: ['a', 'b', 'c', 'd'],
    difficulty: Float64Array.of(-0.9, -0.2, 0.6, 0.5),
    standardError: Float64Array.of(0.1, 0.1, 0.1, 0.1),
    logLikelihood: 0,
    iterations: 1,
    converged: true,
    excludedItems: [],
    excludedPersons: [],
  };
  return {
    featureNames: ['marks'],
    weights: Float64Array.of(0.5),
    weightStandardErrors: Float64Array.of(0.1),
    weightCovariance: Float64Array.of(0.01),
    featureMeans: Float64Array.of(2),
    itemIds: ['a', 'b', 'c', 'd'],
    difficulty: Float64Array.of(-0.75, -0.25, 0.25, 0.75),
    difficultyStandardError: Float64Array.of(0.15, 0.05, 0.05, 0.15),
    logLikelihood: 0,
    rasch,
    likelihoodRatio: { statistic: 0, degreesOfFreedom: 2, pValue: 1 },
    iterations: 1,
    converged: true,
    excludedItems: [],
    excludedPersons: [],
  };
}

describe('lltmResidualVariance', () => {
  it('is the residual mean square on I − p − 1 df minus the mean squared Rasch SE', () => {
    // residuals (−0.15, 0.05, 0.35, −0.25): squares sum 0.21, /(4 − 1 − 1) = 0.105, minus 0.01
    expect(lltmResidualVariance(handFit())).toBeCloseTo(0.095, 12);
  });
});

describe('predictDifficulty', () => {
  it('matches its doc example and adds the residual variance to the prediction interval', () => {
    const prediction = predictDifficulty(handFit(), [4], { residualVariance: 0.05 });
    expect(prediction.basis).toBe('model-based');
    expect(prediction.difficulty).toBeCloseTo(1, 12);
    expect(prediction.standardError).toBeCloseTo(0.2, 12);
    expect(prediction.predictionStandardError).toBeCloseTo(0.3, 12);
    // z_0.975 = 1.959964 (Abramowitz & Stegun Table 26.5)
    expect(prediction.predictionInterval[0]).toBeCloseTo(1 - 1.959964 * 0.3, 5);
    expect(prediction.confidenceInterval[1]).toBeCloseTo(1 + 1.959964 * 0.2, 5);
    expect(
      predictDifficulty(handFit(), [4], { residualVariance: 0.05, level: 0.9 }).predictionInterval[1],
    ).toBeCloseTo(1 + 1.644854 * 0.3, 5);
  });

  it('places the RP67 location 0.7082 above the difficulty and gives the audience share', () => {
    // check-values §9: RP 0.67 offset 0.7082 (derived); share = 1 − Φ(1.7082) for N(0, 1)
    const prediction = predictDifficulty(handFit(), [4], {
      residualVariance: 0,
      audience: { mean: 0, sd: 1 },
    });
    expect(prediction.rpLocation).toBeCloseTo(1.7082, 4);
    expect(prediction.audienceShare!.estimate).toBeCloseTo(0.0438, 4); // pnorm(1.7082, lower = FALSE), R 4.2.2
    const [low, high] = prediction.audienceShare!.interval;
    expect(low).toBeLessThan(prediction.audienceShare!.estimate);
    expect(high).toBeGreaterThan(prediction.audienceShare!.estimate);
    expect(predictDifficulty(handFit(), [4]).audienceShare).toBeNull();
  });

  it('reproduces the fitted difficulty of a calibrated item from its own features', () => {
    const fixture = loadLltmFixture('simulated');
    const { matrix, design } = lltmInputs(fixture);
    const fit = calibrateLltm(matrix, design);
    for (let i = 0; i < 12; i++) {
      const prediction = predictDifficulty(fit, fixture.design[i]!);
      expect(prediction.difficulty).toBeCloseTo(fit.difficulty[i]!, 12);
      expect(prediction.standardError).toBeCloseTo(fit.difficultyStandardError[i]!, 12);
      expect(prediction.predictionStandardError).toBeGreaterThan(prediction.standardError);
    }
  });

  it('rejects a feature vector of the wrong length or with a non-finite value', () => {
    expect(() => predictDifficulty(handFit(), [1, 2])).toThrow('one value per feature');
    expect(() => predictDifficulty(handFit(), [Number.NaN])).toThrow('finite feature values');
    expect(() => predictDifficulty(handFit(), [1], { level: 1 })).toThrow('level between 0 and 1');
  });
});
