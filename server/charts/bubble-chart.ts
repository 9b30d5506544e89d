/** Bubble chart: a scatter plot whose circle areas are proportional to a third field. */
import { scaleSqrt } from 'd3-scale';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText, fieldOf, fieldTitle, numberOrNull } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { drawPlacedLabels, labelBounds } from './draw-placed-labels.js';
import { type LabelRequest, placeLabels } from './label-placer.js';
import { directLabelWidth } from './legend.js';
import { element } from './svg.js';
import { xyLayout } from './xy-layout.js';

/** Radius of the largest bubble, in viewBox units (about a twelfth of a 400-high chart). */
const largestRadius = 32;

/**
 * Renders a bubble chart: x and y as in a scatter plot, circle AREA proportional to `size`
 * (d3 `scaleSqrt` from 0 to the largest size, largest radius 32 units). Bubbles are drawn
 * largest first so small ones stay visible, with a light fill so overlaps show. Point labels
 * go where {@link placeLabels} finds room around the bubble (right first, then left, above,
 * below, the diagonals, then further out with a leader line).
 *
 * @param spec a parsed `bubble` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each bubble is `<circle class="mark bubble" data-row="i">`
 * @throws when a size is negative
 */
export function renderBubbleChart(spec: ChartSpecOf<'bubble'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const pointLabels =
    spec.pointLabel === undefined ? [] : spec.data.map((row) => cellText(row[spec.pointLabel!]));
  const labelRoom = pointLabels.length === 0 ? 0 : directLabelWidth(canvas, pointLabels) - 16;
  const layout = xyLayout(canvas, spec, Math.max(largestRadius, labelRoom / 2));
  const sizes = layout.points.map((point) => numberOrNull(point.row, spec.size) ?? 0);
  if (sizes.some((size) => size < 0)) throw new Error('renderBubbleChart requires sizes >= 0');
  const radius = scaleSqrt()
    .domain([0, Math.max(...sizes, 0) || 1])
    .range([0, largestRadius]);
  const n = (value: number) => canvas.n(value);
  const placed = layout.points.map((point, position) => ({
    ...point,
    cx: layout.x(point.x),
    cy: layout.y(point.y),
    r: radius(sizes[position]!),
    size: sizes[position]!,
    seriesIndex: layout.seriesOf(point.row),
  }));
  const marks = [...placed]
    .sort((a, b) => b.size - a.size || a.index - b.index)
    .map((bubble) => {
      canvas.anchor(bubble.index, bubble.cx, bubble.cy - bubble.r);
      return element('circle', {
        class: 'mark bubble',
        'data-row': bubble.index,
        'data-series': bubble.seriesIndex,
        cx: n(bubble.cx),
        cy: n(bubble.cy),
        r: n(bubble.r),
        fill: layout.colours[bubble.seriesIndex]!,
        'fill-opacity': 0.65,
        stroke: layout.colours[bubble.seriesIndex]!,
        'stroke-width': 1.5,
      });
    });
  const requests: LabelRequest[] =
    spec.pointLabel === undefined
      ? []
      : placed.map((bubble) => ({
          text: pointLabels[bubble.index]!,
          x: bubble.cx,
          y: bubble.cy,
          markRadius: bubble.r,
          size: canvas.theme.fontSize.label,
        }));
  const labels = drawPlacedLabels(
    canvas,
    requests,
    requests.map(() => 'point'),
    placeLabels(requests, {
      bounds: labelBounds(canvas, layout.plot),
      fixed: canvas.drawnBoxes,
      marks: placed.map((bubble) => ({ x: bubble.cx, y: bubble.cy, r: bubble.r, weight: 300 })),
    }),
  );
  return canvas.finish(
    [layout.frame, element('g', { class: 'marks' }, marks), element('g', { class: 'labels' }, labels)],
    {
      marks: marks.length,
      markNoun: `bubbles whose areas show ${fieldTitle(fieldOf(spec, spec.size))}`,
      series: layout.series.length,
      axes: layout.axes,
    },
  );
}
