import { chiSquaredUpperTail } from '../statistics/chi-squared-upper-tail.js';

/** One score stratum of one item: counts of right and wrong answers in each group. */
export interface MantelHaenszelStratum {
  /** A_k: reference group, right. */
  readonly referenceRight: number;
  /** B_k: reference group, wrong. */
  readonly referenceWrong: number;
  /** C_k: focal group, right. */
  readonly focalRight: number;
  /** D_k: focal group, wrong. */
  readonly focalWrong: number;
}

/** The common odds ratio and its ETS delta-scale transform. */
export interface MantelHaenszelEffect {
  /** α_MH = Σ A_k D_k / N_k ÷ Σ B_k C_k / N_k; above 1 the item favours the reference group. */
  readonly alpha: number;
  readonly logAlpha: number;
  /** SE(ln α_MH), Robins-Breslow-Greenland. */
  readonly logAlphaStandardError: number;
  /** 95% interval for α_MH, exp(ln α ± 1.96 SE). */
  readonly confidenceInterval: readonly [number, number];
  /** MH D-DIF = −2.35 ln α_MH, delta scale; negative means harder for the focal group. */
  readonly dDif: number;
  /** 2.35 · SE(ln α_MH). */
  readonly dDifStandardError: number;
}

export type MantelHaenszelResult =
  | {
      /** No stratum holds both groups and both answers: the data say nothing about this item. */
      readonly kind: 'no-information';
      readonly strataUsed: number;
    }
  | {
      readonly kind: 'test';
      /** Strata holding both groups (the others carry no information and are skipped). */
      readonly strataUsed: number;
      /** Persons in the strata used. */
      readonly personsUsed: number;
      /** MH χ² (1 df) without continuity correction. */
      readonly chiSquared: number;
      readonly pValue: number;
      /** MH χ² with the 0.5 continuity correction (the usual DIF statistic). */
      readonly chiSquaredCorrected: number;
      readonly pValueCorrected: number;
      /**
       * α_MH and D-DIF, or null when one of the two odds sums is zero (every informative stratum
       * has an empty cell on the same diagonal), so α_MH is 0 or infinite.
       */
      readonly effect: MantelHaenszelEffect | null;
    };

/** z_{0.975}, for the 95% interval. */
const Z_975 = 1.959963984540054;

/**
 * Mantel-Haenszel statistics for one item studied across a reference and a focal group matched
 * on score strata: the common odds ratio α_MH, the MH chi-square with and without continuity
 * correction, and MH D-DIF = −2.35 ln α_MH with the Robins-Breslow-Greenland standard error.
 *
 * Small strata, as the literature handles them: a stratum where either group is absent has
 * n_R·n_F = 0, so it adds nothing to either odds sum, to E(A_k) − A_k or to Var(A_k); it is
 * skipped and not counted (Holland & Thayer 1988; the same estimator with the stratum
 * left out). Empty cells inside a stratum that holds both groups are kept as they are: no 0.5 is
 * added, because α_MH sums over strata and stays finite unless a whole odds sum is zero, and the
 * RBG variance is consistent for sparse strata (Robins, Breslow & Greenland 1986). When an odds
 * sum is zero the effect is returned as null rather than as 0 or Infinity.
 *
 * Cost O(K) for K strata.
 *
 * @see Mantel, N., & Haenszel, W. (1959). Statistical aspects of the analysis of data from
 *   retrospective studies of disease. Journal of the National Cancer Institute 22(4), 719-748.
 * @see Holland, P. W., & Thayer, D. T. (1988). Differential item performance and the
 *   Mantel-Haenszel procedure. In H. Wainer & H. I. Braun (Eds.), Test Validity, ch. 9,
 *   pp. 129-145 (α_MH, the χ² with continuity correction, MH D-DIF = −2.35 ln α_MH).
 * @see Robins, J., Breslow, N., & Greenland, S. (1986). Estimators of the Mantel-Haenszel
 *   variance consistent in both sparse data and large-strata limiting models. Biometrics 42(2),
 *   311-323 (the variance of ln α_MH; name from memory, formula checked against base R's
 *   `mantelhaen.test` interval).
 * @param strata one entry per score stratum; counts must be non-negative finite numbers.
 * @returns the test and effect, or `{ kind: 'no-information' }`.
 * @throws when a count is negative or not finite.
 * @example
 * // UCBAdmissions by department (check-values §6), reference = male, right = admitted
 * const result = mantelHaenszel(ucbStrata);
 * result.kind === 'test' && result.effect?.alpha; // 0.9046968 (base R mantelhaen.test)
 */
