import { bin } from 'd3-array';

/** One histogram bin: observations x with x0 <= x < x1. */
export interface HistogramBin {
  readonly x0: number;
  readonly x1: number;
  readonly count: number;
}

/**
 * Equal-width histogram bins: the first starts at `binStart`, each is `binWidth` wide, and there
 * are just enough to hold the largest value, so every bin is half-open [x0, x1) (d3-array `bin`
 * with explicit thresholds; its last bin is closed, but the last edge always lies above the
 * maximum here). Edges are rounded to 12 significant digits so 0.1-wide bins do not drift.
 *
 * @see Pearson, K. (1895), "Contributions to the mathematical theory of evolution II", Phil. Trans.
 *   R. Soc. A 186 (the histogram); d3-array `bin` documentation for the binning rule.
 * @param values observations (nulls already removed)
 * @param binStart lower edge of the first bin
 * @param binWidth width of every bin, > 0
 * @returns bins in order, empty ones included
 * @throws `computeHistogramBins requires at least one value`, `computeHistogramBins requires
 *   values >= binStart`, `computeHistogramBins requires a positive binWidth`
 * @example
 * computeHistogramBins([1, 2, 2, 5], 0, 2);
 * // [{ x0: 0, x1: 2, count: 1 }, { x0: 2, x1: 4, count: 2 }, { x0: 4, x1: 6, count: 1 }]
 */
export function computeHistogramBins(
  values: readonly number[],
  binStart: number,
  binWidth: number,
): HistogramBin[] {
  if (values.length === 0) throw new Error('computeHistogramBins requires at least one value');
  if (!(binWidth > 0)) throw new Error('computeHistogramBins requires a positive binWidth');
  const lowest = Math.min(...values);
  if (lowest < binStart) throw new Error('computeHistogramBins requires values >= binStart');
  const highest = Math.max(...values);
  const binCount = Math.floor((highest - binStart) / binWidth + 1e-9) + 1;
  const edges = Array.from({ length: binCount + 1 }, (_, index) =>
    Number((binStart + index * binWidth).toPrecision(12)),
  );
  // A value within rounding of an edge belongs to the bin that starts there.
  const snapped = values.map((value) => {
    const nearest = edges.find((edge) => Math.abs(edge - value) < binWidth * 1e-9);
    return nearest ?? value;
  });
  const last = edges[edges.length - 1]!;
  const bins = bin<number, number>().domain([binStart, last]).thresholds(edges.slice(1, -1))(snapped);
  return bins.map((group, index) => ({ x0: edges[index]!, x1: edges[index + 1]!, count: group.length }));
}
