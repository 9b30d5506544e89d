import { describe, expect, it } from 'vitest';
import { renderBoxPlotChart } from '../../server/charts/box-plot-chart.js';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { axisMapping, byClass, findElements, num, parseSvg, textsOf } from '../helpers/svg.js';
import { boxPlotSpec } from './fixtures/specs.js';

describe('renderBoxPlotChart', () => {
  it('draws a box from Q1 to Q3 with the median, and outliers as marks', () => {
    const root = parseSvg(renderBoxPlotChart(boxPlotSpec));
    const boxes = byClass(root, 'mark box');
    expect(boxes).toHaveLength(2);
    expect(byClass(root, 'mark outlier')).toHaveLength(1);
    const y = axisMapping(root, 'left');
    // Hilltop 1..8, 30: type 7 quartiles 3, 5, 7; whiskers 1 and 8; 30 is beyond 7 + 1.5 x 4 = 13.
    const rect = findElements(boxes[0]!, (element) => element.name === 'rect')[0]!;
    expect(num(rect, 'y')).toBeCloseTo(y(7), 1);
    expect(num(rect, 'y') + num(rect, 'height')).toBeCloseTo(y(3), 1);
    expect(num(byClass(boxes[0]!, 'median')[0]!, 'y1')).toBeCloseTo(y(5), 1);
    const whiskerEnds = byClass(boxes[0]!, 'whisker').map((line) => num(line, 'y1'));
    expect(whiskerEnds[0]).toBeCloseTo(y(1), 1);
    expect(num(byClass(boxes[0]!, 'whisker')[1]!, 'y2')).toBeCloseTo(y(8), 1);
    expect(num(byClass(root, 'mark outlier')[0]!, 'cy')).toBeCloseTo(y(30), 1);
  });

  it('draws no outliers with min-max whiskers', () => {
    const spec = chartSpecSchema.parse({
      ...boxPlotSpec,
      whiskers: 'min-max',
      orientation: 'horizontal',
    }) as ChartSpecOf<'box-plot'>;
    const root = parseSvg(renderBoxPlotChart(spec));
    expect(byClass(root, 'mark outlier')).toHaveLength(0);
    const x = axisMapping(root, 'bottom');
    expect(num(byClass(byClass(root, 'mark box')[0]!, 'whisker')[1]!, 'x2')).toBeCloseTo(x(30), 1);
  });

  it('keeps short category labels on one line in a horizontal box plot (wrap only when needed)', () => {
    const stops = ['Stop 1', 'Stop 2', 'Stop 3'];
    const spec = chartSpecSchema.parse({
      ...boxPlotSpec,
      orientation: 'horizontal',
      data: stops.flatMap((station, index) =>
        [2, 4, 5, 7, 9].map((rain) => ({ station, rain: rain + index })),
      ),
    }) as ChartSpecOf<'box-plot'>;
    const root = parseSvg(renderBoxPlotChart(spec));
    expect(textsOf(byClass(root, 'axis-left')[0]!, 'tick-label')).toEqual(stops);
  });
});
