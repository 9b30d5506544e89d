import type { ChartSpec } from '../charts/chart-spec.js';

/**
 * What an encoding needs of its field:
 * - `quantitative`: a numeric scale (length, position on a value axis, area, colour ramp);
 * - `categorical`: distinct categories (nominal, ordinal or temporal);
 * - `ordered`: an order the marks follow, as along a line's x axis (not nominal);
 * - `any`: printed as text.
 */
export type EncodingRole = 'quantitative' | 'categorical' | 'ordered' | 'any';

export interface EncodedField {
  /** Path of the encoding in the item, e.g. `chart.value`. */
  readonly path: string;
  readonly field: string;
  readonly role: EncodingRole;
}

/**
 * The fields a chart's encodings name, with the role each encoding needs.
 *
 * @example encodedFields(barSpec) // [{ path: 'chart.category', field: 'day', role: 'categorical' }, ...]
 */
export function encodedFields(chart: ChartSpec): EncodedField[] {
  const list: EncodedField[] = [];
  const add = (key: string, field: string | undefined, role: EncodingRole): void => {
    if (field !== undefined) list.push({ path: `chart.${key}`, field, role });
  };
  switch (chart.type) {
    case 'table':
      chart.columns.forEach((column, index) => {
        add(`columns.${index}`, column, 'any');
      });
      break;
    case 'bar':
    case 'pie':
      add('category', chart.category, 'categorical');
      add('value', chart.value, 'quantitative');
      break;
    case 'grouped-bar':
    case 'stacked-bar':
      add('category', chart.category, 'categorical');
      add('series', chart.series, 'categorical');
      add('value', chart.value, 'quantitative');
      break;
    case 'line':
    case 'area':
      add('x', chart.x, 'ordered');
      add('y', chart.y, 'quantitative');
      add('series', chart.series, 'categorical');
      break;
    case 'scatter':
      add('x', chart.x, 'quantitative');
      add('y', chart.y, 'quantitative');
      add('pointLabel', chart.pointLabel, 'any');
      add('series', chart.series, 'categorical');
      break;
    case 'bubble':
      add('x', chart.x, 'quantitative');
      add('y', chart.y, 'quantitative');
      add('size', chart.size, 'quantitative');
      add('pointLabel', chart.pointLabel, 'any');
      add('series', chart.series, 'categorical');
      break;
    case 'histogram':
      add('value', chart.value, 'quantitative');
      break;
    case 'box-plot':
      add('category', chart.category, 'categorical');
      add('value', chart.value, 'quantitative');
      break;
    case 'heatmap':
      add('x', chart.x, 'categorical');
      add('y', chart.y, 'categorical');
      add('value', chart.value, 'quantitative');
      break;
    case 'choropleth-map':
    case 'symbol-map':
      add('region', chart.region, 'categorical');
      add('value', chart.value, 'quantitative');
      break;
    case 'network':
      add('source', chart.source, 'categorical');
      add('target', chart.target, 'categorical');
      add('weight', chart.weight, 'quantitative');
      break;
    case 'treemap':
      add('category', chart.category, 'categorical');
      add('group', chart.group, 'categorical');
      add('value', chart.value, 'quantitative');
      break;
  }
  if (chart.annotation !== undefined) add('annotation.field', chart.annotation.field, 'any');
  return list;
}
