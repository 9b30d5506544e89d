/** Heat map: a grid of cells, x categories by y categories, shaded by a sequential colour ramp. */
import { scaleBand } from 'd3-scale';
import { drawCategoryAxis, wrappedLineCount } from './axis.js';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { categoriesOf, cellText, fieldOf, fieldTitle, numberOrNull, valueFormatter } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { drawClassLegend, equalIntervalClasses } from './class-legend.js';
import { contrastRatio } from './colour/contrast-ratio.js';
import { drawAxisTitles, plotFrame } from './plot-frame.js';
import { element } from './svg.js';

/**
 * Renders a heat map: x categories along the bottom, y categories down the left (first at the
 * top), one cell per row shaded by its value's equal-interval class (`classes`, default 5, see
 * {@link equalIntervalClasses}) with a class legend above. With `cellLabels` each cell prints its
 * value in whichever of the text colour or white contrasts more with the cell.
 *
 * @param spec a parsed `heatmap` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each cell with a value is `<rect class="mark cell" data-row="i">`
 */
export function renderHeatmapChart(spec: ChartSpecOf<'heatmap'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const valueField = fieldOf(spec, spec.value);
  const cells = spec.data.flatMap((row, index) => {
    const value = numberOrNull(row, spec.value);
    return value === null ? [] : [{ index, value, x: cellText(row[spec.x]), y: cellText(row[spec.y]) }];
  });
  const classes = equalIntervalClasses(
    cells.map((cell) => cell.value),
    spec.classes,
    canvas.theme,
  );
  const legend = drawClassLegend(canvas, classes, fieldTitle(valueField));
  const xCategories = categoriesOf(spec, spec.x);
  const yCategories = categoriesOf(spec, spec.y);
  const xTitle = fieldTitle(fieldOf(spec, spec.x));
  const yTitle = fieldTitle(fieldOf(spec, spec.y));
  const tickSize = canvas.theme.fontSize.tick;
  // Column labels wrap to the column step the axis will use (4 % band padding, 8 units of air);
  // the plot's width depends on the label lines, so lay out once, then again if the lines change.
  const frameFor = (bottomLabelLines: number) =>
    plotFrame(canvas, {
      leftLabels: yCategories,
      bottomLabels: xCategories,
      bottomLabelLines,
      leftTitle: yTitle,
      bottomTitle: xTitle,
    });
  const linesFor = (width: number) =>
    wrappedLineCount(xCategories, tickSize, width / (Math.max(1, xCategories.length) + 0.04) - 8);
  let lines = linesFor(canvas.right - canvas.left);
  let plot = frameFor(lines);
  const needed = linesFor(plot.width);
  if (needed !== lines) {
    lines = needed;
    plot = frameFor(lines);
  }
  const x = scaleBand<string>()
    .domain(xCategories)
    .range([plot.x, plot.x + plot.width])
    .padding(0.04);
  const y = scaleBand<string>()
    .domain(yCategories)
    .range([plot.y, plot.y + plot.height])
    .padding(0.04);
  const n = (value: number) => canvas.n(value);
  const format = valueFormatter(valueField);
  const marks: string[] = [];
  const labels: string[] = [];
  for (const cell of cells) {
    const left = x(cell.x)!;
    const top = y(cell.y)!;
    const fill = classes.colourOf(cell.value);
    const cx = left + x.bandwidth() / 2;
    const cy = top + y.bandwidth() / 2;
    canvas.anchor(cell.index, cx, top);
    marks.push(
      element('rect', {
        class: 'mark cell',
        'data-row': cell.index,
        x: n(left),
        y: n(top),
        width: n(x.bandwidth()),
        height: n(y.bandwidth()),
        fill,
      }),
    );
    if (spec.cellLabels) {
      const dark = canvas.theme.colours.text;
      const light = canvas.theme.colours.background;
      const textFill = contrastRatio(dark, fill) >= contrastRatio(light, fill) ? dark : light;
      labels.push(
        canvas.text(cx, cy, format(cell.value), {
          kind: 'cell',
          className: 'cell-label',
          anchor: 'middle',
          align: 'middle',
          fill: textFill,
        }),
      );
    }
  }
  const tickOf = (scale: typeof x) => (label: string) => ({
    label,
    position: scale(label)! + scale.bandwidth() / 2,
  });
  return canvas.finish(
    [
      legend,
      drawCategoryAxis(canvas, xCategories.map(tickOf(x)), 'bottom', plot, { bandWidth: x.step() - 8 }),
      drawCategoryAxis(canvas, yCategories.map(tickOf(y)), 'left', plot, { bandWidth: y.bandwidth() }),
      ...drawAxisTitles(canvas, plot, { left: yTitle, bottom: xTitle }, lines),
      element('g', { class: 'marks' }, marks),
      element('g', { class: 'labels' }, labels),
    ],
    {
      marks: marks.length,
      markNoun: `cells in ${yCategories.length} rows and ${xCategories.length} columns, shaded in ${spec.classes} classes of ${fieldTitle(valueField)} shown in a legend`,
      axes: [`Columns: ${xTitle}`, `Rows: ${yTitle}`],
    },
  );
}
