import type { ChartSpec, ChartType } from '../charts/chart-spec.js';
import type { AuthoredFeatures, DistractorKind, Item } from './item-schema.js';
import type { KeyQueryOp } from './key-query-schema.js';

/** Visual channels a chart uses to carry data (after Cleveland and McGill's elementary tasks). */
export type Channel =
  | 'position'
  | 'length'
  | 'angle'
  | 'area'
  | 'colour-hue'
  | 'colour-lightness'
  | 'line-width'
  | 'connection'
  | 'text';

export type AxisScale = 'linear' | 'log' | 'time' | 'categorical';

/** Complexity features of an item: derived from its chart and key, plus the authored extras. */
export interface ItemFeatures {
  readonly chartType: ChartType;
  /** Marks drawn: bars, points, slices, cells, regions, nodes, bins, boxes, table cells. */
  readonly markCount: number;
  /** Distinct series (or groups) told apart by colour; 1 when there is none. */
  readonly seriesCount: number;
  readonly channels: readonly Channel[];
  readonly labelling: 'legend' | 'direct' | 'none';
  readonly legend: boolean;
  /** Scales of the drawn axes, distinct, in axis order; empty for charts without axes. */
  readonly axisScales: readonly AxisScale[];
  readonly logAxis: boolean;
  /** A bar-like value axis that does not start at 0. */
  readonly truncatedAxis: boolean;
  readonly annotation: boolean;
  readonly gridlines: boolean;
  /** Categories drawn in order of their values (bar charts). */
  readonly sorted: boolean;
  /** Values printed on the marks (bar value labels, heatmap cell labels, percent slice labels, tables). */
  readonly valueLabels: boolean;
  /** The key query's operation, or null for explicit keys. */
  readonly keyOp: KeyQueryOp | null;
  readonly multiStep: boolean;
  readonly precision: boolean;
  readonly distractorKinds: readonly DistractorKind[];
}

/**
 * Computes an item's complexity features from its chart and key, and merges the authored extras
 * (`precision`, `distractorKinds`; `multiStep` defaults to true for difference and ratio keys).
 *
 * @param item - a parsed item
 * @returns the features, one value per feature
 */
export function deriveFeatures(item: Item): ItemFeatures {
  const chart = item.chart;
  const authored: AuthoredFeatures = item.features;
  const keyOp = item.key.by === 'query' ? item.key.query.op : null;
  const axisScales = axisScalesOf(chart);
  return {
    chartType: chart.type,
    markCount: markCount(chart),
    seriesCount: seriesCount(chart),
    channels: channelsOf(chart),
    labelling: chart.labelling,
    legend: chart.labelling === 'legend',
    axisScales,
    logAxis: axisScales.includes('log'),
    truncatedAxis: truncatedAxis(chart),
    annotation: chart.annotation !== undefined,
    gridlines: chart.gridlines,
    sorted: sorted(chart),
    valueLabels: valueLabels(chart),
    keyOp,
    multiStep: authored.multiStep ?? (keyOp === 'difference' || keyOp === 'ratio'),
    precision: authored.precision ?? false,
    distractorKinds: authored.distractorKinds ?? [],
  };
}

function distinct(chart: ChartSpec, field: string | undefined): number {
  if (field === undefined) return 1;
  return new Set(chart.data.map((row) => String(row[field]))).size;
}

function markCount(chart: ChartSpec): number {
  switch (chart.type) {
    case 'table':
      return chart.data.length * chart.columns.length;
    case 'histogram': {
      const values = chart.data
        .map((row) => row[chart.value])
        .filter((v): v is number => typeof v === 'number');
      if (values.length === 0) return 0;
      return Math.floor((Math.max(...values) - chart.binStart) / chart.binWidth) + 1;
    }
    case 'box-plot':
      return distinct(chart, chart.category);
    case 'network':
      return chart.nodes.length;
    default:
      return chart.data.length;
  }
}

