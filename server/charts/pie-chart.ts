/** Pie and donut charts: one slice per row, angle proportional to the value. */
import { format } from 'd3-format';
import { arc, type PieArcDatum, pie } from 'd3-shape';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText, fieldOf, fieldTitle, numberAt, seriesColours } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { drawLegend, spreadLabels } from './legend.js';
import { element } from './svg.js';
import { estimateTextWidth } from './text-metrics.js';

const percent = format('.0%');
/** Donut hole radius as a share of the outer radius. */
const donutHole = 0.55;

/**
 * Renders a pie (or donut) chart with d3-shape's `pie` in data order (`sort(null)`), the first
 * slice starting at 12 o'clock and going clockwise. Slice labels sit outside the circle, spread
 * apart on each side; with `labelling: 'legend'` a legend names the slices and slice labels
 * carry only the percentage (when `sliceLabels` is 'category-and-percent').
 *
 * @param spec a parsed `pie` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each slice is `<path class="mark slice" data-row="i">`
 * @throws when a value is negative or all values are 0
 */
export function renderPieChart(spec: ChartSpecOf<'pie'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const values = spec.data.map((row) => numberAt(row, spec.value));
  if (values.some((value) => value < 0)) throw new Error('renderPieChart requires values >= 0');
  const total = values.reduce((sum, value) => sum + value, 0);
  if (total <= 0) throw new Error('renderPieChart requires a positive total');
  const categories = spec.data.map((row) => cellText(row[spec.category]));
  const colours = seriesColours(spec, canvas.theme, categories.length);
  const parts: string[] = [];
  const legend = spec.labelling === 'legend';
  if (legend)
    parts.push(
      drawLegend(
        canvas,
        categories.map((label, index) => ({ label, colour: colours[index]!, shape: 'square' })),
      ),
    );
  const texts = categories.map((category, index) => {
    if (spec.sliceLabels === 'none') return '';
    const share = spec.sliceLabels === 'category-and-percent' ? percent(values[index]! / total) : '';
    return legend ? share : [category, share].filter((text) => text !== '').join(' ');
  });
  const size = canvas.theme.fontSize.label;
  const labelRoom =
    texts.reduce((widest, text) => Math.max(widest, estimateTextWidth(text, size)), 0) +
    (texts.some((t) => t !== '') ? 20 : 0);
  const centreX = canvas.width / 2;
  const centreY = (canvas.top + canvas.bottom) / 2;
  const radius = Math.max(
    20,
    Math.min(canvas.width / 2 - canvas.theme.padding - labelRoom, (canvas.bottom - canvas.top) / 2 - size),
  );
  const slices = pie<number>()
    .sort(null)
    .value((value) => value)(values);
  const shape = arc<PieArcDatum<number>>()
    .innerRadius(spec.donut ? radius * donutHole : 0)
    .outerRadius(radius)
    .digits(canvas.theme.digits);
  const n = (value: number) => canvas.n(value);
  const marks = slices.map((slice, index) => {
    const middle = (slice.startAngle + slice.endAngle) / 2;
    canvas.anchor(
      index,
      centreX + Math.sin(middle) * radius * 0.8,
      centreY - Math.cos(middle) * radius * 0.8,
    );
    return element('path', {
      class: 'mark slice',
      'data-row': index,
      transform: `translate(${n(centreX)},${n(centreY)})`,
      d: shape(slice) ?? '',
      fill: colours[index]!,
      stroke: canvas.theme.colours.background,
      'stroke-width': 1.5,
    });
  });
  // Labels: wanted at the slice's middle angle just outside the rim, then spread per side.
  const labelled = slices
    .map((slice, index) => ({ index, middle: (slice.startAngle + slice.endAngle) / 2 }))
    .filter(({ index }) => texts[index] !== '');
  const labels: string[] = [];
  for (const side of [1, -1]) {
    const group = labelled.filter(({ middle }) => (Math.sin(middle) >= 0 ? 1 : -1) === side);
    const wanted = group.map(({ middle }) => centreY - Math.cos(middle) * (radius + 14));
    const placed = spreadLabels(wanted, size * 1.2, canvas.top + size / 2, canvas.bottom - size / 2);
    group.forEach(({ index, middle }, position) => {
      const rimX = centreX + Math.sin(middle) * radius;
      const rimY = centreY - Math.cos(middle) * radius;
      const labelX = centreX + side * (Math.abs(Math.sin(middle)) * radius + 14);
      const labelY = placed[position]!;
      labels.push(
        element('polyline', {
          class: 'leader',
          points: `${n(rimX)},${n(rimY)} ${n(labelX - side * 4)},${n(labelY)}`,
          fill: 'none',
          stroke: canvas.theme.colours.outline,
        }),
        canvas.text(labelX, labelY, texts[index]!, {
          kind: 'slice',
          className: 'slice-label',
          anchor: side === 1 ? 'start' : 'end',
          align: 'middle',
        }),
      );
    });
  }
  return canvas.finish(
    [...parts, element('g', { class: 'marks' }, marks), element('g', { class: 'labels' }, labels)],
    {
      marks: marks.length,
      markNoun: marks.length === 1 ? 'slice' : 'slices',
      axes: [
        `Slices: ${fieldTitle(fieldOf(spec, spec.category))}, sized by ${fieldTitle(fieldOf(spec, spec.value))}`,
      ],
    },
  );
}
