import type { StoredMap } from '../charts/chart-spec.js';
import type { LabelBox } from '../charts/label-box.js';
import { collectLabelBoxes, renderChart } from '../charts/render-chart.js';
import type { ChartRenderer } from './chart-renderer.js';
import type { Item } from './item-schema.js';

/** The chart layer's renderer with the bank's stored maps bound (item alt text goes in <desc>). */
export function bankChartRenderer(maps: ReadonlyMap<string, StoredMap>): ChartRenderer {
  return (spec, { alt, idPrefix }) => renderChart(spec, { maps, description: alt, idPrefix });
}

/** Label boxes of an item's chart as the renderer places them (for the label-overlap rule). */
export function bankLabelBoxes(maps: ReadonlyMap<string, StoredMap>): (item: Item) => readonly LabelBox[] {
  return (item) => collectLabelBoxes(item.chart, { maps, description: item.alt });
}
