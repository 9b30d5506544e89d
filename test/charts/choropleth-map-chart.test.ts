import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { renderChoroplethMapChart } from '../../server/charts/choropleth-map-chart.js';
import { defaultTheme } from '../../server/charts/theme.js';
import { byClass, parseSvg, textsOf } from '../helpers/svg.js';
import { choroplethSpec } from './fixtures/specs.js';
import { testMap } from './fixtures/test-map.js';

describe('renderChoroplethMapChart', () => {
  it('shades regions with data by class and greys regions without', () => {
    const root = parseSvg(renderChoroplethMapChart(choroplethSpec, testMap));
    const regions = byClass(root, 'mark region');
    expect(regions.map((region) => region.attributes['data-region'])).toEqual(['north', 'east', 'south']);
    // 12, 30, 45 % in 3 classes [0, 20), [20, 40), [40, 60]
    const ramp = defaultTheme.sequential(3);
    expect(regions.map((region) => region.attributes['fill'])).toEqual([ramp[0], ramp[1], ramp[2]]);
    expect(byClass(root, 'no-data').map((region) => region.attributes['data-region'])).toEqual(['west']);
    expect(textsOf(root, 'region-label')).toEqual(['North', 'East', 'South', 'West']);
    expect(textsOf(root, 'legend-label')).toEqual(['0', '20', '40', '60', 'No data']);
    // West is a MultiPolygon (main part plus an islet): two closed rings in one path.
    expect(byClass(root, 'no-data')[0]!.attributes['d']!.match(/Z/g)).toHaveLength(2);
  });

  it('fails on a region the map does not have', () => {
    const spec = chartSpecSchema.parse({
      ...choroplethSpec,
      data: [{ district: 'moon', share: 1 }],
    }) as ChartSpecOf<'choropleth-map'>;
    expect(() => renderChoroplethMapChart(spec, testMap)).toThrow('choropleth map has no region moon');
  });
});