export function mantelHaenszel(strata: readonly MantelHaenszelStratum[]): MantelHaenszelResult {
  let oddsNumerator = 0; // R = Σ A D / N
  let oddsDenominator = 0; // S = Σ B C / N
  let sumPR = 0;
  let sumPSQR = 0;
  let sumQS = 0;
  let observed = 0;
  let expected = 0;
  let variance = 0;
  let strataUsed = 0;
  let personsUsed = 0;
  for (const stratum of strata) {
    const { referenceRight: a, referenceWrong: b, focalRight: c, focalWrong: d } = stratum;
    for (const count of [a, b, c, d]) {
      if (!(count >= 0) || !Number.isFinite(count))
        throw new Error('mantelHaenszel requires non-negative finite counts');
    }
    const reference = a + b;
    const focal = c + d;
    if (reference === 0 || focal === 0) continue;
    const n = reference + focal;
    strataUsed++;
    personsUsed += n;
    const r = (a * d) / n;
    const s = (b * c) / n;
    const p = (a + d) / n;
    const q = (b + c) / n;
    oddsNumerator += r;
    oddsDenominator += s;
    sumPR += p * r;
    sumPSQR += p * s + q * r;
    sumQS += q * s;
    const right = a + c;
    const wrong = b + d;
    observed += a;
    expected += (reference * right) / n;
    // hypergeometric variance of A_k; n ≥ 2 here because both groups are present
    variance += (reference * focal * right * wrong) / (n * n * (n - 1));
  }
  if (!(variance > 0)) return { kind: 'no-information', strataUsed };
  const deviation = Math.abs(observed - expected);
  const chiSquared = (deviation * deviation) / variance;
  // as base R's mantelhaen.test: the 0.5 is subtracted only when it does not overshoot zero
  const corrected = deviation >= 0.5 ? deviation - 0.5 : deviation;
  const chiSquaredCorrected = (corrected * corrected) / variance;
  let effect: MantelHaenszelEffect | null = null;
  if (oddsNumerator > 0 && oddsDenominator > 0) {
    const alpha = oddsNumerator / oddsDenominator;
    const logAlpha = Math.log(alpha);
    const logVariance =
      sumPR / (2 * oddsNumerator * oddsNumerator) +
      sumPSQR / (2 * oddsNumerator * oddsDenominator) +
      sumQS / (2 * oddsDenominator * oddsDenominator);
    const logAlphaStandardError = Math.sqrt(logVariance);
    effect = {
      alpha,
      logAlpha,
      logAlphaStandardError,
      confidenceInterval: [
        Math.exp(logAlpha - Z_975 * logAlphaStandardError),
        Math.exp(logAlpha + Z_975 * logAlphaStandardError),
      ],
      dDif: -2.35 * logAlpha,
      dDifStandardError: 2.35 * logAlphaStandardError,
    };
  }
  return {
    kind: 'test',
    strataUsed,
    personsUsed,
    chiSquared,
    pValue: chiSquaredUpperTail(chiSquared, 1),
    chiSquaredCorrected,
    pValueCorrected: chiSquaredUpperTail(chiSquaredCorrected, 1),
    effect,
  };
}
