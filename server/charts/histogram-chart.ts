/** Histogram: counts of observations in equal-width bins, bars touching. */
import { drawNumericAxis, numericAxis } from './axis.js';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { fieldOf, fieldTitle, numberOrNull, valueFormatter } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { computeHistogramBins } from './histogram-bins.js';
import { drawAxisTitles, plotFrame } from './plot-frame.js';
import { element } from './svg.js';

/** Up to this many bins every bin edge is a labelled tick; beyond, d3 picks the ticks. */
const maxEdgeTicks = 10;

/**
 * Renders a histogram of `value` with bins from {@link computeHistogramBins} (first bin at
 * `binStart`, width `binWidth`, half-open). The x axis spans the bins, labelling every edge when
 * there are at most 10 bins; the y axis counts observations from 0 with whole-number ticks.
 *
 * @param spec a parsed `histogram` spec (one row per observation)
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each bin, empty ones included, is `<rect class="mark bin" data-bin="k">`
 * @throws as computeHistogramBins
 */
export function renderHistogramChart(
  spec: ChartSpecOf<'histogram'>,
  options: ChartRenderOptions = {},
): string {
  const canvas = new ChartCanvas(spec, options);
  const observations = spec.data.map((row, index) => ({ index, value: numberOrNull(row, spec.value) }));
  const present = observations.flatMap(({ value }) => (value === null ? [] : [value]));
  const bins = computeHistogramBins(present, spec.binStart, spec.binWidth);
  const valueField = fieldOf(spec, spec.value);
  const low = bins[0]!.x0;
  const high = bins[bins.length - 1]!.x1;
  const xAxis = numericAxis(
    {
      scale: 'linear',
      domain: [low, high],
      ...(bins.length <= maxEdgeTicks ? { tickStep: spec.binWidth } : {}),
    },
    [low, high],
    valueField.kind === 'temporal' ? { format: valueFormatter(valueField) } : {},
  );
  const yAxis = numericAxis(
    spec.countAxis,
    bins.map((b) => b.count),
    { includeZero: true, integerTicks: true },
  );
  const xTitle = fieldTitle(valueField);
  const yTitle = 'Number of observations';
  const plot = plotFrame(canvas, {
    leftLabels: yAxis.labels,
    bottomLabels: xAxis.labels,
    leftTitle: yTitle,
    bottomTitle: xTitle,
  });
  const x = xAxis.scale.copy().range([plot.x, plot.x + plot.width]);
  const y = yAxis.scale
    .copy()
    .clamp(true)
    .range([plot.y + plot.height, plot.y]);
  const base = y.domain()[0]!;
  const n = (value: number) => canvas.n(value);
  const marks = bins.map((b, index) => {
    const top = y(Math.max(b.count, base));
    return element('rect', {
      class: 'mark bin',
      'data-bin': index,
      x: n(x(b.x0)),
      y: n(top),
      width: n(x(b.x1) - x(b.x0)),
      height: n(y(base) - top),
      fill: (spec.colours ?? canvas.theme.colours.categorical)[0]!,
      stroke: canvas.theme.colours.background,
      'stroke-width': 1,
    });
  });
  for (const { index, value } of observations) {
    if (value === null) continue;
    const b =
      bins.find((candidate) => value >= candidate.x0 && value < candidate.x1) ?? bins[bins.length - 1]!;
    canvas.anchor(index, x((b.x0 + b.x1) / 2), y(b.count));
  }
  return canvas.finish(
    [
      drawNumericAxis(canvas, { ...yAxis, scale: y }, 'left', plot, spec.gridlines),
      drawNumericAxis(canvas, { ...xAxis, scale: x }, 'bottom', plot, false),
      ...drawAxisTitles(canvas, plot, { left: yTitle, bottom: xTitle }),
      element('g', { class: 'marks' }, marks),
    ],
    {
      marks: marks.length,
      markNoun: marks.length === 1 ? 'bin' : 'bins',
      axes: [`Horizontal axis: ${xTitle}, in bins of equal width`, `Vertical axis: ${yTitle}`],
    },
  );
}
