/** Grouped bar chart: one group of bars per category, one bar per series inside each group. */
import { scaleBand } from 'd3-scale';
import { numericAxis } from './axis.js';
import { bandLayout, barRect } from './band-layout.js';
import { categorySeriesGrid } from './category-series.js';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { fieldOf, fieldTitle, seriesColours } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { drawLegend } from './legend.js';
import { element } from './svg.js';

/**
 * Renders a grouped bar chart: categories along one axis, inside each category one bar per
 * series in series order (d3 `scaleBand` nested in the category band). Series are named by a
 * legend, or (`direct`) by labels at the ends of the bars of the first category group.
 *
 * @param spec a parsed `grouped-bar` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each bar is `<rect class="mark bar" data-row="i" data-series="s">`
 */
export function renderGroupedBarChart(
  spec: ChartSpecOf<'grouped-bar'>,
  options: ChartRenderOptions = {},
): string {
  const canvas = new ChartCanvas(spec, options);
  const grid = categorySeriesGrid(spec);
  const colours = seriesColours(spec, canvas.theme, grid.series.length);
  const parts: string[] = [];
  if (spec.labelling === 'legend') {
    parts.push(
      drawLegend(
        canvas,
        grid.series.map((label, index) => ({ label, colour: colours[index]!, shape: 'square' })),
      ),
    );
  }
  const values = grid.cells.flatMap((row) => row.flatMap((cell) => (cell === undefined ? [] : [cell.value])));
  const valueField = fieldOf(spec, spec.value);
  const categoryField = fieldOf(spec, spec.category);
  const horizontal = spec.orientation === 'horizontal';
  const layout = bandLayout(canvas, {
    categories: grid.categories,
    valueAxis: numericAxis(spec.valueAxis, values, { includeZero: true }),
    horizontal,
    categoryTitle: fieldTitle(categoryField),
    valueTitle: fieldTitle(valueField),
    gridlines: spec.gridlines,
    paddingInner: 0.3,
  });
  parts.push(layout.axes);
  const inner = scaleBand<string>()
    .domain(grid.series.map((_, index) => String(index)))
    .range([0, layout.band.bandwidth()])
    .paddingInner(0.08);
  const marks: string[] = [];
  const labels: string[] = [];
  grid.cells.forEach((row, categoryIndex) => {
    row.forEach((cell, seriesIndex) => {
      if (cell === undefined) return;
      const offset = layout.band(String(categoryIndex))! + inner(String(seriesIndex))!;
      const rect = barRect(layout, offset, inner.bandwidth(), layout.base, cell.value);
      const end = layout.value(cell.value);
      const middle = offset + inner.bandwidth() / 2;
      canvas.anchor(cell.row, horizontal ? end : middle, horizontal ? middle : end);
      marks.push(
        element('rect', {
          class: 'mark bar',
          'data-row': cell.row,
          'data-series': seriesIndex,
          x: canvas.n(rect.x),
          y: canvas.n(rect.y),
          width: canvas.n(rect.width),
          height: canvas.n(rect.height),
          fill: colours[seriesIndex]!,
        }),
      );
      if (spec.labelling === 'direct' && categoryIndex === 0) {
        const name = grid.series[seriesIndex]!;
        labels.push(
          horizontal
            ? canvas.text(end + 6, middle, name, {
                kind: 'direct',
                className: 'direct-label',
                align: 'middle',
                halo: true,
              })
            : canvas.text(middle, end - 6, name, {
                kind: 'direct',
                className: 'direct-label',
                anchor: 'middle',
                align: 'bottom',
                halo: true,
              }),
        );
      }
    });
  });
  return canvas.finish(
    [...parts, element('g', { class: 'marks' }, marks), element('g', { class: 'labels' }, labels)],
    {
      marks: marks.length,
      markNoun: `bars in ${grid.categories.length} groups`,
      series: grid.series.length,
      axes: [
        `${horizontal ? 'Vertical' : 'Horizontal'} axis: ${fieldTitle(categoryField)}`,
        `${horizontal ? 'Horizontal' : 'Vertical'} axis: ${fieldTitle(valueField)}`,
      ],
    },
  );
}
