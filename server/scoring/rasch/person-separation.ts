/** Person (or item) separation and reliability. */
export interface Separation {
  /** Observed variance of the measures (sample variance, n − 1). */
  readonly observedVariance: number;
  /** Mean of the squared standard errors (error variance). */
  readonly meanSquaredError: number;
  /** Observed variance minus error variance (0 if negative). */
  readonly trueVariance: number;
  /** G = true SD / RMSE. */
  readonly separation: number;
  /** R = true variance / observed variance = G² / (1 + G²). */
  readonly reliability: number;
  /** H = (4G + 1) / 3, statistically distinct levels. */
  readonly strata: number;
}

/**
 * Separation index and reliability of a set of measures with standard errors (persons, usually;
 * the same formulas serve items).
 *
 * @see Wright, B. D., & Masters, G. N. (1982). Rating Scale Analysis. MESA Press, ch. 5 (separation
 *   and reliability; true variance = observed variance − mean error variance).
 * @see Wright, B. D., & Masters, G. N. (2002). Number of person or item strata. Rasch Measurement
 *   Transactions 16(3), 888 (H = (4G + 1)/3; from memory).
 * @param estimates the measures (e.g. MLE of persons with non-extreme scores, as eRm's SepRel).
 * @param standardErrors their SEs, aligned.
 * @returns variances, G, R and H.
 * @throws with fewer than two measures, mismatched lengths or a non-finite value.
 * @example
 * personSeparation(Float64Array.of(-2, 0, 2), Float64Array.of(1, 1, 1)).reliability; // 0.75
 */
export function personSeparation(estimates: Float64Array, standardErrors: Float64Array): Separation {
  const n = estimates.length;
  if (n < 2) throw new Error('personSeparation requires at least two measures');
  if (standardErrors.length !== n)
    throw new Error('personSeparation requires one standard error per measure');
  let mean = 0;
  let meanSquaredError = 0;
  for (let k = 0; k < n; k++) {
    if (!Number.isFinite(estimates[k]!) || !Number.isFinite(standardErrors[k]!)) {
      throw new Error('personSeparation requires finite measures and standard errors');
    }
    mean += estimates[k]!;
    meanSquaredError += standardErrors[k]! ** 2;
  }
  mean /= n;
  meanSquaredError /= n;
  let observedVariance = 0;
  for (const e of estimates) observedVariance += (e - mean) ** 2;
  observedVariance /= n - 1;
  const trueVariance = Math.max(observedVariance - meanSquaredError, 0);
  const separation = Math.sqrt(trueVariance / meanSquaredError);
  return {
    observedVariance,
    meanSquaredError,
    trueVariance,
    separation,
    reliability: observedVariance > 0 ? trueVariance / observedVariance : 0,
    strata: (4 * separation + 1) / 3,
  };
}

/**
 * R = G² / (1 + G²).
 * @example reliabilityFromSeparation(2); // 0.8
 */
export function reliabilityFromSeparation(separation: number): number {
  return (separation * separation) / (1 + separation * separation);
}

/**
 * G = √(R / (1 − R)).
 * @example separationFromReliability(0.9); // 3
 */
export function separationFromReliability(reliability: number): number {
  if (!(reliability >= 0 && reliability < 1))
    throw new Error('separationFromReliability requires 0 <= R < 1');
  return Math.sqrt(reliability / (1 - reliability));
}
