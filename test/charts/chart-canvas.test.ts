import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { collectLabelBoxes } from '../../server/charts/render-chart.js';
import { barSpec } from './fixtures/specs.js';

describe('ChartCanvas title', () => {
  it('wraps a long bold title inside the padding, using the bold width estimate', () => {
    // 48 characters measured 550.61 px in DejaVu Sans Bold 20 px (see text-metrics.test.ts); with
    // 12 units of padding a 600-wide chart has 576 for the title, so 62 characters must wrap.
    const title = 'Weekly visitors at the Lumen Hall science centre, spring term';
    const spec = chartSpecSchema.parse({ ...barSpec, title }) as ChartSpecOf<'bar'>;
    const titles = collectLabelBoxes(spec).filter((box) => box.kind === 'title');
    expect(titles.length).toBe(2);
    expect(titles.map((box) => box.text).join(' ')).toBe(title);
    for (const box of titles) {
      expect(box.x).toBeGreaterThanOrEqual(12);
      expect(box.x + box.width).toBeLessThanOrEqual(588);
    }
    // The first line is as long as fits: adding the next word would pass the right edge.
    expect(titles[0]!.width).toBeGreaterThan(400);
  });
});
