import { describe, expect, it } from 'vitest';
import { renderHistogramChart } from '../../server/charts/histogram-chart.js';
import { axisMapping, byClass, num, parseSvg, textsOf } from '../helpers/svg.js';
import { histogramSpec } from './fixtures/specs.js';

describe('renderHistogramChart', () => {
  it('draws touching bins with heights equal to the counts', () => {
    const root = parseSvg(renderHistogramChart(histogramSpec));
    const bins = byClass(root, 'mark bin');
    expect(bins).toHaveLength(5);
    const y = axisMapping(root, 'left');
    for (const [index, count] of [2, 5, 2, 1, 1].entries())
      expect(num(bins[index]!, 'y')).toBeCloseTo(y(count), 1);
    for (let index = 1; index < bins.length; index += 1) {
      expect(num(bins[index]!, 'x')).toBeCloseTo(
        num(bins[index - 1]!, 'x') + num(bins[index - 1]!, 'width'),
        1,
      );
    }
    expect(textsOf(byClass(root, 'axis-bottom')[0]!, 'tick-label')).toEqual([
      '6',
      '8',
      '10',
      '12',
      '14',
      '16',
    ]);
    expect(textsOf(byClass(root, 'axis-left')[0]!, 'tick-label')).toEqual(['0', '1', '2', '3', '4', '5']);
  });
});
