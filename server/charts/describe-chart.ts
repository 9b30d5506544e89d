/** The default <desc> of a chart: its type, size and axes, never a data value. */
import type { ChartSpec, ChartType } from './chart-spec.js';

/** What a renderer tells {@link describeChart} about the chart it drew. */
export interface ChartSummary {
  /** Number of data marks drawn. */
  readonly marks: number;
  /** Plural noun for the marks, e.g. 'bars', 'points', 'slices'. */
  readonly markNoun: string;
  /** Number of series or groups, when more than one is drawn. */
  readonly series?: number;
  /** Axis descriptions, e.g. ['Horizontal axis: Month', 'Vertical axis: Crossings (boats)']. */
  readonly axes?: readonly string[];
}

const typeNames: Record<ChartType, string> = {
  table: 'Table',
  bar: 'Bar chart',
  'grouped-bar': 'Grouped bar chart',
  'stacked-bar': 'Stacked bar chart',
  line: 'Line chart',
  area: 'Area chart',
  pie: 'Pie chart',
  scatter: 'Scatter plot',
  bubble: 'Bubble chart',
  histogram: 'Histogram',
  'box-plot': 'Box plot',
  heatmap: 'Heat map',
  'choropleth-map': 'Shaded map',
  'symbol-map': 'Map with proportional circles',
  network: 'Network diagram',
  treemap: 'Treemap',
};

/**
 * Builds a short description from the spec's structure: chart type, number of marks and series,
 * axis titles and legend or labels. It names no data value, so it can stand as alt text without
 * answering a question about the chart.
 *
 * @example
 * describeChart(barSpec, { marks: 4, markNoun: 'bars', axes: ['Vertical axis: Ferries'] });
 * // 'Bar chart with 4 bars. Vertical axis: Ferries.'
 */
export function describeChart(spec: ChartSpec, summary: ChartSummary): string {
  let typeName = typeNames[spec.type];
  if (spec.type === 'pie' && spec.donut) typeName = 'Donut chart';
  if (spec.type === 'bar' && spec.orientation === 'horizontal') typeName = 'Horizontal bar chart';
  const sentences = [`${typeName} with ${summary.marks} ${summary.markNoun}`];
  if (summary.series !== undefined && summary.series > 1) {
    sentences.push(
      `${summary.series} series${spec.labelling === 'legend' ? ', named in a legend' : spec.labelling === 'direct' ? ', labelled directly' : ''}`,
    );
  }
  sentences.push(...(summary.axes ?? []));
  if (spec.note !== undefined) sentences.push(`Note: ${spec.note}`);
  return `${sentences.map((sentence) => sentence.replace(/\.$/, '')).join('. ')}.`;
}
