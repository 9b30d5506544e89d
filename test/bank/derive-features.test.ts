import { describe, expect, it } from 'vitest';
import { deriveFeatures } from '../../server/bank/derive-features.js';
import { itemSchema } from '../../server/bank/item-schema.js';
import { validItem } from './valid-item.js';

describe('deriveFeatures', () => {
  it('computes the bar chart features and keeps the authored extras', () => {
    const features = deriveFeatures(itemSchema.parse(validItem()));
    expect(features).toEqual({
      chartType: 'bar',
      markCount: 4,
      seriesCount: 1,
      channels: ['position', 'length'],
      labelling: 'direct',
      legend: false,
      axisScales: ['categorical', 'linear'],
      logAxis: false,
      truncatedAxis: false,
      annotation: false,
      gridlines: false,
      sorted: false,
      valueLabels: false,
      keyOp: 'largest',
      multiStep: false,
      precision: false,
      distractorKinds: ['neighbour'],
    });
  });

  it('sees a log axis, a truncated axis and sorted bars', () => {
    const base = validItem();
    const chart = {
      ...base.chart,
      data: [
        { day: 'Mon', passengers: 400 },
        { day: 'Tue', passengers: 300 },
        { day: 'Wed', passengers: 200 },
        { day: 'Thu', passengers: 100 },
      ],
      valueAxis: { scale: 'linear', domain: [50, 400] },
    };
    const f = deriveFeatures(itemSchema.parse({ ...base, chart }));
    expect([f.truncatedAxis, f.sorted]).toEqual([true, true]);
    const log = deriveFeatures(
      itemSchema.parse({ ...base, chart: { ...base.chart, valueAxis: { scale: 'log' } } }),
    );
    expect([log.logAxis, log.axisScales]).toEqual([true, ['categorical', 'log']]);
  });
});
