/** Agreement weights: 'linear' 1 − |i − j|/(k − 1), 'quadratic' 1 − (i − j)²/(k − 1)², or a k × k matrix. */
export type KappaWeights = 'linear' | 'quadratic' | 'none' | Float64Array;

export interface WeightedKappa {
  /** κ_w = (p_o − p_e) / (1 − p_e). */
  readonly kappa: number;
  /** Weighted observed agreement p_o = Σ w_ij p_ij. */
  readonly observed: number;
  /** Weighted chance agreement p_e = Σ w_ij p_i. p_.j. */
  readonly expected: number;
  /** Large-sample SE for intervals (Fleiss, Cohen & Everitt 1969). */
  readonly standardError: number;
  /** SE under the null hypothesis of chance agreement, for testing κ_w = 0. */
  readonly nullStandardError: number;
  /** κ_w / null SE. */
  readonly z: number;
  /** 95% interval κ_w ± 1.96 SE. */
  readonly confidenceInterval: readonly [number, number];
  readonly answers: number;
}

const Z_975 = 1.959963984540054;

/** The k × k agreement-weight matrix for a named scheme (1 on the diagonal). */
export function kappaWeightMatrix(weights: KappaWeights, k: number): Float64Array {
  if (weights instanceof Float64Array) {
    if (weights.length !== k * k) throw new Error('weightedKappa requires a k × k weight matrix');
    return weights;
  }
  return Float64Array.from({ length: k * k }, (_, cell) => {
    const distance = Math.abs(Math.floor(cell / k) - (cell % k)) / (k - 1);
    return weights === 'linear'
      ? 1 - distance
      : weights === 'quadratic'
        ? 1 - distance * distance
        : distance === 0
          ? 1
          : 0;
  });
}

/**
 * Cohen's weighted kappa for two raters who scored the same answers on an ordered rubric (for
 * example 0/1/2), with the large-sample standard errors of Fleiss, Cohen & Everitt (1969): one for
 * confidence intervals and one under the null hypothesis of chance agreement.
 *
 * With p_ij the share of answers scored i by the first rater and j by the second, agreement
 * weights w_ij (1 on the diagonal), w̄_i. = Σ_j p_.j w_ij and w̄_.j = Σ_i p_i. w_ij:
 * Var(κ_w) = [Σ p_ij (w_ij (1 − p_e) − (w̄_i. + w̄_.j)(1 − p_o))² − (p_o p_e − 2 p_e + p_o)²] / (n (1 − p_e)⁴),
 * Var_0(κ_w) = [Σ p_i. p_.j (w_ij − (w̄_i. + w̄_.j))² − p_e²] / (n (1 − p_e)²).
 * Unweighted kappa is the case w = identity ('none'). Disagreement weights v_ij (0 on the
 * diagonal, as in Cohen 1968) give the same κ_w after w_ij = 1 − v_ij / max v.
 *
 * @see Cohen, J. (1968). Weighted kappa: Nominal scale agreement with provision for scaled
 *   disagreement or partial credit. Psychological Bulletin 70(4), 213-220.
 * @see Fleiss, J. L., Cohen, J., & Everitt, B. S. (1969). Large sample standard errors of kappa and
 *   weighted kappa. Psychological Bulletin 72(5), 323-327.
 * @see Fleiss, J. L., Levin, B., & Paik, M. C. (2003). Statistical Methods for Rates and
 *   Proportions (3rd ed.), ch. 18 (from memory for the chapter).
 * @param table k × k counts, first rater in rows (see agreementTable).
 * @param weights 'linear' (default), 'quadratic', 'none' or a k × k agreement-weight matrix.
 * @returns κ_w, p_o, p_e, both SEs, z and a 95% interval.
 * @throws when the table is not square, holds a negative count, is empty, or chance agreement is 1.
 * @example
 * // Cohen (1968): proportions .44 .07 .09 / .05 .20 .05 / .01 .03 .06, disagreement weights 0,1,3 / 1,0,6 / 3,6,0
 * weightedKappa(cohenTable, agreementFromDisagreement).kappa; // 0.348 (Cohen reports .348)
 */
export function weightedKappa(table: Float64Array, weights: KappaWeights = 'linear'): WeightedKappa {
  const k = Math.round(Math.sqrt(table.length));
  if (k < 2 || k * k !== table.length)
    throw new Error('weightedKappa requires a square table of at least 2 × 2');
  const w = kappaWeightMatrix(weights, k);
  let n = 0;
  for (const count of table) {
    if (!(count >= 0) || !Number.isFinite(count))
      throw new Error('weightedKappa requires non-negative counts');
    n += count;
  }
  if (n === 0) throw new Error('weightedKappa requires at least one answer');
  const rows = new Float64Array(k);
  const columns = new Float64Array(k);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      rows[i]! += table[i * k + j]! / n;
      columns[j]! += table[i * k + j]! / n;
    }
  let observed = 0;
  let expected = 0;
  const rowMeans = new Float64Array(k); // w̄_i.
  const columnMeans = new Float64Array(k); // w̄_.j
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      const weight = w[i * k + j]!;
      observed += (weight * table[i * k + j]!) / n;
      expected += weight * rows[i]! * columns[j]!;
      rowMeans[i]! += columns[j]! * weight;
      columnMeans[j]! += rows[i]! * weight;
    }
  if (!(expected < 1)) throw new Error('weightedKappa is undefined when chance agreement is 1');
  const kappa = (observed - expected) / (1 - expected);
  let spread = 0;
  let nullSpread = 0;
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      const weight = w[i * k + j]!;
      const both = rowMeans[i]! + columnMeans[j]!;
      spread += (table[i * k + j]! / n) * (weight * (1 - expected) - both * (1 - observed)) ** 2;
      nullSpread += rows[i]! * columns[j]! * (weight - both) ** 2;
    }
  const variance =
    (spread - (observed * expected - 2 * expected + observed) ** 2) / (n * (1 - expected) ** 4);
  const nullVariance = (nullSpread - expected * expected) / (n * (1 - expected) ** 2);
  const standardError = Math.sqrt(Math.max(variance, 0));
  const nullStandardError = Math.sqrt(Math.max(nullVariance, 0));
  return {
    kappa,
    observed,
    expected,
    standardError,
    nullStandardError,
    z: nullStandardError > 0 ? kappa / nullStandardError : Number.NaN,
    confidenceInterval: [kappa - Z_975 * standardError, kappa + Z_975 * standardError],
    answers: n,
  };
}
