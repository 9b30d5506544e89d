import { describe, expect, it } from 'vitest';
import { encodingFields } from '../../../server/bank/lint/encoding-fields.js';
import { barChart, broken, runRule } from './lint-helpers.js';

const messages = (item: unknown) => runRule(encodingFields, [item]).map((p) => `${p.field}: ${p.message}`);

describe('encoding-fields', () => {
  it('fires when an encoding names a field missing from fields', () => {
    const item = broken((i) => {
      barChart(i).value = 'riders';
    });
    expect(messages(item)).toEqual(['chart.value: names field "riders", which is not in chart.fields']);
  });

  it('fires for a missing value, a mistyped value and an undescribed field', () => {
    const item = broken((i) => {
      const chart = barChart(i);
      chart.data[0] = { day: 'Mon' };
      chart.data[1] = { day: 'Tue', passengers: '340' };
      chart.data[2] = { day: 'Wed', passengers: 210, boats: 3 };
    });
    expect(messages(item)).toEqual([
      'chart.data.0.passengers: missing value for field "passengers"',
      'chart.data.1.passengers: "340" is not a number (field "passengers" is quantitative)',
      'chart.data.2.boats: field "boats" is not in chart.fields',
    ]);
  });

  it('fires for an ordinal value outside its order and an annotation without a row', () => {
    const item = broken((i) => {
      const chart = barChart(i);
      chart.data[3] = { day: 'Sun', passengers: 90 };
      chart.annotation = { text: 'Holiday', field: 'day', equals: 'Fri' };
    });
    expect(messages(item)).toEqual([
      'chart.data.3.day: "Sun" is not in the order of field "day"',
      'chart.annotation.equals: no row where day is "Fri"',
    ]);
  });

  it('fires for a map that is not stored', () => {
    const item = broken((i) => {
      i.chart = {
        type: 'choropleth-map',
        title: 'Rain by district',
        map: 'nowhere',
        region: 'district',
        value: 'rain',
        fields: [
          { name: 'district', kind: 'nominal', label: 'District' },
          { name: 'rain', kind: 'quantitative', label: 'Rain', unit: 'mm' },
        ],
        data: [{ district: 'north', rain: 10 }],
      };
    });
    expect(messages(item)).toEqual(['chart.map: no stored map "nowhere" (items/maps/nowhere.geojson)']);
  });
});
