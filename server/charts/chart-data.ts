/** Reading fields, numbers and categories out of a chart spec's rows. */
import { format } from 'd3-format';
import type { Cell, ChartSpec, Field, Row } from './chart-spec.js';
import type { Theme } from './theme.js';

/** The field named `name`; throws when the spec does not describe it. */
export function fieldOf(spec: ChartSpec, name: string): Field {
  const field = spec.fields.find((candidate) => candidate.name === name);
  if (field === undefined) throw new Error(`chart spec has no field ${name}`);
  return field;
}

/** Axis, legend or column title of a field: its label with the unit in brackets. */
export function fieldTitle(field: Field): string {
  return field.unit === undefined ? field.label : `${field.label} (${field.unit})`;
}

/** The number in `row[name]`, or null when the cell is null or missing; throws on text. */
export function numberOrNull(row: Row, name: string): number | null {
  const cell = row[name];
  if (cell === null || cell === undefined) return null;
  if (typeof cell !== 'number')
    throw new Error(`field ${name} holds text "${cell}" where a number is needed`);
  return cell;
}

/** The number in `row[name]`; throws when it is missing or not a number. */
export function numberAt(row: Row, name: string): number {
  const value = numberOrNull(row, name);
  if (value === null) throw new Error(`field ${name} is missing a number`);
  return value;
}

/** Text of a cell as shown on a chart ('' for null). */
export function cellText(cell: Cell | undefined): string {
  if (cell === null || cell === undefined) return '';
  return typeof cell === 'number' ? formatNumber(cell) : cell;
}

const numberFormat = format(',.3~f');
const yearFormat = format('d');

/** A data value as printed on a chart: thousands separators, at most 3 decimals, no trailing zeros. */
export function formatNumber(value: number): string {
  return numberFormat(value);
}

/** Formats values of a field: years without separators, other numbers with {@link formatNumber}. */
export function valueFormatter(field: Field): (value: number) => string {
  return field.kind === 'temporal' ? yearFormat : formatNumber;
}

/**
 * Distinct values of a field in display order: the field's `order` for ordinal fields (values
 * present in the data only), sorted for temporal fields, first appearance otherwise.
 */
export function categoriesOf(spec: ChartSpec, name: string): string[] {
  const field = fieldOf(spec, name);
  const seen: string[] = [];
  for (const row of spec.data) {
    const text = cellText(row[name]);
    if (!seen.includes(text)) seen.push(text);
  }
  if (field.order !== undefined) {
    const ordered = field.order.filter((category) => seen.includes(category));
    const rest = seen.filter((category) => !field.order!.includes(category));
    return [...ordered, ...rest];
  }
  if (field.kind === 'temporal') return [...seen].sort();
  return seen;
}

/** `count` categorical colours: the spec's own colours, else the theme palette, repeating if needed. */
export function seriesColours(spec: ChartSpec, theme: Theme, count: number): string[] {
  const palette = spec.colours ?? theme.colours.categorical;
  return Array.from({ length: count }, (_, index) => palette[index % palette.length]!);
}

/** Index of the first row matching the spec's annotation, or -1. */
export function annotatedRowIndex(spec: ChartSpec): number {
  const note = spec.annotation;
  if (note === undefined) return -1;
  return spec.data.findIndex((row) => row[note.field] === note.equals);
}
