/** Area chart: one filled series, or several stacked on top of each other. */
import { area, type SeriesPoint, stack } from 'd3-shape';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText, fieldOf, fieldTitle, numberOrNull } from './chart-data.js';
import type { Cell, ChartSpecOf } from './chart-spec.js';
import { drawSeriesEndLabels, seriesLayout } from './series-layout.js';
import { element } from './svg.js';

interface Column {
  readonly cell: Cell;
  readonly values: number[];
  readonly rows: number[];
}

/**
 * Renders an area chart. Several series are stacked in series order (first at the bottom) with
 * d3-shape's `stack` (offset none, order none); a missing value counts as 0. Each series is one
 * `<path class="mark area">`. The y axis starts at 0 and reaches the highest stack top. An
 * annotation points at the top of the stack at its row's x value.
 *
 * @param spec a parsed `area` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document
 * @throws when a y value is negative (stacked areas need values >= 0)
 */
export function renderAreaChart(spec: ChartSpecOf<'area'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const totals = new Map<string, number>();
  for (const row of spec.data) {
    const value = numberOrNull(row, spec.y) ?? 0;
    if (value < 0) throw new Error('renderAreaChart requires values >= 0');
    const key = cellText(row[spec.x]);
    totals.set(key, (totals.get(key) ?? 0) + value);
  }
  const layout = seriesLayout(canvas, spec, [0, ...totals.values()], {
    includeZero: true,
    legendShape: 'square',
    directLabelRoom: true,
  });
  // One column per x value: the x cell, each series' value (missing = 0) and the row it came from.
  const byX = new Map<string, Column>();
  spec.data.forEach((row, index) => {
    const key = cellText(row[spec.x]);
    let column = byX.get(key);
    if (column === undefined) {
      column = {
        cell: row[spec.x] ?? null,
        values: layout.series.map(() => 0),
        rows: layout.series.map(() => -1),
      };
      byX.set(key, column);
    }
    const seriesIndex = layout.seriesOf(row);
    column.values[seriesIndex] = numberOrNull(row, spec.y) ?? 0;
    column.rows[seriesIndex] = index;
  });
  const columns = [...byX.values()].sort((a, b) => layout.xKey(a.cell) - layout.xKey(b.cell));
  const keys = layout.series.map((_, index) => index);
  const layers = stack<Column, number>()
    .keys(keys)
    .value((column, key) => column.values[key] ?? 0)(columns);
  const shape = area<SeriesPoint<Column>>()
    .x((point) => layout.x(point.data.cell))
    .y0((point) => layout.y(point[0]))
    .y1((point) => layout.y(point[1]))
    .digits(canvas.theme.digits);
  // An annotation names a time point, so it points at the top of the whole stack there (not at
  // the boundary between two bands, which reads as marking one series).
  const top = layers[layers.length - 1];
  const marks = layers.map((layer, seriesIndex) => {
    layer.forEach((point, columnIndex) => {
      const row = point.data.rows[seriesIndex] ?? -1;
      const stackTop = top?.[columnIndex]?.[1] ?? point[1];
      if (row >= 0) canvas.anchor(row, layout.x(point.data.cell), layout.y(stackTop));
    });
    return element('path', {
      class: 'mark area',
      'data-series': seriesIndex,
      d: shape(layer) ?? '',
      fill: layout.colours[seriesIndex]!,
      stroke: canvas.theme.colours.background,
      'stroke-width': 1,
    });
  });
  const ends = layers.map((layer) => {
    const last = layer[layer.length - 1];
    return last === undefined ? layout.plot.y : layout.y((last[0] + last[1]) / 2);
  });
  return canvas.finish(
    [
      layout.frame,
      element('g', { class: 'marks' }, marks),
      drawSeriesEndLabels(canvas, layout, spec.labelling, ends),
    ],
    {
      marks: marks.length,
      markNoun: marks.length === 1 ? 'area' : 'stacked areas',
      series: layout.series.length,
      axes: [
        `Horizontal axis: ${fieldTitle(fieldOf(spec, spec.x))}`,
        `Vertical axis: ${fieldTitle(fieldOf(spec, spec.y))}`,
      ],
    },
  );
}
