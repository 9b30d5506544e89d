import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
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

  it('keeps short category labels on one line in horizontal bars (wrap only when needed)', () => {
    // "Stop 1".."Stop 4": the label column is exactly as wide as the widest label, and the layout
    // arithmetic once left it a rounding residue narrower, so each label broke into "Stop" / "1".
    const stops = ['Stop 1', 'Stop 2', 'Stop 3', 'Stop 4'];
    const spec = chartSpecSchema.parse({
      ...groupedBarSpec,
      orientation: 'horizontal',
      fields: [{ name: 'season', kind: 'nominal', label: 'Stop' }, ...groupedBarSpec.fields.slice(1)],
      data: stops.flatMap((season, index) => [
        { season, ferry: 'Gull', passengers: 10 + index },
        { season, ferry: 'Tern', passengers: 5 + index },
      ]),
    }) as ChartSpecOf<'grouped-bar'>;
    const root = parseSvg(renderGroupedBarChart(spec));
    expect(textsOf(byClass(root, 'axis-left')[0]!, 'tick-label')).toEqual(stops);
  });
});
