import type { Cell, ChartSpec, Field } from '../../charts/chart-spec.js';
import { encodedFields } from '../encoded-fields.js';
import { type BankProblem, eachItem, error, type LintContext, type LintRule } from './lint-types.js';

const temporalPattern = /^\d{4}(-\d{2}(-\d{2})?)?$/;

/**
 * Encodings name described fields; every row holds a well-typed value for each described field
 * (numbers for quantitative fields, ISO dates or years for temporal ones, listed categories for
 * ordinal ones with an order); maps, regions, network nodes and the annotation's row exist.
 */
export const encodingFields: LintRule = {
  name: 'encoding-fields',
  check: (context) => eachItem(context, (item, file) => checkChart(item.chart, file, context)),
};

function checkChart(chart: ChartSpec, file: string, context: LintContext): BankProblem[] {
  const problems: BankProblem[] = [];
  const fields = new Map<string, Field>();
  chart.fields.forEach((field, index) => {
    if (fields.has(field.name))
      problems.push(error(file, `chart.fields.${index}.name`, `field "${field.name}" is described twice`));
    fields.set(field.name, field);
  });
  for (const encoded of encodedFields(chart)) {
    if (!fields.has(encoded.field)) {
      problems.push(
        error(file, encoded.path, `names field "${encoded.field}", which is not in chart.fields`),
      );
    }
  }
  chart.data.forEach((row, index) => {
    for (const name of Object.keys(row)) {
      if (!fields.has(name))
        problems.push(error(file, `chart.data.${index}.${name}`, `field "${name}" is not in chart.fields`));
    }
    for (const field of fields.values()) {
      const message = cellProblem(row[field.name], field);
      if (message !== undefined) problems.push(error(file, `chart.data.${index}.${field.name}`, message));
    }
  });
  if (chart.annotation !== undefined) {
    const { field, equals } = chart.annotation;
    if (!chart.data.some((row) => row[field] === equals)) {
      problems.push(
        error(file, 'chart.annotation.equals', `no row where ${field} is ${JSON.stringify(equals)}`),
      );
    }
  }
  if (chart.type === 'choropleth-map' || chart.type === 'symbol-map') {
    const map = context.maps.get(chart.map);
    if (map === undefined) {
      problems.push(
        error(file, 'chart.map', `no stored map "${chart.map}" (items/maps/${chart.map}.geojson)`),
      );
    } else {
      const ids = new Set(map.features.map((f) => f.properties.id));
      chart.data.forEach((row, index) => {
        const region = row[chart.region];
        if (region !== undefined && !ids.has(String(region))) {
          problems.push(
            error(
              file,
              `chart.data.${index}.${chart.region}`,
              `region "${region}" is not in map "${chart.map}"`,
            ),
          );
        }
      });
    }
  }
  if (chart.type === 'network') {
    const ids = new Set<string>();
    chart.nodes.forEach((node, index) => {
      if (ids.has(node.id))
        problems.push(error(file, `chart.nodes.${index}.id`, `node "${node.id}" is listed twice`));
      ids.add(node.id);
    });
    chart.data.forEach((row, index) => {
      for (const end of [chart.source, chart.target]) {
        const id = row[end];
        if (id !== undefined && id !== null && !ids.has(String(id))) {
          problems.push(
            error(file, `chart.data.${index}.${end}`, `link names node "${id}", which is not in chart.nodes`),
          );
        }
      }
    });
  }
  return problems;
}

function cellProblem(cell: Cell | undefined, field: Field): string | undefined {
  if (cell === undefined) return `missing value for field "${field.name}"`;
  if (cell === null) return undefined;
  switch (field.kind) {
    case 'quantitative':
      return typeof cell === 'number'
        ? undefined
        : `${JSON.stringify(cell)} is not a number (field "${field.name}" is quantitative)`;
    case 'temporal':
      if (typeof cell === 'number' ? Number.isInteger(cell) : temporalPattern.test(cell)) return undefined;
      return `${JSON.stringify(cell)} is not a year or an ISO date (field "${field.name}" is temporal)`;
    case 'ordinal':
      if (field.order !== undefined && !field.order.includes(String(cell))) {
        return `${JSON.stringify(cell)} is not in the order of field "${field.name}"`;
      }
      return undefined;
    case 'nominal':
      return undefined;
  }
}
