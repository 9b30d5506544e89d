import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { renderStackedBarChart } from '../../server/charts/stacked-bar-chart.js';
import { axisMapping, byClass, num, parseSvg, textsOf } from '../helpers/svg.js';
import { stackedBarSpec } from './fixtures/specs.js';

describe('renderStackedBarChart', () => {
  it('stacks segments so each bar reaches its total', () => {
    const root = parseSvg(renderStackedBarChart(stackedBarSpec));
    const segments = byClass(root, 'mark segment');
    expect(segments).toHaveLength(9);
    const y = axisMapping(root, 'left');
    // Q2: cod 25 + herring 35 + crab 10 = 70; the crab segment's top is at 70.
    const q2Crab = segments.find((segment) => segment.attributes['data-row'] === '5')!;
    expect(num(q2Crab, 'y')).toBeCloseTo(y(70), 1);
    expect(textsOf(root, 'direct-label')).toEqual(['Cod', 'Herring', 'Crab']);
  });

  it('scales every bar to 100 % when normalised', () => {
    const spec = chartSpecSchema.parse({
      ...stackedBarSpec,
      normalised: true,
      labelling: 'legend',
    }) as ChartSpecOf<'stacked-bar'>;
    const root = parseSvg(renderStackedBarChart(spec));
    expect(textsOf(root, 'tick-label').slice(0, 5)).toEqual(['0%', '25%', '50%', '75%', '100%']);
    const heights = [0, 1, 2].map((bar) =>
      byClass(root, 'mark segment')
        .filter((segment) => Math.floor(Number(segment.attributes['data-row']) / 3) === bar)
        .reduce((sum, segment) => sum + num(segment, 'height'), 0),
    );
    expect(heights[1]).toBeCloseTo(heights[0]!, 0);
    expect(heights[2]).toBeCloseTo(heights[0]!, 0);
    // Q1 cod 30 of 55
    const y = axisMapping(root, 'left');
    const q1Cod = byClass(root, 'mark segment').find((segment) => segment.attributes['data-row'] === '0')!;
    expect(num(q1Cod, 'y')).toBeCloseTo(y(30 / 55), 0);
  });

  it('labels a 100 % axis every valueAxis.tickStep percent (10 -> 0 %, 10 %, ..., 100 %)', () => {
    const spec = chartSpecSchema.parse({
      ...stackedBarSpec,
      normalised: true,
      labelling: 'legend',
      valueAxis: { scale: 'linear', domain: [0, 100], tickStep: 10 },
    }) as ChartSpecOf<'stacked-bar'>;
    const root = parseSvg(renderStackedBarChart(spec));
    const ticks = textsOf(root, 'tick-label').filter((label) => label.endsWith('%'));
    expect(ticks).toEqual(['0%', '10%', '20%', '30%', '40%', '50%', '60%', '70%', '80%', '90%', '100%']);
    const y = axisMapping(root, 'left');
    expect(y(0.1) - y(0)).toBeCloseTo((y(1) - y(0)) / 10, 6);
  });

  it('falls back to 25 % steps when tickStep does not divide 100', () => {
    const spec = chartSpecSchema.parse({
      ...stackedBarSpec,
      normalised: true,
      labelling: 'legend',
      valueAxis: { scale: 'linear', tickStep: 30 },
    }) as ChartSpecOf<'stacked-bar'>;
    const ticks = textsOf(parseSvg(renderStackedBarChart(spec)), 'tick-label').filter((l) => l.endsWith('%'));
    expect(ticks).toEqual(['0%', '25%', '50%', '75%', '100%']);
  });
});
