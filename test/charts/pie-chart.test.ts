import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { renderPieChart } from '../../server/charts/pie-chart.js';
import { byClass, parseSvg, textsOf } from '../helpers/svg.js';
import { donutSpec, pieSpec } from './fixtures/specs.js';

/** End point of the first arc command (A rx,ry,rotation,large,sweep,x,y) in a path. */
function arcEnd(d: string): [number, number] {
  const numbers = d
    .slice(d.indexOf('A') + 1)
    .split(/[ ,A-Za-z]+/)
    .filter(Boolean)
    .map(Number);
  return [numbers[5]!, numbers[6]!];
}

describe('renderPieChart', () => {
  it('draws slices in data order from 12 o clock, clockwise, angle proportional to value', () => {
    const root = parseSvg(renderPieChart(pieSpec));
    const slices = byClass(root, 'mark slice');
    expect(slices).toHaveLength(3);
    // The first slice (60 of 100) ends at angle 0.6 * 2 pi from 12 o clock: (r sin a, -r cos a).
    const [x, y] = arcEnd(slices[0]!.attributes['d']!);
    const radius = Math.hypot(x, y);
    const angle = 0.6 * 2 * Math.PI;
    expect(x).toBeCloseTo(radius * Math.sin(angle), 1);
    expect(y).toBeCloseTo(-radius * Math.cos(angle), 1);
    expect(textsOf(root, 'slice-label').sort()).toEqual(['Ferry 60%', 'Own boat 25%', 'Seaplane 15%']);
  });

  it('draws a donut with a legend and no slice labels', () => {
    const root = parseSvg(renderPieChart(donutSpec));
    expect(byClass(root, 'mark slice')).toHaveLength(3);
    expect(textsOf(root, 'legend-label')).toEqual(['Ferry', 'Own boat', 'Seaplane']);
    expect(byClass(root, 'slice-label')).toHaveLength(0);
    // A donut slice has two arcs (outer and inner rim).
    expect(byClass(root, 'mark slice')[0]!.attributes['d']!.match(/A/g)).toHaveLength(2);
  });

  it('refuses negative values', () => {
    const spec = chartSpecSchema.parse({
      ...pieSpec,
      data: [{ way: 'Ferry', people: -1 }],
    }) as ChartSpecOf<'pie'>;
    expect(() => renderPieChart(spec)).toThrow('renderPieChart requires values >= 0');
  });
});
