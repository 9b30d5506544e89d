/** One entry point for every chart type: dispatches a parsed spec to its renderer. */
import { renderAreaChart } from './area-chart.js';
import { renderBarChart } from './bar-chart.js';
import { renderBoxPlotChart } from './box-plot-chart.js';
import { renderBubbleChart } from './bubble-chart.js';
import type { ChartRenderOptions } from './chart-canvas.js';
import type { ChartSpec, StoredMap } from './chart-spec.js';
import { renderChoroplethMapChart } from './choropleth-map-chart.js';
import { renderGroupedBarChart } from './grouped-bar-chart.js';
import { renderHeatmapChart } from './heatmap-chart.js';
import { renderHistogramChart } from './histogram-chart.js';
import type { LabelBox } from './label-box.js';
import { renderLineChart } from './line-chart.js';
import { renderNetworkChart } from './network-chart.js';
import { renderPieChart } from './pie-chart.js';
import { renderScatterChart } from './scatter-chart.js';
import { renderStackedBarChart } from './stacked-bar-chart.js';
import { renderSymbolMapChart } from './symbol-map-chart.js';
import { renderTableChart } from './table-chart.js';
import { renderTreemapChart } from './treemap-chart.js';

export interface RenderChartOptions extends ChartRenderOptions {
  /** Stored maps by name, for map specs (`spec.map`). */
  readonly maps?: ReadonlyMap<string, StoredMap>;
}

/**
 * Renders any chart spec to one SVG document by dispatching on `spec.type`. Pure and
 * deterministic: the same spec and options give the same bytes.
 *
 * @param spec a spec parsed by `chartSpecSchema`
 * @param options size, id prefix, alt text, label callback, theme, and stored maps for map specs
 * @returns the SVG document as a string
 * @throws `no stored map <name>` when a map spec's map is not in `options.maps`
 * @example
 * renderChart(barSpec).startsWith('<svg xmlns="http://www.w3.org/2000/svg"'); // true
 */
export function renderChart(spec: ChartSpec, options: RenderChartOptions = {}): string {
  switch (spec.type) {
    case 'table':
      return renderTableChart(spec, options);
    case 'bar':
      return renderBarChart(spec, options);
    case 'grouped-bar':
      return renderGroupedBarChart(spec, options);
    case 'stacked-bar':
      return renderStackedBarChart(spec, options);
    case 'line':
      return renderLineChart(spec, options);
    case 'area':
      return renderAreaChart(spec, options);
    case 'pie':
      return renderPieChart(spec, options);
    case 'scatter':
      return renderScatterChart(spec, options);
    case 'bubble':
      return renderBubbleChart(spec, options);
    case 'histogram':
      return renderHistogramChart(spec, options);
    case 'box-plot':
      return renderBoxPlotChart(spec, options);
    case 'heatmap':
      return renderHeatmapChart(spec, options);
    case 'choropleth-map':
      return renderChoroplethMapChart(spec, storedMap(spec.map, options), options);
    case 'symbol-map':
      return renderSymbolMapChart(spec, storedMap(spec.map, options), options);
    case 'network':
      return renderNetworkChart(spec, options);
    case 'treemap':
      return renderTreemapChart(spec, options);
  }
}

/**
 * The estimated boxes of every text label the chart's renderer draws (tick labels, titles,
 * legend entries, value and direct labels, ...), in drawing order, for the overlap lint
 * (see `findOverlappingLabels`). Renders the chart once with an `onLabel` collector.
 */
export function collectLabelBoxes(spec: ChartSpec, options: RenderChartOptions = {}): LabelBox[] {
  const boxes: LabelBox[] = [];
  renderChart(spec, { ...options, onLabel: (box) => boxes.push(box) });
  return boxes;
}

function storedMap(name: string, options: RenderChartOptions): StoredMap {
  const map = options.maps?.get(name);
  if (map === undefined) throw new Error(`no stored map ${name}`);
  return map;
}