function seriesCount(chart: ChartSpec): number {
  switch (chart.type) {
    case 'grouped-bar':
    case 'stacked-bar':
    case 'line':
    case 'area':
    case 'scatter':
    case 'bubble':
      return distinct(chart, chart.series);
    case 'treemap':
      return distinct(chart, chart.group);
    case 'network': {
      const groups = new Set(chart.nodes.map((n) => n.group ?? ''));
      return groups.size;
    }
    default:
      return 1;
  }
}

function channelsOf(chart: ChartSpec): Channel[] {
  const hueIf = (field: string | undefined): Channel[] =>
    field !== undefined && distinct(chart, field) > 1 ? ['colour-hue'] : [];
  switch (chart.type) {
    case 'table':
      return ['text'];
    case 'bar':
    case 'histogram':
    case 'box-plot':
      return ['position', 'length'];
    case 'grouped-bar':
    case 'stacked-bar':
      return ['position', 'length', ...hueIf(chart.series)];
    case 'line':
    case 'scatter':
      return ['position', ...hueIf(chart.series)];
    case 'area':
      return ['position', 'area', ...hueIf(chart.series)];
    case 'bubble':
      return ['position', 'area', ...hueIf(chart.series)];
    case 'pie':
      return ['angle', 'area', 'colour-hue'];
    case 'heatmap':
      return ['position', 'colour-lightness'];
    case 'choropleth-map':
      return ['colour-lightness'];
    case 'symbol-map':
      return ['area'];
    case 'network': {
      const grouped = new Set(chart.nodes.map((n) => n.group ?? '')).size > 1;
      return [
        'position',
        'connection',
        ...(chart.weight ? (['line-width'] as const) : []),
        ...(grouped ? (['colour-hue'] as const) : []),
      ];
    }
    case 'treemap':
      return ['area', ...hueIf(chart.group)];
  }
}

function fieldScale(chart: ChartSpec, name: string): AxisScale {
  const kind = chart.fields.find((f) => f.name === name)?.kind;
  if (kind === 'temporal') return 'time';
  if (kind === 'quantitative') return 'linear';
  return 'categorical';
}

function axisScalesOf(chart: ChartSpec): AxisScale[] {
  let scales: AxisScale[];
  switch (chart.type) {
    case 'bar':
    case 'grouped-bar':
    case 'stacked-bar':
    case 'box-plot':
      scales = ['categorical', chart.valueAxis.scale];
      break;
    case 'line':
    case 'area':
      scales = [fieldScale(chart, chart.x), chart.valueAxis.scale];
      break;
    case 'scatter':
    case 'bubble':
      scales = [chart.xAxis.scale, chart.yAxis.scale];
      break;
    case 'histogram':
      scales = ['linear', chart.countAxis.scale];
      break;
    case 'heatmap':
      scales = [fieldScale(chart, chart.x), fieldScale(chart, chart.y)];
      break;
    default:
      scales = [];
  }
  return [...new Set(scales)];
}

function truncatedAxis(chart: ChartSpec): boolean {
  switch (chart.type) {
    case 'bar':
    case 'grouped-bar':
    case 'stacked-bar':
    case 'area':
      return chart.valueAxis.scale === 'linear' && (chart.valueAxis.domain?.[0] ?? 0) > 0;
    case 'histogram':
      return (chart.countAxis.domain?.[0] ?? 0) > 0;
    default:
      return false;
  }
}

function sorted(chart: ChartSpec): boolean {
  if (chart.type !== 'bar') return false;
  if (chart.sort !== 'none') return true;
  const values = chart.data.map((row) => row[chart.value]);
  if (values.length < 3 || values.some((v) => typeof v !== 'number')) return false;
  const numbers = values as number[];
  const up = numbers.every((v, i) => i === 0 || v >= numbers[i - 1]!);
  const down = numbers.every((v, i) => i === 0 || v <= numbers[i - 1]!);
  return up || down;
}

function valueLabels(chart: ChartSpec): boolean {
  switch (chart.type) {
    case 'table':
      return true;
    case 'bar':
      return chart.valueLabels;
    case 'heatmap':
      return chart.cellLabels;
    case 'pie':
      return chart.sliceLabels === 'category-and-percent';
    default:
      return false;
  }
}
