/** Line chart: one or several series over an ordered x (numbers, years, dates or ordered categories). */
import { line } from 'd3-shape';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { fieldOf, fieldTitle, numberOrNull } from './chart-data.js';
import type { ChartSpecOf, Row } from './chart-spec.js';
import { drawSeriesEndLabels, seriesLayout } from './series-layout.js';
import { element } from './svg.js';

/**
 * Renders a line chart: rows grouped by `series`, each series a line through its points in x
 * order; null y values break the line. With `markers` (default) every point is a
 * `<circle class="mark point">`; without, every line is a `<path class="mark line">`.
 * Series are named by a legend, by labels at the line ends (`direct`, default), or not at all.
 *
 * @param spec a parsed `line` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document
 */
export function renderLineChart(spec: ChartSpecOf<'line'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const values = spec.data.flatMap((row) => {
    const value = numberOrNull(row, spec.y);
    return value === null ? [] : [value];
  });
  const layout = seriesLayout(canvas, spec, values, {
    includeZero: spec.valueAxis.scale === 'linear',
    legendShape: 'line',
    directLabelRoom: true,
  });
  const groups = layout.series.map(() => [] as Array<{ row: Row; index: number }>);
  spec.data.forEach((row, index) => {
    groups[layout.seriesOf(row)]?.push({ row, index });
  });
  const lines: string[] = [];
  const points: string[] = [];
  const ends: number[] = [];
  groups.forEach((group, seriesIndex) => {
    group.sort((a, b) => layout.xKey(a.row[spec.x]) - layout.xKey(b.row[spec.x]) || a.index - b.index);
    const colour = layout.colours[seriesIndex]!;
    const path = line<{ row: Row }>()
      .defined(({ row }) => numberOrNull(row, spec.y) !== null)
      .x(({ row }) => layout.x(row[spec.x]))
      .y(({ row }) => layout.y(numberOrNull(row, spec.y) ?? 0))
      .digits(canvas.theme.digits)(group);
    lines.push(
      element('path', {
        class: spec.markers ? 'series-line' : 'mark line',
        'data-series': seriesIndex,
        d: path ?? '',
        fill: 'none',
        stroke: colour,
        'stroke-width': 3,
        'stroke-linejoin': 'round',
      }),
    );
    let last = Number.NaN;
    for (const { row, index } of group) {
      const value = numberOrNull(row, spec.y);
      if (value === null) continue;
      const cx = layout.x(row[spec.x]);
      const cy = layout.y(value);
      last = cy;
      canvas.anchor(index, cx, cy);
      if (spec.markers) {
        points.push(
          element('circle', {
            class: 'mark point',
            'data-row': index,
            'data-series': seriesIndex,
            cx: canvas.n(cx),
            cy: canvas.n(cy),
            r: 4.5,
            fill: colour,
          }),
        );
      }
    }
    ends.push(Number.isNaN(last) ? layout.plot.y : last);
  });
  const yTitle = fieldTitle(fieldOf(spec, spec.y));
  const xTitle = fieldTitle(fieldOf(spec, spec.x));
  const marks = spec.markers ? points.length : lines.length;
  return canvas.finish(
    [
      layout.frame,
      element('g', { class: 'marks' }, [...lines, ...points]),
      drawSeriesEndLabels(canvas, layout, spec.labelling, ends),
    ],
    {
      marks,
      markNoun: spec.markers ? (marks === 1 ? 'point' : 'points') : marks === 1 ? 'line' : 'lines',
      series: layout.series.length,
      axes: [`Horizontal axis: ${xTitle}`, `Vertical axis: ${yTitle}`],
    },
  );
}
