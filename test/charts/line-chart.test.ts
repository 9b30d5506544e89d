import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { renderLineChart } from '../../server/charts/line-chart.js';
import { axisMapping, byClass, num, parseSvg, textsOf } from '../helpers/svg.js';
import { lineSpec, multiLineSpec } from './fixtures/specs.js';

describe('renderLineChart', () => {
  it('draws one point per row on one line, at the value on the y axis', () => {
    const root = parseSvg(renderLineChart(lineSpec));
    const points = byClass(root, 'mark point');
    expect(points).toHaveLength(6);
    expect(byClass(root, 'series-line')).toHaveLength(1);
    const y = axisMapping(root, 'left');
    for (const [index, point] of points.entries()) {
      expect(num(point, 'cy')).toBeCloseTo(y([4, 5, 8, 11, 14, 17][index]!), 1);
    }
    const xs = points.map((point) => num(point, 'cx'));
    expect([...xs].sort((a, b) => a - b)).toEqual(xs);
    expect(textsOf(root, 'tick-label').slice(-6)).toEqual(['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun']);
  });

  it('draws several series with direct labels and whole-year ticks', () => {
    const root = parseSvg(renderLineChart(multiLineSpec));
    expect(byClass(root, 'mark point')).toHaveLength(8);
    expect(byClass(root, 'series-line')).toHaveLength(2);
    expect(textsOf(root, 'direct-label-text')).toEqual(['North Sands', 'Seal Cove']);
    expect(textsOf(byClass(root, 'axis-bottom')[0]!, 'tick-label')).toEqual(['2030', '2031', '2032', '2033']);
    expect(byClass(root, 'legend')).toHaveLength(0);
  });

  it('uses a legend and one mark per line when markers are off', () => {
    const spec = chartSpecSchema.parse({
      ...multiLineSpec,
      labelling: 'legend',
      markers: false,
    }) as ChartSpecOf<'line'>;
    const root = parseSvg(renderLineChart(spec));
    expect(byClass(root, 'mark line')).toHaveLength(2);
    expect(byClass(root, 'mark point')).toHaveLength(0);
    expect(textsOf(root, 'legend-label')).toEqual(['North Sands', 'Seal Cove']);
  });

  it('breaks the line at a null value', () => {
    const data = lineSpec.data.map((row, index) => (index === 2 ? { ...row, temp: null } : row));
    const spec = chartSpecSchema.parse({ ...lineSpec, data }) as ChartSpecOf<'line'>;
    const root = parseSvg(renderLineChart(spec));
    expect(byClass(root, 'mark point')).toHaveLength(5);
    expect(byClass(root, 'series-line')[0]!.attributes['d']!.match(/M/g)).toHaveLength(2);
  });
});
