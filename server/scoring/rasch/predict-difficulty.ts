import { type AbilityDistribution, shareAtOrAbove } from '../statistics/share-at-or-above.js';
import { standardNormalCdf } from '../statistics/standard-normal-cdf.js';
import type { LltmCalibration } from './calibrate-lltm.js';
import { responseProbabilityLocation } from './response-probability-location.js';

export interface PredictDifficultyOptions {
  /** Coverage of the intervals. Default 0.95. */
  readonly level?: number;
  /** Variance of true difficulties around the LLTM line. Default {@link lltmResidualVariance} of the fit. */
  readonly residualVariance?: number;
  /** Ability distribution of an audience (logits) for the share able to read the planned item. */
  readonly audience?: AbilityDistribution;
  /** Response probability that counts as "able to read". Default 0.67. */
  readonly rp?: number;
}

export interface DifficultyPrediction {
  /** Always 'model-based': a prediction from design features, not a measured difficulty. */
  readonly basis: 'model-based';
  /** b̂ = (x − w̄)ᵀη̂, logits on the calibration's mean-zero scale. */
  readonly difficulty: number;
  /** √((x − w̄)ᵀ Cov(η̂) (x − w̄)): uncertainty of the LLTM line at x. */
  readonly standardError: number;
  /** √(SE² + σ²_res): uncertainty of one new item's difficulty. */
  readonly predictionStandardError: number;
  readonly residualVariance: number;
  readonly level: number;
  /** Interval for the line at x (estimation error only). */
  readonly confidenceInterval: readonly [number, number];
  /** Interval for a new item with these features (estimation error plus item residual). */
  readonly predictionInterval: readonly [number, number];
  /** θ at which P(right) = rp for the predicted difficulty. */
  readonly rpLocation: number;
  /** Share of the audience at or above the RP location, with the shares at the prediction-interval ends. */
  readonly audienceShare: { readonly estimate: number; readonly interval: readonly [number, number] } | null;
}

/**
 * Variance of true item difficulties around the LLTM prediction, by moments:
 * σ²_res = max(0, Σ_i (b̂_i^Rasch − b_i^LLTM)² / (I − p − 1) − mean_i SE(b̂_i^Rasch)²).
 * A Rasch estimate is b_i + error (variance SE_i²) and b_i is the LLTM line plus an item
 * residual (variance σ²), so the residual mean square estimates σ² plus the mean squared SE.
 *
 * @see Janssen, R., Schepers, J., & Peres, D. (2004). Models with item and item group predictors.
 *   In P. De Boeck & M. Wilson (Eds.), Explanatory Item Response Models, ch. 6 (the LLTM with a
 *   random item residual; from memory for the chapter).
 * @param lltm a fit from calibrateLltm (its Rasch calibration covers the same items).
 * @returns σ²_res in logits²; 0 when the design is saturated (I − p − 1 ≤ 0).
 * @example
 * lltmResidualVariance(fit); // see test/scoring/rasch/predict-difficulty.test.ts
 */
export function lltmResidualVariance(lltm: LltmCalibration): number {
  const n = lltm.itemIds.length;
  const freedom = n - lltm.weights.length - 1;
  if (freedom <= 0) return 0;
  const raschIndex = new Map(lltm.rasch.itemIds.map((id, k) => [id, k]));
  let squares = 0;
  let errors = 0;
  lltm.itemIds.forEach((id, i) => {
    const k = raschIndex.get(id);
    if (k === undefined)
      throw new Error(`lltmResidualVariance item ${id} is missing from the Rasch calibration`);
    squares += (lltm.rasch.difficulty[k]! - lltm.difficulty[i]!) ** 2;
    errors += lltm.rasch.standardError[k]! ** 2;
  });
  return Math.max(0, squares / freedom - errors / n);
}

