import { describe, expect, it } from 'vitest';
import { renderAreaChart } from '../../server/charts/area-chart.js';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { axisMapping, byClass, findElements, num, parseSvg, textsOf } from '../helpers/svg.js';
import { areaSpec } from './fixtures/specs.js';

describe('renderAreaChart', () => {
  it('stacks series: the top series ends at the column totals', () => {
    const root = parseSvg(renderAreaChart(areaSpec));
    const areas = byClass(root, 'mark area');
    expect(areas).toHaveLength(2);
    expect(textsOf(root, 'legend-label')).toEqual(['Wind', 'Solar']);
    const y = axisMapping(root, 'left');
    // Solar is stacked on Wind: its upper edge is at Wind + Solar = 45, 45, 45, 44 MWh.
    const upper = areas[1]!.attributes['d']!.split(/[ML]/)
      .filter(Boolean)
      .slice(0, 4)
      .map((pair) => Number(pair.split(',')[1]));
    for (const [index, total] of [45, 45, 45, 44].entries()) expect(upper[index]!).toBeCloseTo(y(total), 1);
  });

  it('points an annotation at the top of the stack, not at the boundary between bands', () => {
    // Row 2 is Wind in March (30 MWh, the bottom band); the stack there is 30 + 15 = 45 MWh.
    const spec = chartSpecSchema.parse({
      ...areaSpec,
      annotation: { text: 'Storm week', field: 'mwh', equals: 30 },
    }) as ChartSpecOf<'area'>;
    const root = parseSvg(renderAreaChart(spec));
    const y = axisMapping(root, 'left');
    const line = findElements(byClass(root, 'annotation')[0]!, (element) => element.name === 'line')[0]!;
    // The line starts 4 units above the mark it points at.
    expect(num(line, 'y1')).toBeCloseTo(y(45) - 4, 1);
    expect(Math.abs(num(line, 'y1') - (y(30) - 4))).toBeGreaterThan(20);
  });
});
