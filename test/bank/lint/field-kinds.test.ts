import { describe, expect, it } from 'vitest';
import { fieldKinds } from '../../../server/bank/lint/field-kinds.js';
import { barChart, broken, runRule } from './lint-helpers.js';

describe('field-kinds', () => {
  it('fires when a nominal field is drawn on a quantitative axis', () => {
    // common practice, no source: a categorical variable is never shown on an interval scale
    const item = broken((i) => {
      const chart = barChart(i);
      chart.fields[1] = { name: 'passengers', kind: 'nominal', label: 'Passengers' };
    });
    expect(runRule(fieldKinds, [item])).toEqual([
      expect.objectContaining({
        field: 'chart.value',
        message: 'nominal field "passengers" drawn on a quantitative axis or scale',
      }),
    ]);
  });

  it('fires when a scatter plot x axis is not quantitative and a line runs along a nominal field', () => {
    const fields = [
      { name: 'boat', kind: 'nominal' as const, label: 'Boat' },
      { name: 'catch', kind: 'quantitative' as const, label: 'Catch', unit: 'kg' },
    ];
    const data = [
      { boat: 'Gull', catch: 10 },
      { boat: 'Tern', catch: 14 },
    ];
    const scatter = broken((i) => {
      i.chart = { type: 'scatter', title: 'Catch', fields, data, x: 'boat', y: 'catch' };
    });
    const line = broken((i) => {
      i.chart = { type: 'line', title: 'Catch', fields, data, x: 'boat', y: 'catch' };
    });
    expect(runRule(fieldKinds, [scatter])[0]?.message).toBe(
      'nominal field "boat" drawn on a quantitative axis or scale',
    );
    expect(runRule(fieldKinds, [line])[0]?.message).toBe(
      'nominal field "boat" drawn along a line, which implies an order',
    );
  });

  it('fires when a quantitative field is drawn as categories', () => {
    const item = broken((i) => {
      barChart(i).fields[0] = { name: 'day', kind: 'quantitative', label: 'Day' };
    });
    expect(runRule(fieldKinds, [item])[0]?.message).toBe(
      'quantitative field "day" drawn as categories; make it ordinal or temporal',
    );
  });
});
