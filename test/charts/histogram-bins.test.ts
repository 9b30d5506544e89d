import { describe, expect, it } from 'vitest';
import { computeHistogramBins } from '../../server/charts/histogram-bins.js';

describe('computeHistogramBins', () => {
  it('matches its documented example', () => {
    expect(computeHistogramBins([1, 2, 2, 5], 0, 2)).toEqual([
      { x0: 0, x1: 2, count: 1 },
      { x0: 2, x1: 4, count: 2 },
      { x0: 4, x1: 6, count: 1 },
    ]);
  });

  it('uses half-open bins [x0, x1): a value on an edge counts in the upper bin', () => {
    // counted by hand: [6,8): 6, 7.5; [8,10): 8, 8.2, 9, 9.5, 9.9; [10,12): 10, 11; [12,14): 12.5; [14,16): 14
    const counts = computeHistogramBins([6, 7.5, 8, 8.2, 9, 9.5, 9.9, 10, 11, 12.5, 14], 6, 2).map(
      (bin) => bin.count,
    );
    expect(counts).toEqual([2, 5, 2, 1, 1]);
  });

  it('does not drift with decimal widths (0.1 + 0.2 is not 0.3 in binary)', () => {
    const bins = computeHistogramBins([0.1, 0.2, 0.1 + 0.2], 0, 0.1);
    expect(bins.map((bin) => bin.count)).toEqual([0, 1, 1, 1]);
    expect(bins.map((bin) => bin.x1)).toEqual([0.1, 0.2, 0.3, 0.4]);
  });

  it('keeps empty bins and refuses values below the start', () => {
    expect(computeHistogramBins([0, 7], 0, 2).map((bin) => bin.count)).toEqual([1, 0, 0, 1]);
    expect(() => computeHistogramBins([1], 2, 1)).toThrow('computeHistogramBins requires values >= binStart');
    expect(() => computeHistogramBins([], 0, 1)).toThrow('computeHistogramBins requires at least one value');
  });
});
