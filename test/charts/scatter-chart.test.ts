import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { renderScatterChart } from '../../server/charts/scatter-chart.js';
import { axisMapping, byClass, num, parseSvg } from '../helpers/svg.js';
import { scatterSpec } from './fixtures/specs.js';

describe('renderScatterChart', () => {
  it('places one point per row and draws the least-squares line', () => {
    const root = parseSvg(renderScatterChart(scatterSpec));
    const points = byClass(root, 'mark point');
    expect(points).toHaveLength(5);
    const x = axisMapping(root, 'bottom');
    const y = axisMapping(root, 'left');
    expect(num(points[3]!, 'cx')).toBeCloseTo(x(8), 1);
    expect(num(points[3]!, 'cy')).toBeCloseTo(y(8), 1);
    // Least squares by hand (normal equations): x = 2,4,6,8,10; y = 1,3,4,8,9.
    // Sxy = 42, Sxx = 40, slope = 1.05, intercept = 5 - 1.05 * 6 = -1.3 -> y(2) = 0.8, y(10) = 9.2.
    const line = byClass(root, 'trend-line')[0]!;
    expect(num(line, 'x1')).toBeCloseTo(x(2), 1);
    expect(num(line, 'y1')).toBeCloseTo(y(0.8), 1);
    expect(num(line, 'x2')).toBeCloseTo(x(10), 1);
    expect(num(line, 'y2')).toBeCloseTo(y(9.2), 1);
  });

  it('colours series and names them in a legend', () => {
    const spec = chartSpecSchema.parse({
      ...scatterSpec,
      trendLine: false,
      labelling: 'legend',
      fields: [...scatterSpec.fields, { name: 'boat', kind: 'nominal', label: 'Boat' }],
      data: scatterSpec.data.map((row, index) => ({ ...row, boat: index % 2 === 0 ? 'Gull' : 'Tern' })),
      series: 'boat',
    }) as ChartSpecOf<'scatter'>;
    const root = parseSvg(renderScatterChart(spec));
    const fills = byClass(root, 'mark point').map((point) => point.attributes['fill']);
    expect(new Set(fills).size).toBe(2);
    expect(fills[0]).toBe(fills[2]);
    expect(byClass(root, 'legend-item')).toHaveLength(2);
    expect(byClass(root, 'trend-line')).toHaveLength(0);
  });
});
