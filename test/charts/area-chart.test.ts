import { describe, expect, it } from 'vitest';
import { renderAreaChart } from '../../server/charts/area-chart.js';
import { axisMapping, byClass, parseSvg, textsOf } from '../helpers/svg.js';
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
});
