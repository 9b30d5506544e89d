/**
 * Content areas for content balancing: the cells an adaptive attempt keeps in set proportions.
 * An area is a chart type, a task level, or a chart type × task level cell, named by a plain key
 * (`bar`, `read`, `bar/read`); with balancing off every item is in the one area `all`.
 *
 * @see Kingsbury, G. G., & Zara, A. R. (1989). Procedures for selecting items for computerized
 *   adaptive tests. Applied Measurement in Education 2(4), 359–375 (content areas with target
 *   proportions).
 */

/** What an attempt balances over. */
export const contentBalanceModes = ['none', 'level', 'chart-type', 'chart-type-and-level'] as const;
export type ContentBalanceMode = (typeof contentBalanceModes)[number];

/** The item fields an area key is made of. */
export interface AreaFeatures {
  readonly chartType: string;
  readonly level: string;
}

/** The key of the one area used when balancing is off. */
export const ALL_AREA = 'all';

/**
 * The content area of an item.
 *
 * @param item its chart type and task level.
 * @param mode what to balance over.
 * @returns the area key.
 * @example
 * contentAreaOf({ chartType: 'bar', level: 'read' }, 'chart-type-and-level'); // 'bar/read'
 */
export function contentAreaOf(item: AreaFeatures, mode: ContentBalanceMode): string {
  switch (mode) {
    case 'none':
      return ALL_AREA;
    case 'level':
      return item.level;
    case 'chart-type':
      return item.chartType;
    case 'chart-type-and-level':
      return `${item.chartType}/${item.level}`;
  }
}
