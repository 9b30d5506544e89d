import { describe, expect, it } from 'vitest';
import { colourVision } from '../../../server/bank/lint/colour-vision.js';
import { broken, runRule } from './lint-helpers.js';

const twoSeries = (colours: string[]) =>
  broken((i) => {
    i.level = 'interpret';
    i.key = { by: 'options', options: ['b'] };
    i.chart = {
      type: 'grouped-bar',
      title: 'Ferry passengers',
      fields: [
        { name: 'day', kind: 'ordinal', label: 'Day', order: ['Mon', 'Tue'] },
        { name: 'ferry', kind: 'nominal', label: 'Ferry' },
        { name: 'passengers', kind: 'quantitative', label: 'Passengers' },
      ],
      data: [
        { day: 'Mon', ferry: 'North', passengers: 10 },
        { day: 'Mon', ferry: 'South', passengers: 12 },
        { day: 'Tue', ferry: 'North', passengers: 15 },
        { day: 'Tue', ferry: 'South', passengers: 9 },
      ],
      category: 'day',
      series: 'ferry',
      value: 'passengers',
      labelling: 'legend',
      colours,
    };
  });

describe('colour-vision', () => {
  it('fires for red and green that merge under simulated deuteranopia and protanopia', () => {
    // a saturated red/green pair: distinct for normal vision, confused by red-green dichromats
    // (Machado, Oliveira and Fernandes 2009 simulation)
    const messages = runRule(colourVision, [twoSeries(['#d62728', '#2ca02c'])]).map((p) => p.message);
    expect(messages.some((m) => m.includes('under simulated deuteranopia'))).toBe(true);
    expect(messages.some((m) => m.includes('with normal vision'))).toBe(false);
  });

  it('passes blue and orange, a pair chosen to survive all three dichromacies', () => {
    expect(runRule(colourVision, [twoSeries(['#1f5f99', '#c2481a'])])).toEqual([]);
  });
});
