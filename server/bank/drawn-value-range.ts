import { numericAxis } from '../charts/axis.js';
import type { Axis, ChartSpec } from '../charts/chart-spec.js';
import type { KeyQuery } from './key-query-schema.js';

/**
 * The range of the axis a key's answer is read from, as the renderer draws it (the spec's domain,
 * else the data extent made nice by d3, with 0 for bars, areas, histograms and linear lines), or
 * undefined when the answer is not read off a numeric axis (ranks, counts of marks, shares, ...).
 *
 * @param chart - the parsed chart
 * @param query - the item's key query
 * @returns [low, high] of the drawn axis, or undefined
 */
export function drawnValueRange(chart: ChartSpec, query: KeyQuery): readonly [number, number] | undefined {
  const axis = axisFor(chart, query);
  if (axis === undefined || axis.values.length === 0) return undefined;
  const domain = numericAxis(axis.axis, axis.values, { includeZero: axis.includeZero }).scale.domain();
  return [Math.min(domain[0]!, domain[1]!), Math.max(domain[0]!, domain[1]!)];
}

interface AxisValues {
  readonly axis: Axis;
  readonly values: number[];
  readonly includeZero: boolean;
}

function numbers(chart: ChartSpec, field: string): number[] {
  return chart.data.map((row) => row[field]).filter((v): v is number => typeof v === 'number');
}

function totalsBy(chart: ChartSpec, by: string, field: string): number[] {
  const totals = new Map<string, number>();
  for (const row of chart.data) {
    const value = row[field];
    if (typeof value === 'number') totals.set(String(row[by]), (totals.get(String(row[by])) ?? 0) + value);
  }
  return [...totals.values()];
}

function axisFor(chart: ChartSpec, query: KeyQuery): AxisValues | undefined {
  if (query.op === 'box-statistic') {
    if (chart.type !== 'box-plot' || query.statistic === 'interquartile-range') return undefined;
    return { axis: chart.valueAxis, values: numbers(chart, chart.value), includeZero: false };
  }
  if (query.op === 'bin-count') {
    if (chart.type !== 'histogram') return undefined;
    return { axis: chart.countAxis, values: [0, ...binCounts(chart)], includeZero: true };
  }
  if (query.op !== 'value-at') return undefined;
  const field = query.field;
  switch (chart.type) {
    case 'bar':
    case 'grouped-bar':
      return field === chart.value
        ? { axis: chart.valueAxis, values: numbers(chart, field), includeZero: true }
        : undefined;
    case 'stacked-bar':
      if (field !== chart.value || chart.normalised) return undefined;
      return { axis: chart.valueAxis, values: totalsBy(chart, chart.category, field), includeZero: true };
    case 'box-plot':
      return field === chart.value
        ? { axis: chart.valueAxis, values: numbers(chart, field), includeZero: false }
        : undefined;
    case 'line':
      if (field !== chart.y) return undefined;
      return {
        axis: chart.valueAxis,
        values: numbers(chart, field),
        includeZero: chart.valueAxis.scale === 'linear',
      };
    case 'area':
      if (field !== chart.y) return undefined;
      return { axis: chart.valueAxis, values: [0, ...totalsBy(chart, chart.x, field)], includeZero: true };
    case 'scatter':
    case 'bubble':
      if (field === chart.x) return { axis: chart.xAxis, values: numbers(chart, field), includeZero: false };
      if (field === chart.y) return { axis: chart.yAxis, values: numbers(chart, field), includeZero: false };
      return undefined;
    default:
      return undefined;
  }
}

function binCounts(chart: Extract<ChartSpec, { type: 'histogram' }>): number[] {
  const counts = new Map<number, number>();
  for (const value of numbers(chart, chart.value)) {
    const bin = Math.floor((value - chart.binStart) / chart.binWidth);
    counts.set(bin, (counts.get(bin) ?? 0) + 1);
  }
  return [...counts.values()];
}
