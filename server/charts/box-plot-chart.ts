/** Box plot: quartile box, median line, whiskers and outliers per category. */
import { numericAxis } from './axis.js';
import { bandLayout } from './band-layout.js';
import { computeBoxPlotStats } from './box-plot-stats.js';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { categoriesOf, cellText, fieldOf, fieldTitle, numberOrNull, seriesColours } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { element } from './svg.js';

/**
 * Renders one box plot per category (categories in display order) with statistics from
 * {@link computeBoxPlotStats}: quartiles by R type 7, whiskers by Tukey's 1.5 IQR rule with
 * outliers as open circles, or from minimum to maximum. Boxes share one colour unless the spec
 * gives one per category.
 *
 * @param spec a parsed `box-plot` spec (one row per observation)
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each box is `<g class="mark box" data-group="k">`, each outlier
 *   `<circle class="mark outlier" data-group="k">`
 */
export function renderBoxPlotChart(spec: ChartSpecOf<'box-plot'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const categories = categoriesOf(spec, spec.category);
  const groups = categories.map(() => [] as number[]);
  for (const row of spec.data) {
    const value = numberOrNull(row, spec.value);
    if (value !== null) groups[categories.indexOf(cellText(row[spec.category]))]!.push(value);
  }
  const stats = groups.map((values) =>
    values.length === 0 ? undefined : computeBoxPlotStats(values, spec.whiskers),
  );
  const valueField = fieldOf(spec, spec.value);
  const categoryField = fieldOf(spec, spec.category);
  const horizontal = spec.orientation === 'horizontal';
  const layout = bandLayout(canvas, {
    categories,
    valueAxis: numericAxis(spec.valueAxis, groups.flat(), { padding: 0.05 }),
    horizontal,
    categoryTitle: fieldTitle(categoryField),
    valueTitle: fieldTitle(valueField),
    gridlines: spec.gridlines,
    paddingInner: 0.5,
  });
  const colours =
    spec.colours === undefined
      ? categories.map(() => canvas.theme.colours.categorical[0]!)
      : seriesColours(spec, canvas.theme, categories.length);
  const n = (value: number) => canvas.n(value);
  const stroke = canvas.theme.colours.text;
  // Draws a segment given positions along the category axis (c) and value axis (v).
  const segment = (c1: number, v1: number, c2: number, v2: number, className: string, width = 2) =>
    horizontal
      ? element('line', {
          class: className,
          x1: n(v1),
          y1: n(c1),
          x2: n(v2),
          y2: n(c2),
          stroke,
          'stroke-width': width,
        })
      : element('line', {
          class: className,
          x1: n(c1),
          y1: n(v1),
          x2: n(c2),
          y2: n(v2),
          stroke,
          'stroke-width': width,
        });
  const marks: string[] = [];
  stats.forEach((stat, group) => {
    if (stat === undefined) return;
    const start = layout.band(String(group))!;
    const thickness = layout.band.bandwidth();
    const middle = start + thickness / 2;
    const [q1, median, q3] = [stat.q1, stat.median, stat.q3].map((value) => layout.value(value)) as [
      number,
      number,
      number,
    ];
    const low = layout.value(stat.lowerWhisker);
    const high = layout.value(stat.upperWhisker);
    const box = horizontal
      ? { x: Math.min(q1, q3), y: start, width: Math.abs(q3 - q1), height: thickness }
      : { x: start, y: Math.min(q1, q3), width: thickness, height: Math.abs(q3 - q1) };
    const cap = thickness / 4;
    marks.push(
      element('g', { class: 'mark box', 'data-group': group }, [
        segment(middle, low, middle, q1, 'whisker'),
        segment(middle, q3, middle, high, 'whisker'),
        segment(middle - cap, low, middle + cap, low, 'whisker-cap'),
        segment(middle - cap, high, middle + cap, high, 'whisker-cap'),
        element('rect', {
          class: 'box',
          x: n(box.x),
          y: n(box.y),
          width: n(box.width),
          height: n(box.height),
          fill: colours[group]!,
          'fill-opacity': 0.35,
          stroke,
          'stroke-width': 2,
        }),
        segment(start, median, start + thickness, median, 'median', 3.5),
      ]),
    );
    for (const outlier of stat.outliers) {
      const along = layout.value(outlier);
      marks.push(
        element('circle', {
          class: 'mark outlier',
          'data-group': group,
          cx: n(horizontal ? along : middle),
          cy: n(horizontal ? middle : along),
          r: 5,
          fill: canvas.theme.colours.background,
          stroke,
          'stroke-width': 2,
        }),
      );
    }
  });
  spec.data.forEach((row, index) => {
    const group = categories.indexOf(cellText(row[spec.category]));
    const value = numberOrNull(row, spec.value);
    const start = layout.band(String(group));
    if (value === null || start === undefined) return;
    const middle = start + layout.band.bandwidth() / 2;
    canvas.anchor(
      index,
      horizontal ? layout.value(value) : middle,
      horizontal ? middle : layout.value(value),
    );
  });
  const boxCount = stats.filter((stat) => stat !== undefined).length;
  return canvas.finish([layout.axes, element('g', { class: 'marks' }, marks)], {
    marks: boxCount,
    markNoun: `boxes${spec.whiskers === 'tukey' ? ` (whiskers reach up to 1.5 times the box length, values beyond are drawn as circles)` : ' (whiskers from minimum to maximum)'}`,
    axes: [
      `${horizontal ? 'Vertical' : 'Horizontal'} axis: ${fieldTitle(categoryField)}`,
      `${horizontal ? 'Horizontal' : 'Vertical'} axis: ${fieldTitle(valueField)}`,
    ],
  });
}
