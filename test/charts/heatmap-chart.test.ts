import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { renderHeatmapChart } from '../../server/charts/heatmap-chart.js';
import { collectLabelBoxes } from '../../server/charts/render-chart.js';
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

describe('renderHeatmapChart column labels', () => {
  it('leaves room under the plot for column labels that wrap (the axis title stays below them)', () => {
    const slots = ['10:00–12:00', '12:00–14:00', '14:00–16:00', '16:00–18:00'];
    const days = ['Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
    const spec = chartSpecSchema.parse({
      ...heatmapSpec,
      fields: [
        { name: 'day', kind: 'ordinal', label: 'Day', order: days },
        { name: 'hour', kind: 'ordinal', label: 'Time', order: slots },
        { name: 'visitors', kind: 'quantitative', label: 'Visitors' },
      ],
      data: days.flatMap((day, d) =>
        slots.map((hour, h) => ({ day, hour, visitors: 100 + 50 * d + 10 * h })),
      ),
    }) as ChartSpecOf<'heatmap'>;
    const boxes = collectLabelBoxes(spec);
    const ticks = boxes.filter((box) => box.kind === 'tick' && /^\d\d:00/.test(box.text));
    // 8 lines: each slot wraps after its dash at this column width.
    expect(ticks.map((box) => box.text)).toContain('10:00–');
    const title = boxes.find((box) => box.kind === 'axis-title' && box.text === 'Time')!;
    const lowestTick = Math.max(...ticks.map((box) => box.y + box.height));
    expect(title.y).toBeGreaterThanOrEqual(lowestTick);
  });
});
