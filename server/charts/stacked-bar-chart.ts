/** Stacked bar chart: one bar per category, split into one segment per series; optionally 100 %. */
import { format } from 'd3-format';
import { stack, stackOffsetExpand, stackOffsetNone } from 'd3-shape';
import { numericAxis } from './axis.js';
import { bandLayout, barRect } from './band-layout.js';
import { categorySeriesGrid, type GridCell } from './category-series.js';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { fieldOf, fieldTitle, seriesColours } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { directLabelWidth, drawLegend, spreadLabels } from './legend.js';
import { element } from './svg.js';

/**
 * Renders a stacked bar chart with d3-shape's `stack` (series order, first series next to the
 * axis; `stackOffsetExpand` when `normalised`, so every bar reaches 100 % and the axis reads in
 * percent, labelled every `valueAxis.tickStep` percent, default 25). Series are named by a legend, or (`direct`) beside the segments of the last bar
 * (vertical) or above the segments of the first bar (horizontal), spread apart.
 *
 * @param spec a parsed `stacked-bar` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each segment is `<rect class="mark segment" data-row="i" data-series="s">`
 * @throws when a value is negative
 */
export function renderStackedBarChart(
  spec: ChartSpecOf<'stacked-bar'>,
  options: ChartRenderOptions = {},
): string {
  const canvas = new ChartCanvas(spec, options);
  const grid = categorySeriesGrid(spec);
  const colours = seriesColours(spec, canvas.theme, grid.series.length);
  const horizontal = spec.orientation === 'horizontal';
  const direct = spec.labelling === 'direct' && grid.series.length > 1;
  const parts: string[] = [];
  if (spec.labelling === 'legend') {
    parts.push(
      drawLegend(
        canvas,
        grid.series.map((label, index) => ({ label, colour: colours[index]!, shape: 'square' })),
      ),
    );
  }
  if (direct && horizontal) canvas.reserveTop(canvas.theme.fontSize.label * 1.5);
  const keys = grid.series.map((_, index) => index);
  const layers = stack<ReadonlyArray<GridCell | undefined>, number>()
    .keys(keys)
    .value((row, key) => {
      const value = row[key]?.value ?? 0;
      if (value < 0) throw new Error('renderStackedBarChart requires values >= 0');
      return value;
    })
    .offset(spec.normalised ? stackOffsetExpand : stackOffsetNone)(grid.cells);
  const tops = layers.flatMap((layer) => layer.map((point) => point[1]));
  const valueField = fieldOf(spec, spec.value);
  const categoryField = fieldOf(spec, spec.category);
  const valueAxis = spec.normalised
    ? numericAxis(
        { scale: 'linear', domain: [0, 1], tickStep: percentStep(spec.valueAxis.tickStep) / 100 },
        [0, 1],
        {
          format: format('.0%'),
        },
      )
    : numericAxis(spec.valueAxis, [0, ...tops], { includeZero: true });
  const valueTitle = spec.normalised
    ? `Share of ${valueField.label.toLowerCase()} (%)`
    : fieldTitle(valueField);
  const layout = bandLayout(canvas, {
    categories: grid.categories,
    valueAxis,
    horizontal,
    categoryTitle: fieldTitle(categoryField),
    valueTitle,
    gridlines: spec.gridlines,
    rightMargin: direct && !horizontal ? directLabelWidth(canvas, grid.series) - 16 : 0,
  });
  parts.push(layout.axes);
  const thickness = layout.band.bandwidth();
  const marks: string[] = [];
  layers.forEach((layer, seriesIndex) => {
    layer.forEach((point, categoryIndex) => {
      const cell = grid.cells[categoryIndex]?.[seriesIndex];
      if (cell === undefined) return;
      const offset = layout.band(String(categoryIndex))!;
      const rect = barRect(layout, offset, thickness, point[0], point[1]);
      canvas.anchor(cell.row, rect.x + rect.width / 2, horizontal ? rect.y : rect.y + rect.height / 2);
      marks.push(
        element('rect', {
          class: 'mark segment',
          'data-row': cell.row,
          'data-series': seriesIndex,
          x: canvas.n(rect.x),
          y: canvas.n(rect.y),
          width: canvas.n(rect.width),
          height: canvas.n(rect.height),
          fill: colours[seriesIndex]!,
          stroke: canvas.theme.colours.background,
          'stroke-width': 1,
        }),
      );
    });
  });
  const labels = direct ? directLabels(canvas, layout, layers, grid.series, horizontal) : [];
  return canvas.finish(
    [...parts, element('g', { class: 'marks' }, marks), element('g', { class: 'labels' }, labels)],
    {
      marks: marks.length,
      markNoun: `segments in ${grid.categories.length} bars`,
      series: grid.series.length,
      axes: [
        `${horizontal ? 'Vertical' : 'Horizontal'} axis: ${fieldTitle(categoryField)}`,
        `${horizontal ? 'Horizontal' : 'Vertical'} axis: ${valueTitle}`,
      ],
    },
  );
}

/**
 * Tick step of a 100 % axis in percent: `tickStep` read in percent (10 -> every 10 %), default 25;
 * a step that does not divide 100 falls back to 25 so the axis still ends on 100 %.
 */
function percentStep(tickStep: number | undefined): number {
  if (tickStep === undefined || tickStep > 100) return 25;
  const count = 100 / tickStep;
  return Math.abs(count - Math.round(count)) < 1e-9 ? tickStep : 25;
}

function directLabels(
  canvas: ChartCanvas,
  layout: ReturnType<typeof bandLayout>,
  layers: ReadonlyArray<ReadonlyArray<readonly number[]>>,
  series: readonly string[],
  horizontal: boolean,
): string[] {
  const size = canvas.theme.fontSize.label;
  const barIndex = horizontal ? 0 : layers[0]!.length - 1;
  const middles = layers.map((layer) =>
    layout.value(((layer[barIndex]?.[0] ?? 0) + (layer[barIndex]?.[1] ?? 0)) / 2),
  );
  const { plot } = layout;
  if (horizontal) {
    const widest = directLabelWidth(canvas, series) - 16;
    const placed = spreadLabels(middles, widest, plot.x + widest / 2, plot.x + plot.width - widest / 2);
    const y = layout.band('0')! - 6;
    return series.map((name, index) =>
      canvas.text(placed[index]!, y, name, {
        kind: 'direct',
        className: 'direct-label',
        anchor: 'middle',
        align: 'bottom',
      }),
    );
  }
  const placed = spreadLabels(middles, size * 1.15, plot.y, plot.y + plot.height);
  const x = layout.band(String(barIndex))! + layout.band.bandwidth() + 6;
  return series.map((name, index) =>
    canvas.text(x, placed[index]!, name, { kind: 'direct', className: 'direct-label', align: 'middle' }),
  );
}
