import type { ChartSpec } from '../charts/chart-spec.js';

/** Options the bank passes when it asks for a chart drawing. */
export interface ChartDrawOptions {
  /** The item's alt text, for the SVG's <desc>. */
  readonly alt: string;
  /** Prefix for element ids, unique per chart on a page. */
  readonly idPrefix: string;
}

/**
 * Draws one chart as an SVG string. The bank does not draw charts itself: callers pass a renderer
 * (the chart layer's, with the bank's stored maps bound; or a small fake in tests).
 */
export type ChartRenderer = (spec: ChartSpec, options: ChartDrawOptions) => string;
