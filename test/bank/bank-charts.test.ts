/**
 * Bank-wide renderer check: every committed item's chart renders, is well-formed XML, and draws
 * exactly the number of data marks its data implies (counted here from the data, not from the
 * renderer's own helpers, so a renderer that drops or duplicates a mark fails).
 */
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { bankChartRenderer } from '../../server/bank/bank-chart-renderer.js';
import type { BankItem } from '../../server/bank/load-bank.js';
import { loadBank } from '../../server/bank/load-bank.js';
import type { ChartSpec, Row } from '../../server/charts/chart-spec.js';
import { byClass, findElements, parseSvg } from '../helpers/svg.js';

const itemsDir = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'items');
const bank = await loadBank(itemsDir);
const render = bankChartRenderer(bank.maps);

const isNumber = (value: unknown): value is number => typeof value === 'number' && Number.isFinite(value);
const withNumber = (rows: readonly Row[], ...fields: string[]) =>
  rows.filter((row) => fields.every((field) => isNumber(row[field]))).length;
const distinct = (rows: readonly Row[], field: string) => new Set(rows.map((row) => String(row[field]))).size;

/** Mark class -> expected count, from the spec's data alone. */
function expectedMarks(spec: ChartSpec): Record<string, number> {
  switch (spec.type) {
    case 'table':
      return { 'mark cell': spec.data.length * spec.columns.length };
    case 'bar':
      return { 'mark bar': withNumber(spec.data, spec.value) };
    case 'grouped-bar':
      return { 'mark bar': withNumber(spec.data, spec.value) };
    case 'stacked-bar':
      return { 'mark segment': spec.data.length };
    case 'line':
      return spec.markers
        ? { 'mark point': withNumber(spec.data, spec.y) }
        : { 'mark line': spec.series === undefined ? 1 : distinct(spec.data, spec.series) };
    case 'area':
      return { 'mark area': spec.series === undefined ? 1 : distinct(spec.data, spec.series) };
    case 'pie':
      return { 'mark slice': spec.data.length };
    case 'scatter':
      return { 'mark point': withNumber(spec.data, spec.x, spec.y) };
    case 'bubble':
      return { 'mark bubble': withNumber(spec.data, spec.x, spec.y) };
    case 'histogram': {
      // Half-open bins [start + k w, start + (k + 1) w) from binStart up to the one holding the maximum.
      const values = spec.data.map((row) => row[spec.value]).filter(isNumber);
      const bins = Math.floor((Math.max(...values) - spec.binStart) / spec.binWidth) + 1;
      return { 'mark bin': bins };
    }
    case 'box-plot':
      return { 'mark box': distinct(spec.data, spec.category) };
    case 'heatmap':
      return { 'mark cell': withNumber(spec.data, spec.value) };
    case 'choropleth-map':
      return { 'mark region': withNumber(spec.data, spec.value) };
    case 'symbol-map':
      return { 'mark symbol': withNumber(spec.data, spec.value) };
    case 'network':
      return { 'mark node': spec.nodes.length, 'mark link': spec.data.length };
    case 'treemap':
      return { 'mark tile': spec.data.length };
  }
}

describe('every committed item chart', () => {
  it('the bank holds at least 96 items', () => {
    expect(bank.items.length).toBeGreaterThanOrEqual(96);
  });

  it.each(bank.items.map((item: BankItem) => [item.id, item] as const))(
    '%s renders as XML with the marks its data implies',
    (_id, item) => {
      const svg = render(item.chart, { alt: item.alt, idPrefix: `${item.id}-` });
      const root = parseSvg(svg);
      expect(root.attributes['role']).toBe('img');
      for (const [className, count] of Object.entries(expectedMarks(item.chart))) {
        expect({ className, count: byClass(root, className).length }).toEqual({ className, count });
      }
      // No text below 14 units in the 600-unit viewBox.
      for (const text of findElements(root, (element) => element.name === 'text'))
        expect(Number(text.attributes['font-size'])).toBeGreaterThanOrEqual(14);
    },
  );
});
