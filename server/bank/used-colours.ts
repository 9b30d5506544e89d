import type { ChartSpec } from '../charts/chart-spec.js';
import type { Theme } from '../charts/theme.js';

/** One categorical colour a chart draws, with where it comes from (for problem messages). */
export interface UsedColour {
  readonly colour: string;
  /** `chart.colours.<i>` for the spec's own colours, `theme palette <i>` otherwise. */
  readonly source: string;
}

/** How many categorical colours a chart draws: one per series, slice or group (at least 1). */
export function categoricalColourCount(chart: ChartSpec): number {
  const distinct = (field: string | undefined): number =>
    field === undefined ? 1 : new Set(chart.data.map((row) => String(row[field]))).size;
  switch (chart.type) {
    case 'grouped-bar':
    case 'stacked-bar':
    case 'line':
    case 'area':
    case 'scatter':
    case 'bubble':
      return distinct(chart.series);
    case 'pie':
      return distinct(chart.category);
    case 'treemap':
      return distinct(chart.group);
    case 'network':
      return new Set(chart.nodes.map((n) => n.group ?? '')).size;
    case 'table':
    case 'heatmap':
    case 'choropleth-map':
      return 0;
    default:
      return 1;
  }
}

/**
 * The categorical colours a chart draws, in series order: the spec's `colours`, else the theme's
 * palette, repeating when there are more series than colours (as the renderers do).
 * Sequential ramps (heatmap, choropleth) are not categorical and are not listed.
 */
export function usedColours(chart: ChartSpec, theme: Theme): UsedColour[] {
  const palette = chart.colours ?? theme.colours.categorical;
  const own = chart.colours !== undefined;
  return Array.from({ length: categoricalColourCount(chart) }, (_, index) => {
    const at = index % palette.length;
    return { colour: palette[at]!, source: own ? `chart.colours.${at}` : `theme palette ${at}` };
  });
}
