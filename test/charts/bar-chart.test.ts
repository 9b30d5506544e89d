import { describe, expect, it } from 'vitest';
import { renderBarChart } from '../../server/charts/bar-chart.js';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { axisMapping, byClass, num, parseSvg, textsOf } from '../helpers/svg.js';
import { barSpec, horizontalBarSpec } from './fixtures/specs.js';

describe('renderBarChart', () => {
  it('draws one bar per row with bar length proportional to the value from zero', () => {
    const root = parseSvg(renderBarChart(barSpec));
    const bars = byClass(root, 'mark bar');
    expect(bars.map((bar) => bar.attributes['data-row'])).toEqual(['0', '1', '2', '3', '4']);
    const y = axisMapping(root, 'left');
    // Bar top sits at the value, bottom at zero: 42, 38, 51, 64, 77 trips.
    bars.forEach((bar, index) => {
      const value = [42, 38, 51, 64, 77][index]!;
      expect(num(bar, 'y')).toBeCloseTo(y(value), 1);
      expect(num(bar, 'y') + num(bar, 'height')).toBeCloseTo(y(0), 1);
    });
    expect(textsOf(root, 'tick-label')).toEqual([
      '0',
      '20',
      '40',
      '60',
      '80',
      'Jan',
      'Feb',
      'Mar',
      'Apr',
      'May',
    ]);
    expect(textsOf(root, 'axis-title')).toEqual(['Crossings (trips)', 'Month']);
    expect(byClass(root, 'gridline')).toHaveLength(5);
    expect(textsOf(root, 'annotation-text')).toEqual(['New timetable']);
  });

  it('sorts horizontal bars by value, top to bottom, and prints value labels', () => {
    const root = parseSvg(renderBarChart(horizontalBarSpec));
    const bars = byClass(root, 'mark bar');
    // descending: Fish 12 (row 0), Vegetables 9 (row 3), Bread and cakes 7 (row 1), Wool 3 (row 2)
    expect(bars.map((bar) => bar.attributes['data-row'])).toEqual(['0', '3', '1', '2']);
    const ys = bars.map((bar) => num(bar, 'y'));
    expect([...ys].sort((a, b) => a - b)).toEqual(ys);
    expect(textsOf(root, 'value-label')).toEqual(['12', '9', '7', '3']);
    const x = axisMapping(root, 'bottom');
    expect(num(bars[0]!, 'width')).toBeCloseTo(x(12) - x(0), 1);
  });

  it('starts bars at the bottom of a truncated axis and clamps to its domain', () => {
    const spec = chartSpecSchema.parse({
      ...barSpec,
      annotation: undefined,
      valueAxis: { domain: [30, 80] },
    }) as ChartSpecOf<'bar'>;
    const root = parseSvg(renderBarChart(spec));
    const y = axisMapping(root, 'left');
    const first = byClass(root, 'mark bar')[0]!;
    expect(num(first, 'y') + num(first, 'height')).toBeCloseTo(y(30), 1);
    expect(textsOf(root, 'tick-label')[0]).toBe('30');
  });

  it('labels a log axis at powers of ten', () => {
    const spec = chartSpecSchema.parse({
      ...barSpec,
      annotation: undefined,
      data: [
        { month: 'Jan', crossings: 3 },
        { month: 'Feb', crossings: 450 },
        { month: 'Mar', crossings: 9000 },
      ],
      valueAxis: { scale: 'log' },
    }) as ChartSpecOf<'bar'>;
    const root = parseSvg(renderBarChart(spec));
    expect(textsOf(root, 'tick-label').slice(0, 5)).toEqual(['1', '10', '100', '1,000', '10,000']);
  });

  it('leaves out bars for null values and escapes text', () => {
    const spec = chartSpecSchema.parse({
      ...barSpec,
      annotation: undefined,
      title: 'Boats <small> & "large"',
      data: [
        { month: 'Jan', crossings: 4 },
        { month: 'Feb', crossings: null },
      ],
    }) as ChartSpecOf<'bar'>;
    const svg = renderBarChart(spec);
    expect(svg).toContain('Boats &lt;small&gt; &amp; &quot;large&quot;');
    expect(byClass(parseSvg(svg), 'mark bar')).toHaveLength(1);
  });
});
