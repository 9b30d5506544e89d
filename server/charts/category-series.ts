/** Rows of grouped and stacked bar charts arranged as a category x series grid. */
import { categoriesOf, cellText, numberOrNull } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';

export interface GridCell {
  readonly value: number;
  /** Index of the row in `spec.data`. */
  readonly row: number;
}

export interface CategorySeriesGrid {
  readonly categories: readonly string[];
  readonly series: readonly string[];
  /** cells[category][series], undefined where no row (or a null value) exists. */
  readonly cells: ReadonlyArray<ReadonlyArray<GridCell | undefined>>;
}

/**
 * Arranges rows by category and series (both in display order, see `categoriesOf`); a later row
 * for the same pair replaces an earlier one.
 */
export function categorySeriesGrid(
  spec: ChartSpecOf<'grouped-bar'> | ChartSpecOf<'stacked-bar'>,
): CategorySeriesGrid {
  const categories = categoriesOf(spec, spec.category);
  const series = categoriesOf(spec, spec.series);
  const cells = categories.map(() => series.map((): GridCell | undefined => undefined));
  spec.data.forEach((row, index) => {
    const value = numberOrNull(row, spec.value);
    if (value === null) return;
    cells[categories.indexOf(cellText(row[spec.category]))]![series.indexOf(cellText(row[spec.series]))] = {
      value,
      row: index,
    };
  });
  return { categories, series, cells };
}
