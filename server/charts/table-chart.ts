/** A table drawn as SVG text: a header row of field labels and one row per data row. */
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText, fieldOf, fieldTitle, valueFormatter } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { element } from './svg.js';
import { estimateTextWidth, wrapText } from './text-metrics.js';
import { defaultTheme } from './theme.js';

const cellPadding = 10;

/**
 * Renders a table as SVG so every item's chart is one SVG: column heads are the fields' titles
 * (bold), numbers are right-aligned, text left-aligned, rows separated by light rules. Unless
 * `options.height` is given the height fits the rows. Every data cell is
 * `<text class="mark cell" data-row="i" data-column="j">`.
 *
 * @param spec a parsed `table` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document
 */
export function renderTableChart(spec: ChartSpecOf<'table'>, options: ChartRenderOptions = {}): string {
  const theme = options.theme ?? defaultTheme;
  const size = theme.fontSize.label;
  const rowHeight = size * 2;
  const textWidth = (options.width ?? theme.width) - 2 * theme.padding;
  const linesHeight = (text: string | undefined, fontSize: number, bold: boolean) =>
    text === undefined
      ? 0
      : wrapText(text, fontSize, textWidth, bold).length * fontSize * theme.lineHeight + 8;
  const natural =
    2 * theme.padding +
    ((options.showTitle ?? true) ? linesHeight(spec.title, theme.fontSize.title, true) : 0) +
    (spec.data.length + 1) * rowHeight +
    linesHeight(spec.note, theme.fontSize.note, false);
  const canvas = new ChartCanvas(spec, { ...options, height: options.height ?? natural });
  const fields = spec.columns.map((name) => fieldOf(spec, name));
  const numeric = fields.map((field) =>
    spec.data.every((row) => typeof row[field.name] === 'number' || row[field.name] === null),
  );
  const texts = spec.data.map((row) =>
    fields.map((field, column) => {
      const cell = row[field.name];
      return numeric[column] && typeof cell === 'number' ? valueFormatter(field)(cell) : cellText(cell);
    }),
  );
  const heads = fields.map(fieldTitle);
  const widths = fields.map(
    (_, column) =>
      Math.max(
        estimateTextWidth(heads[column]!, size, true),
        ...texts.map((row) => estimateTextWidth(row[column]!, size)),
      ) +
      2 * cellPadding,
  );
  const n = (value: number) => canvas.n(value);
  const starts: number[] = [];
  widths.reduce((x, width) => {
    starts.push(x);
    return x + width;
  }, canvas.left);
  const tableRight = Math.min(canvas.right, starts[starts.length - 1]! + widths[widths.length - 1]!);
  const cellX = (column: number) =>
    numeric[column] ? starts[column]! + widths[column]! - cellPadding : starts[column]! + cellPadding;
  const anchor = (column: number) => (numeric[column] ? 'end' : 'start');
  const top = canvas.top;
  const parts: string[] = [];
  fields.forEach((_, column) => {
    parts.push(
      canvas.text(cellX(column), top + rowHeight / 2, heads[column]!, {
        kind: 'header',
        className: 'column-head',
        bold: true,
        anchor: anchor(column),
        align: 'middle',
      }),
    );
  });
  parts.push(
    element('line', {
      class: 'rule',
      x1: n(canvas.left),
      x2: n(tableRight),
      y1: n(top + rowHeight),
      y2: n(top + rowHeight),
      stroke: canvas.theme.colours.axis,
      'stroke-width': 1.5,
    }),
  );
  const cells: string[] = [];
  texts.forEach((row, rowIndex) => {
    const middle = top + rowHeight * (rowIndex + 1.5);
    const bottom = top + rowHeight * (rowIndex + 2);
    row.forEach((text, column) => {
      cells.push(
        canvas.text(cellX(column), middle, text, {
          kind: 'cell',
          className: 'mark cell',
          anchor: anchor(column),
          align: 'middle',
          extra: { 'data-row': rowIndex, 'data-column': column },
        }),
      );
    });
    canvas.anchor(rowIndex, (canvas.left + tableRight) / 2, top + rowHeight * (rowIndex + 1));
    parts.push(
      element('line', {
        class: 'rule',
        x1: n(canvas.left),
        x2: n(tableRight),
        y1: n(bottom),
        y2: n(bottom),
        stroke: canvas.theme.colours.grid,
      }),
    );
  });
  return canvas.finish(
    [element('g', { class: 'table-frame' }, parts), element('g', { class: 'marks' }, cells)],
    {
      marks: spec.data.length,
      markNoun: `rows and ${fields.length} columns (${heads.join(', ')})`,
    },
  );
}
