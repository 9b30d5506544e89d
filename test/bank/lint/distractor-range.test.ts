import { describe, expect, it } from 'vitest';
import { distractorRange } from '../../../server/bank/lint/distractor-range.js';
import { broken, runRule, singleChoice } from './lint-helpers.js';

describe('distractor-range', () => {
  const valueItem = (values: number[], domain?: [number, number]) =>
    broken((i) => {
      if (i.chart.type === 'bar')
        i.chart.valueAxis = domain === undefined ? { scale: 'linear' } : { scale: 'linear', domain };
      i.prompt = 'How many people took the ferry on Tuesday?';
      i.key = { by: 'query', query: { op: 'value-at', field: 'passengers', where: { day: 'Tue' } } };
      singleChoice(i).options = values.map((value, index) => ({
        id: 'abcd'[index]!,
        text: `${value} people`,
        value,
      }));
    });

  it('fires for a numeric distractor above the axis domain given in the spec', () => {
    expect(runRule(distractorRange, [valueItem([210, 340, 450, 120], [0, 400])])).toEqual([
      expect.objectContaining({
        field: 'response.options.2.value',
        message: 'numeric distractor 450 is outside the drawn axis range 0 to 400',
      }),
    ]);
  });

  it('uses the axis the renderer draws without a domain: 0 to the nice maximum of the data', () => {
    // data 90..340 with 0 included: d3-scale 4 scaleLinear().domain([0, 340]).nice(5) is [0, 350]
    // (tick step 50; reference library, computed here with the installed d3-scale)
    expect(runRule(distractorRange, [valueItem([210, 340, 350, 120])])).toEqual([]);
    expect(runRule(distractorRange, [valueItem([210, 340, 351, -5])]).map((p) => p.field)).toEqual([
      'response.options.2.value',
      'response.options.3.value',
    ]);
  });

  it('leaves answers that are not read off the axis alone (a rank is not on the axis)', () => {
    const item = broken((i) => {
      i.key = { by: 'query', query: { op: 'rank', field: 'passengers', by: 'day', equals: 'Mon' } };
      singleChoice(i).options = [1, 2, 3, 4].map((value, index) => ({
        id: 'abcd'[index]!,
        text: `${value}`,
        value: value * 1000,
      }));
    });
    expect(runRule(distractorRange, [item])).toEqual([]);
  });
});
