import { quantileSorted } from 'd3-array';

/** The five numbers and outliers a box plot draws for one group. */
export interface BoxPlotStats {
  readonly q1: number;
  readonly median: number;
  readonly q3: number;
  /** Lower end of the whisker: the smallest value within the lower fence (Tukey) or the minimum. */
  readonly lowerWhisker: number;
  readonly upperWhisker: number;
  /** Values beyond the fences, ascending (always empty for min-max whiskers). */
  readonly outliers: readonly number[];
}

/**
 * Box-plot statistics of one group. Quartiles use d3-array `quantileSorted`, which is Hyndman
 * and Fan's definition 7 (R's default `quantile(type = 7)`): h = (n - 1)p, Q(p) = x[floor h] +
 * (h - floor h)(x[floor h + 1] - x[floor h]) on the sorted values, 0-based. Tukey whiskers reach
 * the most extreme values within 1.5 IQR of the box (the fences); values beyond are outliers.
 *
 * @see Hyndman, R. J. and Fan, Y. (1996), "Sample quantiles in statistical packages", The American
 *   Statistician 50(4), definition 7; Tukey, J. W. (1977), Exploratory Data Analysis, ch. 2
 *   (fences at 1.5 times the hinge spread).
 * @param values observations of one group (any order)
 * @param whiskers 'tukey' (default) or 'min-max'
 * @returns quartiles, whisker ends and outliers
 * @throws `computeBoxPlotStats requires at least one value`
 * @example
 * computeBoxPlotStats([1, 2, 3, 4, 5, 6, 7, 8, 30]);
 * // { q1: 3, median: 5, q3: 7, lowerWhisker: 1, upperWhisker: 8, outliers: [30] }
 */
export function computeBoxPlotStats(
  values: readonly number[],
  whiskers: 'tukey' | 'min-max' = 'tukey',
): BoxPlotStats {
  if (values.length === 0) throw new Error('computeBoxPlotStats requires at least one value');
  const sorted = [...values].sort((a, b) => a - b);
  const q1 = quantileSorted(sorted, 0.25)!;
  const median = quantileSorted(sorted, 0.5)!;
  const q3 = quantileSorted(sorted, 0.75)!;
  const first = sorted[0]!;
  const last = sorted[sorted.length - 1]!;
  if (whiskers === 'min-max')
    return { q1, median, q3, lowerWhisker: first, upperWhisker: last, outliers: [] };
  const spread = 1.5 * (q3 - q1);
  const lowerFence = q1 - spread;
  const upperFence = q3 + spread;
  const inside = sorted.filter((value) => value >= lowerFence && value <= upperFence);
  return {
    q1,
    median,
    q3,
    lowerWhisker: inside[0] ?? q1,
    upperWhisker: inside[inside.length - 1] ?? q3,
    outliers: sorted.filter((value) => value < lowerFence || value > upperFence),
  };
}
