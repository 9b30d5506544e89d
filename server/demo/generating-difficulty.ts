import type { ChartType } from '../charts/chart-spec.js';

/** The item features the demo's invented difficulty formula reads. */
export interface DifficultyFeatures {
  readonly chartType: ChartType;
  readonly level: 'read' | 'interpret' | 'envision';
  readonly markCount: number;
  readonly seriesCount: number;
  readonly legend: boolean;
  readonly logAxis: boolean;
  readonly truncatedAxis: boolean;
  readonly multiStep: boolean;
}

/**
 * INVENTED for the demo, not estimated from any data: how much harder each chart type is made,
 * in logits. Familiar, labelled forms (tables, bars) are made easy; forms with more to decode
 * (box plots, networks, treemaps, bubbles) harder.
 */
export const chartTypeOffsets: Readonly<Record<ChartType, number>> = {
  table: -0.6,
  bar: -0.5,
  'grouped-bar': -0.1,
  'stacked-bar': 0.1,
  line: -0.3,
  area: 0.1,
  pie: -0.2,
  scatter: 0.3,
  bubble: 0.5,
  histogram: 0.3,
  'box-plot': 0.8,
  heatmap: 0.3,
  'choropleth-map': 0.2,
  'symbol-map': 0.3,
  network: 0.7,
  treemap: 0.5,
};

/** INVENTED offsets of the task levels, logits. */
export const levelOffsets = { read: -0.9, interpret: 0.2, envision: 1.0 } as const;

/**
 * The demo's generating difficulty of an item: an INVENTED linear formula in the item's features,
 * used only to simulate a plausible audience (never to score anyone):
 *
 *   b = level offset + chart-type offset + 0.2·ln(marks) + 0.2·(series − 1) + 0.3·legend
 *       + 0.5·log axis + 0.3·truncated axis + 0.4·multi-step − 0.6
 *
 * @param features the item's derived features
 * @returns b in logits
 * @example
 * generatingDifficulty({ chartType: 'bar', level: 'read', markCount: 1, seriesCount: 1, legend: false,
 *   logAxis: false, truncatedAxis: false, multiStep: false }); // -2 (−0.9 − 0.5 − 0.6)
 */
export function generatingDifficulty(features: DifficultyFeatures): number {
  return (
    levelOffsets[features.level] +
    chartTypeOffsets[features.chartType] +
    0.2 * Math.log(Math.max(features.markCount, 1)) +
    0.2 * (Math.max(features.seriesCount, 1) - 1) +
    (features.legend ? 0.3 : 0) +
    (features.logAxis ? 0.5 : 0) +
    (features.truncatedAxis ? 0.3 : 0) +
    (features.multiStep ? 0.4 : 0) -
    0.6
  );
}
