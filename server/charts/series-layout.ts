/** Shared layout of line and area charts: an x axis (numeric or points), a numeric y axis, series. */
import { scalePoint } from 'd3-scale';
import {
  drawCategoryAxis,
  drawNumericAxis,
  labelInterval,
  type NumericAxis,
  numericAxis,
  type Rect,
} from './axis.js';
import type { ChartCanvas } from './chart-canvas.js';
import { categoriesOf, cellText, fieldOf, fieldTitle, seriesColours, valueFormatter } from './chart-data.js';
import type { Axis, Cell, ChartSpecOf } from './chart-spec.js';
import { directLabelWidth, drawLegend, spreadLabels } from './legend.js';
import { drawAxisTitles, plotFrame } from './plot-frame.js';
import { element } from './svg.js';

type SeriesSpec = ChartSpecOf<'line'> | ChartSpecOf<'area'>;

export interface SeriesLayout {
  readonly plot: Rect;
  /** Series names in order (one unnamed series is named after the y field). */
  readonly series: readonly string[];
  readonly colours: readonly string[];
  /** Row -> index of its series. */
  readonly seriesOf: (row: Record<string, Cell>) => number;
  /** x cell -> horizontal position. */
  readonly x: (cell: Cell | undefined) => number;
  /** x cell -> sort key along the axis. */
  readonly xKey: (cell: Cell | undefined) => number;
  readonly y: (value: number) => number;
  readonly yDomain: readonly [number, number];
  /** Axes, titles and legend (when `labelling` is 'legend'). */
  readonly frame: string;
}

/**
 * Lays out a line or area chart. x is numeric when every x value is a number (years, hours),
 * else evenly spaced points in category order; point labels are thinned to every k-th when
 * they would collide. `yValues` are the values the y axis must show (stack tops for areas).
 */
export function seriesLayout(
  canvas: ChartCanvas,
  spec: SeriesSpec,
  yValues: readonly number[],
  options: { includeZero: boolean; legendShape: 'line' | 'square'; directLabelRoom: boolean },
): SeriesLayout {
  const series = spec.series === undefined ? [fieldOf(spec, spec.y).label] : categoriesOf(spec, spec.series);
  const colours = seriesColours(spec, canvas.theme, series.length);
  const seriesField = spec.series;
  const seriesOf = (row: Record<string, Cell>) =>
    seriesField === undefined ? 0 : series.indexOf(cellText(row[seriesField]));
  const parts: string[] = [];
  if (spec.labelling === 'legend' && series.length > 1) {
    parts.push(
      drawLegend(
        canvas,
        series.map((label, index) => ({ label, colour: colours[index]!, shape: options.legendShape })),
      ),
    );
  }
  const xField = fieldOf(spec, spec.x);
  const yField = fieldOf(spec, spec.y);
  const valueAxis: Axis = spec.valueAxis;
  const yAxis = numericAxis(valueAxis, yValues, { includeZero: options.includeZero });
  const numericX = spec.data.every((row) => typeof row[spec.x] === 'number');
  const xAxis: NumericAxis | undefined = numericX
    ? numericAxis(
        { scale: 'linear' },
        spec.data.map((row) => row[spec.x] as number),
        { format: valueFormatter(xField), integerTicks: xField.kind === 'temporal' },
      )
    : undefined;
  const xCategories = numericX ? [] : categoriesOf(spec, spec.x);
  const rightMargin =
    spec.labelling === 'direct' && series.length > 1 && options.directLabelRoom
      ? directLabelWidth(canvas, series)
      : 0;
  const plot = plotFrame(canvas, {
    leftLabels: yAxis.labels,
    bottomLabels: xAxis?.labels ?? xCategories,
    leftTitle: fieldTitle(yField),
    bottomTitle: fieldTitle(xField),
    rightMargin,
  });
  const yScale = yAxis.scale
    .copy()
    .clamp(true)
    .range([plot.y + plot.height, plot.y]);
  parts.push(drawNumericAxis(canvas, { ...yAxis, scale: yScale }, 'left', plot, spec.gridlines));
  let x: (cell: Cell | undefined) => number;
  let xKey: (cell: Cell | undefined) => number;
  if (xAxis !== undefined) {
    const xScale = xAxis.scale.copy().range([plot.x, plot.x + plot.width]);
    x = (cell) => xScale(cell as number);
    xKey = (cell) => cell as number;
    parts.push(drawNumericAxis(canvas, { ...xAxis, scale: xScale }, 'bottom', plot, spec.gridlines));
  } else {
    const point = scalePoint<string>()
      .domain(xCategories)
      .range([plot.x, plot.x + plot.width])
      .padding(0.3);
    x = (cell) => point(cellText(cell ?? null)) ?? Number.NaN;
    xKey = (cell) => xCategories.indexOf(cellText(cell ?? null));
    const ticks = xCategories.map((label) => ({ label, position: point(label)! }));
    const every = labelInterval(xCategories, canvas.theme.fontSize.tick, point.step());
    parts.push(
      drawCategoryAxis(canvas, ticks, 'bottom', plot, {
        bandWidth: point.step() * every,
        maxLines: 1,
        every,
      }),
    );
  }
  parts.push(...drawAxisTitles(canvas, plot, { left: fieldTitle(yField), bottom: fieldTitle(xField) }));
  return {
    plot,
    series,
    colours,
    seriesOf,
    x,
    xKey,
    y: (value) => yScale(value),
    yDomain: yScale.domain() as [number, number],
    frame: parts.join(''),
  };
}

/**
 * Series names right of the plot at the vertical positions wanted, spread apart so they do not
 * overlap; each after a short swatch in its series colour (the text stays in the text colour,
 * which meets 4.5:1 where a series colour may only meet 3:1). Returns '' unless `labelling` is 'direct' with 2+ series.
 */
export function drawSeriesEndLabels(
  canvas: ChartCanvas,
  layout: SeriesLayout,
  labelling: string,
  wanted: readonly number[],
): string {
  if (labelling !== 'direct' || layout.series.length < 2) return '';
  const size = canvas.theme.fontSize.label;
  const positions = spreadLabels(wanted, size * 1.15, layout.plot.y, layout.plot.y + layout.plot.height);
  const x = layout.plot.x + layout.plot.width + 6;
  const labels = layout.series.map((name, index) =>
    element('g', { class: 'direct-label' }, [
      element('line', {
        x1: canvas.n(x),
        x2: canvas.n(x + 12),
        y1: canvas.n(positions[index]!),
        y2: canvas.n(positions[index]!),
        stroke: layout.colours[index]!,
        'stroke-width': 4,
      }),
      canvas.text(x + 16, positions[index]!, name, {
        kind: 'direct',
        className: 'direct-label-text',
        align: 'middle',
      }),
    ]),
  );
  return element('g', { class: 'direct-labels' }, labels);
}
