import { describe, expect, it } from 'vitest';
import { computeBoxPlotStats } from '../../server/charts/box-plot-stats.js';

// Expected quartiles are Hyndman and Fan (1996) definition 7 (R's quantile(x, type = 7)),
// computed by hand: h = (n - 1)p on 0-based sorted values, Q = x[floor h] + (h - floor h)(x[floor h + 1] - x[floor h]).
describe('computeBoxPlotStats', () => {
  it('matches its documented example (Tukey whiskers, one outlier)', () => {
    expect(computeBoxPlotStats([1, 2, 3, 4, 5, 6, 7, 8, 30])).toEqual({
      q1: 3,
      median: 5,
      q3: 7,
      lowerWhisker: 1,
      upperWhisker: 8,
      outliers: [30],
    });
  });

  it('interpolates quartiles as R type 7, not type 6', () => {
    // 1:4 -> h = 0.75, 1.5, 2.25 -> 1.75, 2.5, 3.25 (type 6 would give 1.25, 2.5, 3.75)
    const stats = computeBoxPlotStats([4, 1, 3, 2]);
    expect([stats.q1, stats.median, stats.q3]).toEqual([1.75, 2.5, 3.25]);
    // 2,4,4,5,6,7,9 -> h = 1.5, 3, 4.5 -> 4, 5, 6.5
    const other = computeBoxPlotStats([9, 2, 4, 7, 4, 6, 5]);
    expect([other.q1, other.median, other.q3]).toEqual([4, 5, 6.5]);
  });

  it('puts whiskers at the last values inside 1.5 IQR and flags values beyond on both sides', () => {
    // type 7 on 8 values: q1: h = 1.75 -> 10, q3: h = 5.25 -> 12.25; IQR 2.25, fences 6.625 and 15.625
    const stats = computeBoxPlotStats([1, 10, 10, 11, 12, 12, 13, 20]);
    expect(stats.q1).toBeCloseTo(10, 12);
    expect(stats.q3).toBeCloseTo(12.25, 12);
    expect(stats.lowerWhisker).toBe(10);
    expect(stats.upperWhisker).toBe(13);
    expect(stats.outliers).toEqual([1, 20]);
  });

  it('runs min-max whiskers to the extremes with no outliers', () => {
    const stats = computeBoxPlotStats([1, 2, 3, 4, 5, 6, 7, 8, 30], 'min-max');
    expect([stats.lowerWhisker, stats.upperWhisker, stats.outliers]).toEqual([1, 30, []]);
    expect(() => computeBoxPlotStats([])).toThrow('computeBoxPlotStats requires at least one value');
  });
});
