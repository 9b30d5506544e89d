import { describe, expect, it } from 'vitest';
import { renderTableChart } from '../../server/charts/table-chart.js';
import { byClass, parseSvg, textsOf } from '../helpers/svg.js';
import { tableSpec } from './fixtures/specs.js';

describe('renderTableChart', () => {
  it('draws a header and one text mark per data cell, numbers right-aligned', () => {
    const root = parseSvg(renderTableChart(tableSpec));
    expect(textsOf(root, 'column-head')).toEqual(['Day', 'Crossings (trips)', 'Passengers']);
    const cells = byClass(root, 'mark cell');
    expect(cells).toHaveLength(12);
    expect(cells.map((cell) => cell.text)).toEqual([
      'Mon',
      '6',
      '412',
      'Tue',
      '5',
      '388',
      'Wed',
      '6',
      '1,204',
      'Thu',
      '4',
      '297',
    ]);
    expect(cells[2]!.attributes['text-anchor']).toBe('end');
    expect(cells[0]!.attributes['text-anchor']).toBeUndefined();
    expect(cells[8]!.attributes['data-row']).toBe('2');
    expect(cells[8]!.attributes['data-column']).toBe('2');
  });

  it('sizes its height to the rows', () => {
    const root = parseSvg(renderTableChart(tableSpec));
    // padding 12 x 2 + title 20 x 1.25 + 8 + 5 rows x 32 = 217
    expect(root.attributes['viewBox']).toBe('0 0 600 217');
  });
});
