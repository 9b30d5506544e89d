import { describe, expect, it } from 'vitest';
import { renderGroupedBarChart } from '../../server/charts/grouped-bar-chart.js';
import { axisMapping, byClass, num, parseSvg, textsOf } from '../helpers/svg.js';
import { groupedBarSpec } from './fixtures/specs.js';

describe('renderGroupedBarChart', () => {
  it('draws one bar per row, grouped by category, coloured by series', () => {
    const root = parseSvg(renderGroupedBarChart(groupedBarSpec));
    const bars = byClass(root, 'mark bar');
    expect(bars).toHaveLength(6);
    expect(textsOf(root, 'legend-label')).toEqual(['Gull', 'Tern']);
    const y = axisMapping(root, 'left');
    for (const [index, value] of [12, 8, 21, 17, 9, 11].entries())
      expect(num(bars[index]!, 'y')).toBeCloseTo(y(value), 1);
    expect(bars[0]!.attributes['fill']).toBe(bars[2]!.attributes['fill']);
    expect(bars[0]!.attributes['fill']).not.toBe(bars[1]!.attributes['fill']);
    // Within a group the bars sit side by side.
    expect(num(bars[1]!, 'x')).toBeGreaterThan(num(bars[0]!, 'x') + num(bars[0]!, 'width') - 0.01);
  });
});
