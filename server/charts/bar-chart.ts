/** Bar chart: one bar per row, vertical or horizontal, optionally sorted and value-labelled. */
import { numericAxis } from './axis.js';
import { bandLayout, barRect } from './band-layout.js';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText, fieldOf, fieldTitle, numberOrNull, seriesColours, valueFormatter } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { directLabelWidth } from './legend.js';
import { element } from './svg.js';

/**
 * Renders a bar chart: one bar per data row, bars start at zero (or at the near end of a truncated
 * or log axis), categories in data order unless `sort` is set (ties keep data order).
 *
 * @param spec a parsed `bar` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each bar is `<rect class="mark bar" data-row="i">`
 * @throws when a value is text, or a log axis meets a value <= 0
 */
export function renderBarChart(spec: ChartSpecOf<'bar'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const valueField = fieldOf(spec, spec.value);
  const categoryField = fieldOf(spec, spec.category);
  const formatValue = valueFormatter(valueField);
  const rows = spec.data.map((row, index) => ({
    index,
    category: cellText(row[spec.category]),
    value: numberOrNull(row, spec.value),
  }));
  if (spec.sort !== 'none') {
    const direction = spec.sort === 'ascending' ? 1 : -1;
    rows.sort((a, b) => {
      if (a.value === null || b.value === null)
        return (a.value === null ? 1 : 0) - (b.value === null ? 1 : 0);
      return direction * (a.value - b.value) || a.index - b.index;
    });
  }
  const values = rows.flatMap((row) => (row.value === null ? [] : [row.value]));
  const valueAxis = numericAxis(spec.valueAxis, values, { includeZero: true });
  const horizontal = spec.orientation === 'horizontal';
  const valueLabels = rows.map((row) => (row.value === null ? '' : formatValue(row.value)));
  const layout = bandLayout(canvas, {
    categories: rows.map((row) => row.category),
    valueAxis,
    horizontal,
    categoryTitle: fieldTitle(categoryField),
    valueTitle: fieldTitle(valueField),
    gridlines: spec.gridlines,
    rightMargin: spec.valueLabels && horizontal ? directLabelWidth(canvas, valueLabels) : 0,
  });
  const [colour] = seriesColours(spec, canvas.theme, 1);
  const thickness = layout.band.bandwidth();
  const marks: string[] = [];
  const labels: string[] = [];
  rows.forEach((row, position) => {
    if (row.value === null) return;
    const offset = layout.band(String(position))!;
    const rect = barRect(layout, offset, thickness, layout.base, row.value);
    marks.push(
      element('rect', {
        class: 'mark bar',
        'data-row': row.index,
        x: canvas.n(rect.x),
        y: canvas.n(rect.y),
        width: canvas.n(rect.width),
        height: canvas.n(rect.height),
        fill: colour,
      }),
    );
    const end = layout.value(row.value);
    const negative = row.value < layout.base;
    if (horizontal) canvas.anchor(row.index, negative ? rect.x : rect.x + rect.width, offset + thickness / 2);
    else canvas.anchor(row.index, offset + thickness / 2, negative ? rect.y + rect.height : rect.y);
    if (spec.valueLabels) {
      const text = valueLabels[position]!;
      labels.push(
        horizontal
          ? canvas.text(end + (negative ? -6 : 6), offset + thickness / 2, text, {
              kind: 'value',
              className: 'value-label',
              anchor: negative ? 'end' : 'start',
              align: 'middle',
            })
          : canvas.text(offset + thickness / 2, end + (negative ? 6 : -6), text, {
              kind: 'value',
              className: 'value-label',
              anchor: 'middle',
              align: negative ? 'top' : 'bottom',
            }),
      );
    }
  });
  const axisNames = horizontal ? ['Vertical axis', 'Horizontal axis'] : ['Horizontal axis', 'Vertical axis'];
  return canvas.finish(
    [layout.axes, element('g', { class: 'marks' }, marks), element('g', { class: 'labels' }, labels)],
    {
      marks: marks.length,
      markNoun: marks.length === 1 ? 'bar' : 'bars',
      axes: [`${axisNames[0]}: ${fieldTitle(categoryField)}`, `${axisNames[1]}: ${fieldTitle(valueField)}`],
    },
  );
}