/**
 * Predicted difficulty of a planned item from its design features under a fitted LLTM, with a
 * standard error, a prediction interval and the share of an audience likely to read it.
 *
 * The standard error of the line is the delta-method √(x̃ᵀ Cov(η̂) x̃), x̃ = x − w̄. It would shrink
 * to zero with endless data, but a new item's true difficulty would not: items with the same
 * features differ (wording, data, layout), and the LR test of the LLTM against the Rasch model
 * usually says so. The prediction interval therefore adds the residual item variance σ²_res
 * between the Rasch and LLTM difficulties ({@link lltmResidualVariance}): b_new ~ N(b̂, SE² + σ²_res),
 * as in a regression prediction interval (Janssen et al. 2004's LLTM with error treats the same
 * residual as a random item effect). The audience share is 1 − Φ((θ_RP − μ)/σ) at the RP location,
 * and its interval is the share at the two ends of the prediction interval.
 *
 * @see Fischer, G. H. (1973). The linear logistic test model. Acta Psychologica 37, 359-374.
 * @see Janssen, R., Schepers, J., & Peres, D. (2004), in De Boeck & Wilson (Eds.), Explanatory
 *   Item Response Models, ch. 6 (from memory for the chapter).
 * @param lltm a fit from calibrateLltm.
 * @param features the planned item's feature values, in the order of `lltm.featureNames`.
 * @param options level (0.95), residualVariance (from the fit), audience, rp (0.67).
 * @returns the prediction, labelled model-based.
 * @throws when the feature vector has the wrong length or a value is not finite, or level is not in (0, 1).
 * @example
 * // one feature with η = 0.5 (SE 0.1), items averaging 2 on it, planned item at 4, σ²_res = 0:
 * predictDifficulty(fit, [4]).difficulty; // 1 (= (4 − 2) · 0.5), SE 0.2
 */
export function predictDifficulty(
  lltm: LltmCalibration,
  features: ArrayLike<number>,
  options: PredictDifficultyOptions = {},
): DifficultyPrediction {
  const p = lltm.weights.length;
  if (features.length !== p) throw new Error('predictDifficulty requires one value per feature');
  const level = options.level ?? 0.95;
  if (!(level > 0 && level < 1)) throw new Error('predictDifficulty requires a level between 0 and 1');
  const rp = options.rp ?? 0.67;
  const x = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const v = features[j]!;
    if (!Number.isFinite(v)) throw new Error('predictDifficulty requires finite feature values');
    x[j] = v - lltm.featureMeans[j]!;
  }
  let difficulty = 0;
  let variance = 0;
  for (let a = 0; a < p; a++) {
    difficulty += x[a]! * lltm.weights[a]!;
    for (let c = 0; c < p; c++) variance += x[a]! * lltm.weightCovariance[a * p + c]! * x[c]!;
  }
  const standardError = Math.sqrt(Math.max(variance, 0));
  const residualVariance = options.residualVariance ?? lltmResidualVariance(lltm);
  if (!(residualVariance >= 0))
    throw new Error('predictDifficulty requires a non-negative residual variance');
  const predictionStandardError = Math.sqrt(standardError ** 2 + residualVariance);
  const z = normalQuantile(0.5 + level / 2);
  const predictionInterval: [number, number] = [
    difficulty - z * predictionStandardError,
    difficulty + z * predictionStandardError,
  ];
  const offset = responseProbabilityLocation(0, rp);
  const audience = options.audience;
  return {
    basis: 'model-based',
    difficulty,
    standardError,
    predictionStandardError,
    residualVariance,
    level,
    confidenceInterval: [difficulty - z * standardError, difficulty + z * standardError],
    predictionInterval,
    rpLocation: difficulty + offset,
    audienceShare:
      audience === undefined
        ? null
        : {
            estimate: shareAtOrAbove(difficulty + offset, audience),
            interval: [
              shareAtOrAbove(predictionInterval[1] + offset, audience),
              shareAtOrAbove(predictionInterval[0] + offset, audience),
            ],
          },
  };
}

/** Φ⁻¹(q) by bisection on Φ (60 halvings of [−40, 40] reach below 1e-16). */
function normalQuantile(q: number): number {
  let low = -40;
  let high = 40;
  for (let k = 0; k < 60; k++) {
    const middle = (low + high) / 2;
    if (standardNormalCdf(middle) < q) low = middle;
    else high = middle;
  }
  return (low + high) / 2;
}
