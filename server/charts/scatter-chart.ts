/** Scatter plot: one point per row, optional series colours, point labels and a trend line. */
import { linearRegression } from 'simple-statistics';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { drawPlacedLabels, labelBounds } from './draw-placed-labels.js';
import { type LabelRequest, placeLabels } from './label-placer.js';
import { directLabelWidth } from './legend.js';
import { element } from './svg.js';
import { xyLayout } from './xy-layout.js';

const pointRadius = 5;

/**
 * Renders a scatter plot. Rows missing x or y are left out. With `trendLine` the least-squares
 * line (simple-statistics `linearRegression`, fitted on the drawn coordinates, i.e. on log10
 * values along a log axis) runs across the data's x range, clipped to the plot. Point labels go
 * where {@link placeLabels} finds room (right of the point first, then left, above, below, the
 * diagonals, then further out with a leader line); several series get a legend or (direct) their
 * name beside the series' rightmost point, placed the same way.
 *
 * @param spec a parsed `scatter` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each point is `<circle class="mark point" data-row="i">`
 */
export function renderScatterChart(spec: ChartSpecOf<'scatter'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const pointLabels =
    spec.pointLabel === undefined ? [] : spec.data.map((row) => cellText(row[spec.pointLabel!]));
  const seriesLabels =
    spec.series !== undefined && spec.labelling === 'direct'
      ? [...new Set(spec.data.map((row) => cellText(row[spec.series!])))]
      : [];
  const margin = Math.max(
    0,
    ...[...pointLabels, ...seriesLabels].map((label) => directLabelWidth(canvas, [label]) - 16),
  );
  const layout = xyLayout(canvas, spec, margin / 2);
  const n = (value: number) => canvas.n(value);
  const labelSize = canvas.theme.fontSize.label;
  const marks: string[] = [];
  const requests: LabelRequest[] = [];
  const requestKinds: Array<'point' | 'direct'> = [];
  for (const point of layout.points) {
    const cx = layout.x(point.x);
    const cy = layout.y(point.y);
    const seriesIndex = layout.seriesOf(point.row);
    canvas.anchor(point.index, cx, cy);
    marks.push(
      element('circle', {
        class: 'mark point',
        'data-row': point.index,
        'data-series': seriesIndex,
        cx: n(cx),
        cy: n(cy),
        r: pointRadius,
        fill: layout.colours[seriesIndex]!,
      }),
    );
    if (spec.pointLabel !== undefined) {
      requests.push({
        text: pointLabels[point.index]!,
        x: cx,
        y: cy,
        markRadius: pointRadius,
        size: labelSize,
      });
      requestKinds.push('point');
    }
  }
  if (seriesLabels.length > 1 && spec.pointLabel === undefined) {
    layout.series.forEach((name, seriesIndex) => {
      const members = layout.points.filter((point) => layout.seriesOf(point.row) === seriesIndex);
      const rightmost = members.reduce(
        (best, point) => (best === undefined || point.x > best.x ? point : best),
        members[0],
      );
      if (rightmost === undefined) return;
      requests.push({
        text: name,
        x: layout.x(rightmost.x),
        y: layout.y(rightmost.y),
        markRadius: pointRadius,
        size: labelSize,
        bold: true,
      });
      requestKinds.push('direct');
    });
  }
  const labels = drawPlacedLabels(
    canvas,
    requests,
    requestKinds,
    placeLabels(requests, {
      bounds: labelBounds(canvas, layout.plot),
      fixed: canvas.drawnBoxes,
      marks: layout.points.map((point) => ({
        x: layout.x(point.x),
        y: layout.y(point.y),
        r: pointRadius,
        weight: 300,
      })),
    }),
  );
  const parts = [layout.frame];
  if (spec.trendLine && layout.points.length >= 2) parts.push(trendLine(canvas, spec, layout));
  parts.push(element('g', { class: 'marks' }, marks), element('g', { class: 'labels' }, labels));
  return canvas.finish(parts, {
    marks: marks.length,
    markNoun: marks.length === 1 ? 'point' : 'points',
    series: layout.series.length,
    axes: [...layout.axes, ...(spec.trendLine ? ['A straight trend line is drawn through the points'] : [])],
  });
}

function trendLine(
  canvas: ChartCanvas,
  spec: ChartSpecOf<'scatter'>,
  layout: ReturnType<typeof xyLayout>,
): string {
  const toDrawn = (log: boolean) => (value: number) => (log ? Math.log10(value) : value);
  const fromDrawn = (log: boolean) => (value: number) => (log ? 10 ** value : value);
  const xLog = spec.xAxis.scale === 'log';
  const yLog = spec.yAxis.scale === 'log';
  const pairs = layout.points.map((point) => [toDrawn(xLog)(point.x), toDrawn(yLog)(point.y)]);
  const { m: slope, b: intercept } = linearRegression(pairs);
  const xs = pairs.map((pair) => pair[0]!);
  const ends = [Math.min(...xs), Math.max(...xs)].map((x) => ({
    x: layout.x(fromDrawn(xLog)(x)),
    y: layout.y(fromDrawn(yLog)(slope * x + intercept)),
  }));
  const clipId = `${canvas.idPrefix}-plot-clip`;
  const { plot } = layout;
  const n = (value: number) => canvas.n(value);
  return [
    element(
      'clipPath',
      { id: clipId },
      element('rect', { x: n(plot.x), y: n(plot.y), width: n(plot.width), height: n(plot.height) }),
    ),
    element('line', {
      class: 'trend-line',
      x1: n(ends[0]!.x),
      y1: n(ends[0]!.y),
      x2: n(ends[1]!.x),
      y2: n(ends[1]!.y),
      stroke: canvas.theme.colours.text,
      'stroke-width': 2,
      'stroke-dasharray': '6 4',
      'clip-path': `url(#${clipId})`,
    }),
  ].join('');
}
