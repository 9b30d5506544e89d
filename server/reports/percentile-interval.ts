import { quantileSorted } from 'simple-statistics';

/**
 * Percentile interval of bootstrap replicates: the (1 − level)/2 and (1 + level)/2 quantiles.
 * Quantiles interpolate linearly between order statistics (simple-statistics `quantileSorted`).
 *
 * @see Efron, B., & Tibshirani, R. J. (1993). An Introduction to the Bootstrap, ch. 13.
 * @param values replicate values (at least 2, finite)
 * @param level confidence level in (0, 1), default 0.95
 * @returns [lower, upper]
 * @throws when fewer than 2 values are given or the level is out of range
 * @example
 * percentileInterval([1, 2, 3, 4, 5], 0.5); // [2, 4]
 */
export function percentileInterval(values: readonly number[], level = 0.95): [number, number] {
  if (values.length < 2) throw new Error('percentileInterval requires at least two values');
  if (!(level > 0 && level < 1)) throw new Error('percentileInterval requires a level in (0, 1)');
  const sorted = [...values].sort((a, b) => a - b);
  const tail = (1 - level) / 2;
  return [quantileSorted(sorted, tail), quantileSorted(sorted, 1 - tail)];
}
