import { describe, expect, it } from 'vitest';
import { renderHeatmapChart } from '../../server/charts/heatmap-chart.js';
import { defaultTheme } from '../../server/charts/theme.js';
import { byClass, parseSvg, textsOf } from '../helpers/svg.js';
import { heatmapSpec } from './fixtures/specs.js';

describe('renderHeatmapChart', () => {
  it('shades each cell by its equal-interval class and labels the class edges', () => {
    const root = parseSvg(renderHeatmapChart(heatmapSpec));
    const cells = byClass(root, 'mark cell');
    expect(cells).toHaveLength(6);
    // values 5..50 in 5 classes of width 10 from 0: 10 -> class 1, 40 -> 4, 25 -> 2, 5 -> 0, 50 -> 4, 30 -> 3
    const ramp = defaultTheme.sequential(5);
    expect(cells.map((cell) => cell.attributes['fill'])).toEqual(
      [1, 4, 2, 0, 4, 3].map((index) => ramp[index]),
    );
    expect(textsOf(root, 'legend-label')).toEqual(['0', '10', '20', '30', '40', '50']);
    expect(textsOf(root, 'cell-label')).toEqual(['10', '40', '25', '5', '50', '30']);
  });
});
