import { describe, expect, it } from 'vitest';
import { renderSymbolMapChart } from '../../server/charts/symbol-map-chart.js';
import { byClass, num, parseSvg } from '../helpers/svg.js';
import { symbolMapSpec } from './fixtures/specs.js';
import { testMap } from './fixtures/test-map.js';

describe('renderSymbolMapChart', () => {
  it('draws one circle per row, area proportional to value, largest first', () => {
    const root = parseSvg(renderSymbolMapChart(symbolMapSpec, testMap));
    const symbols = byClass(root, 'mark symbol');
    expect(symbols.map((symbol) => symbol.attributes['data-row'])).toEqual(['1', '2', '0', '3']);
    const radius = (row: string) =>
      num(symbols.find((symbol) => symbol.attributes['data-row'] === row)!, 'r');
    // 1600 vs 100 people: area ratio 16, radius ratio 4.
    expect(radius('1') / radius('3')).toBeCloseTo(4, 2);
    expect(radius('2') / radius('0')).toBeCloseTo(1.5, 2);
    expect(byClass(root, 'region')).toHaveLength(4);
    expect(byClass(root, 'legend-symbol')).toHaveLength(2);
  });
});
