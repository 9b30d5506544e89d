/** Shared layout of scatter and bubble charts: two numeric axes and optional series. */
import { drawNumericAxis, type NumericScale, numericAxis, type Rect } from './axis.js';
import type { ChartCanvas } from './chart-canvas.js';
import { categoriesOf, cellText, fieldOf, fieldTitle, numberOrNull, seriesColours } from './chart-data.js';
import type { ChartSpecOf, Row } from './chart-spec.js';
import { drawLegend } from './legend.js';
import { drawAxisTitles, plotFrame } from './plot-frame.js';

type XySpec = ChartSpecOf<'scatter'> | ChartSpecOf<'bubble'>;

export interface XyLayout {
  readonly plot: Rect;
  readonly x: NumericScale;
  readonly y: NumericScale;
  readonly series: readonly string[];
  readonly colours: readonly string[];
  readonly seriesOf: (row: Row) => number;
  /** Rows with both x and y present, with their data index. */
  readonly points: ReadonlyArray<{
    readonly row: Row;
    readonly index: number;
    readonly x: number;
    readonly y: number;
  }>;
  readonly frame: string;
  readonly axes: readonly string[];
}

/**
 * Lays out two numeric axes (each linear or log, domain from the spec or the data made nice),
 * the legend when `labelling` is 'legend' and there are several series, and reserves
 * `rightMargin` for labels beside the points.
 */
export function xyLayout(canvas: ChartCanvas, spec: XySpec, rightMargin: number): XyLayout {
  const series = spec.series === undefined ? [''] : categoriesOf(spec, spec.series);
  const colours = seriesColours(spec, canvas.theme, series.length);
  const seriesField = spec.series;
  const seriesOf = (row: Row) => (seriesField === undefined ? 0 : series.indexOf(cellText(row[seriesField])));
  const parts: string[] = [];
  if (spec.labelling === 'legend' && series.length > 1) {
    parts.push(
      drawLegend(
        canvas,
        series.map((label, index) => ({ label, colour: colours[index]!, shape: 'circle' })),
      ),
    );
  }
  const points = spec.data.flatMap((row, index) => {
    const x = numberOrNull(row, spec.x);
    const y = numberOrNull(row, spec.y);
    return x === null || y === null ? [] : [{ row, index, x, y }];
  });
  const xAxis = numericAxis(
    spec.xAxis,
    points.map((point) => point.x),
    { padding: 0.05 },
  );
  const yAxis = numericAxis(
    spec.yAxis,
    points.map((point) => point.y),
    { padding: 0.05 },
  );
  const xTitle = fieldTitle(fieldOf(spec, spec.x));
  const yTitle = fieldTitle(fieldOf(spec, spec.y));
  const plot = plotFrame(canvas, {
    leftLabels: yAxis.labels,
    bottomLabels: xAxis.labels,
    leftTitle: yTitle,
    bottomTitle: xTitle,
    rightMargin,
  });
  const x = xAxis.scale.copy().range([plot.x, plot.x + plot.width]) as NumericScale;
  const y = yAxis.scale.copy().range([plot.y + plot.height, plot.y]) as NumericScale;
  parts.push(
    drawNumericAxis(canvas, { ...xAxis, scale: x }, 'bottom', plot, spec.gridlines),
    drawNumericAxis(canvas, { ...yAxis, scale: y }, 'left', plot, spec.gridlines),
    ...drawAxisTitles(canvas, plot, { left: yTitle, bottom: xTitle }),
  );
  const scaleName = (log: boolean) => (log ? ', logarithmic scale' : '');
  return {
    plot,
    x,
    y,
    series,
    colours,
    seriesOf,
    points,
    frame: parts.join(''),
    axes: [
      `Horizontal axis: ${xTitle}${scaleName(xAxis.log)}`,
      `Vertical axis: ${yTitle}${scaleName(yAxis.log)}`,
    ],
  };
}
