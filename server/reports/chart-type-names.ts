import type { ChartType } from '../charts/chart-spec.js';

/** Plural names of chart types as a report sentence uses them ("... from bar charts and tables"). */
export const chartTypePluralNames: Readonly<Record<ChartType, string>> = {
  table: 'tables',
  bar: 'bar charts',
  'grouped-bar': 'grouped bar charts',
  'stacked-bar': 'stacked bar charts',
  line: 'line charts',
  area: 'area charts',
  pie: 'pie and donut charts',
  scatter: 'scatter plots',
  bubble: 'bubble charts',
  histogram: 'histograms',
  'box-plot': 'box plots',
  heatmap: 'heatmaps',
  'choropleth-map': 'shaded maps',
  'symbol-map': 'maps with sized symbols',
  network: 'network diagrams',
  treemap: 'treemaps',
};

/** Task levels as verbs with their object, for report sentences. */
export const taskLevelPhrases = {
  read: 'read values from',
  interpret: 'interpret patterns in',
  envision: 'reason beyond what is drawn in',
} as const;

/** Joins names as a list: "a", "a and b", "a, b and c". */
export function joinList(names: readonly string[]): string {
  if (names.length <= 1) return names.join('');
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}
