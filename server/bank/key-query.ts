import { median as d3Median, quantile } from 'd3-array';
import type { ChartSpec, Row } from '../charts/chart-spec.js';
import type { Aggregate, KeyAnswer, KeyQuery, Where } from './key-query-schema.js';

/** A key query that cannot be answered from the chart's data (names the reason). */
export class KeyQueryError extends Error {
  override readonly name = 'KeyQueryError';
}

type Category = string | number;

/**
 * Evaluates a declarative key query over a chart's rows. Pure: same query and chart, same answer.
 *
 * Ties make a category answer ambiguous and throw; so do missing fields, non-numeric values where a
 * number is needed, a `value-at` filter that matches no row or several, and a division by zero.
 * Box-plot quartiles use R's type 7 definition, the one d3.quantile implements
 * (Hyndman and Fan 1996, "Sample quantiles in statistical packages", The American Statistician 50(4)).
 *
 * @param query - the parsed key query
 * @param chart - the parsed chart spec whose `data` the query reads
 * @returns a number (rounded when the query says `round`), a category, or a list of categories
 * @throws KeyQueryError when the data cannot answer the query unambiguously
 * @example
 * evaluateKeyQuery({ op: 'sum', field: 'n' }, barChartWith([{ n: 2 }, { n: 3 }])) // 5
 */
export function evaluateKeyQuery(query: KeyQuery, chart: ChartSpec): KeyAnswer {
  const rows = chart.data;
  switch (query.op) {
    case 'value-at': {
      const matches = filterRows(rows, query.where);
      if (matches.length !== 1) {
        throw new KeyQueryError(
          `value-at: ${matches.length} rows match ${describeWhere(query.where)}, need exactly 1`,
        );
      }
      const cell = matches[0]![query.field];
      if (cell === undefined || cell === null) {
        throw new KeyQueryError(`value-at: the matching row has no value for "${query.field}"`);
      }
      return typeof cell === 'number' ? roundTo(cell, query.round) : cell;
    }
    case 'largest':
    case 'smallest': {
      const totals = aggregateBy(filterRows(rows, query.where), query.by, query.field, query.aggregate);
      return extremeCategory(totals, query.op);
    }
    case 'difference': {
      const a = numericAnswer(evaluateKeyQuery(query.a, chart), 'difference: a');
      const b = numericAnswer(evaluateKeyQuery(query.b, chart), 'difference: b');
      return roundTo(query.absolute ? Math.abs(a - b) : a - b, query.round);
    }
    case 'ratio': {
      const a = numericAnswer(evaluateKeyQuery(query.a, chart), 'ratio: a');
      const b = numericAnswer(evaluateKeyQuery(query.b, chart), 'ratio: b');
      if (b === 0) throw new KeyQueryError('ratio: b is 0');
      return roundTo(a / b, query.round);
    }
    case 'sum': {
      const matches = filterRows(rows, query.where);
      if (matches.length === 0) throw new KeyQueryError(`sum: no rows match ${describeWhere(query.where)}`);
      return roundTo(total(matches, query.field, 'sum'), query.round);
    }
    case 'count': {
      const matches = filterRows(rows, query.where);
      if (query.field === undefined) return matches.length;
      const field = query.field;
      return matches.filter((row) =>
        passesThreshold(numberCell(row, field, 'count'), query.above, query.below),
      ).length;
    }
    case 'rank': {
      const totals = aggregateBy(filterRows(rows, query.where), query.by, query.field, query.aggregate);
      const target = findCategory(totals, query.equals, 'rank');
      const value = totals.get(target)!;
      const ahead = [...totals.values()].filter((v) =>
        query.order === 'descending' ? v > value : v < value,
      );
      const tied = [...totals.entries()].filter(([c, v]) => v === value && c !== target);
      if (tied.length > 0) {
        throw new KeyQueryError(`rank: "${target}" ties with "${tied[0]![0]}" on ${query.field}`);
      }
      return ahead.length + 1;
    }
    case 'categories-where': {
      const totals = aggregateBy(filterRows(rows, query.where), query.by, query.field, query.aggregate);
      return [...totals.entries()]
        .filter(([, v]) => passesThreshold(v, query.above, query.below))
        .map(([c]) => c);
    }
    case 'bin-count': {
      if (chart.type !== 'histogram')
        throw new KeyQueryError(`bin-count needs a histogram, not a ${chart.type} chart`);
      for (const edge of [query.from, query.to]) {
        const steps = (edge - chart.binStart) / chart.binWidth;
        if (Math.abs(steps - Math.round(steps)) > 1e-9) {
          throw new KeyQueryError(
            `bin-count: ${edge} is not a bin edge (bins start at ${chart.binStart}, width ${chart.binWidth})`,
          );
        }
      }
      return rows.filter((row) => {
        const value = numberCell(row, chart.value, 'bin-count');
        return value >= query.from && value < query.to;
      }).length;
    }
    case 'box-statistic': {
      if (chart.type !== 'box-plot')
        throw new KeyQueryError(`box-statistic needs a box plot, not a ${chart.type} chart`);
      const values = rows
        .filter((row) => sameCategory(row[chart.category], query.box))
        .map((row) => numberCell(row, chart.value, 'box-statistic'))
        .sort((x, y) => x - y);
      if (values.length === 0) throw new KeyQueryError(`box-statistic: no box "${query.box}"`);
      const q = (p: number): number => quantile(values, p)!;
      const statistic = {
        median: () => q(0.5),
        'lower-quartile': () => q(0.25),
        'upper-quartile': () => q(0.75),
        'interquartile-range': () => q(0.75) - q(0.25),
        lowest: () => values[0]!,
        highest: () => values[values.length - 1]!,
      }[query.statistic]();
      return roundTo(statistic, query.round);
    }
    case 'degree': {
      if (chart.type !== 'network')
        throw new KeyQueryError(`degree needs a network, not a ${chart.type} chart`);
      if (!chart.nodes.some((n) => n.id === query.node))
        throw new KeyQueryError(`degree: no node "${query.node}"`);
      return networkDegrees(chart, query.direction).get(query.node) ?? 0;
    }
    case 'most-connected': {
      if (chart.type !== 'network')
        throw new KeyQueryError(`most-connected needs a network, not a ${chart.type} chart`);
      return extremeCategory(networkDegrees(chart, query.direction), 'largest');
    }
    case 'share': {
      const by = query.by ?? ('category' in chart ? chart.category : undefined);
      const field = query.field ?? ('value' in chart ? chart.value : undefined);
      if (by === undefined || field === undefined) {
        throw new KeyQueryError(
          `share: a ${chart.type} chart has no default category or value; give by and field`,
        );
      }
      const matches = filterRows(rows, query.where);
      const whole = total(matches, field, 'sum');
      if (whole === 0) throw new KeyQueryError('share: the total is 0');
      const partRows = matches.filter((row) => sameCategory(row[by], query.equals));
      if (partRows.length === 0) throw new KeyQueryError(`share: no rows where ${by} is "${query.equals}"`);
      return roundTo((100 * total(partRows, field, 'sum')) / whole, query.round);
    }
  }
}

/**
 * Rounds half away from zero to `decimals` places (no rounding when undefined).
 * @example roundTo(2.345, 2) // 2.35
 */
export function roundTo(value: number, decimals: number | undefined): number {
  if (!Number.isFinite(value)) throw new KeyQueryError('the answer is not a finite number');
  if (decimals === undefined) return value;
  const factor = 10 ** decimals;
  // toPrecision(12) removes binary noise such as 2.345 * 100 = 234.49999999999997
  const scaled = Number((Math.abs(value) * factor).toPrecision(12));
  const rounded = (Math.sign(value) * Math.round(scaled)) / factor;
  return rounded === 0 ? 0 : rounded;
}

/** Category equality across the string/number divide ("2031" matches 2031). */
export function sameCategory(cell: unknown, value: Category): boolean {
  return cell !== null && cell !== undefined && String(cell) === String(value);
}

function filterRows(rows: readonly Row[], where: Where | undefined): Row[] {
  if (where === undefined) return [...rows];
  const entries = Object.entries(where);
  return rows.filter((row) => entries.every(([field, value]) => sameCategory(row[field], value)));
}

function describeWhere(where: Where | undefined): string {
  if (where === undefined) return 'all rows';
  return Object.entries(where)
    .map(([field, value]) => `${field} = ${JSON.stringify(value)}`)
    .join(' and ');
}

function numberCell(row: Row, field: string, op: string): number {
  const cell = row[field];
  if (typeof cell !== 'number') {
    throw new KeyQueryError(
      `${op}: field "${field}" is ${cell === undefined ? 'missing' : JSON.stringify(cell)}, need a number`,
    );
  }
  return cell;
}

function numericAnswer(answer: KeyAnswer, where: string): number {
  if (typeof answer !== 'number')
    throw new KeyQueryError(`${where} must answer a number, got ${JSON.stringify(answer)}`);
  return answer;
}

function passesThreshold(value: number, above: number | undefined, below: number | undefined): boolean {
  return (above === undefined || value > above) && (below === undefined || value < below);
}

function total(rows: readonly Row[], field: string, aggregate: Aggregate): number {
  if (aggregate === 'count') return rows.length;
  const values = rows.map((row) => numberCell(row, field, aggregate));
  if (aggregate === 'median') return d3Median(values)!;
  const sum = values.reduce((s, v) => s + v, 0);
  return aggregate === 'mean' ? sum / values.length : sum;
}

function aggregateBy(
  rows: readonly Row[],
  by: string,
  field: string,
  aggregate: Aggregate,
): Map<Category, number> {
  const groups = new Map<string, { category: Category; rows: Row[] }>();
  for (const row of rows) {
    const category = row[by];
    if (category === undefined || category === null)
      throw new KeyQueryError(`a row has no value for "${by}"`);
    const key = String(category);
    const group = groups.get(key) ?? { category, rows: [] };
    group.rows.push(row);
    groups.set(key, group);
  }
  if (groups.size === 0) throw new KeyQueryError('no rows match the filter');
  return new Map([...groups.values()].map((g) => [g.category, total(g.rows, field, aggregate)]));
}

function findCategory(totals: Map<Category, number>, wanted: Category, op: string): Category {
  for (const category of totals.keys()) if (sameCategory(category, wanted)) return category;
  throw new KeyQueryError(`${op}: no category "${wanted}"`);
}

function extremeCategory(totals: Map<Category, number>, op: 'largest' | 'smallest'): Category {
  let best: [Category, number] | undefined;
  let tie: Category | undefined;
  for (const [category, value] of totals) {
    if (best === undefined || (op === 'largest' ? value > best[1] : value < best[1])) {
      best = [category, value];
      tie = undefined;
    } else if (value === best[1]) {
      tie = category;
    }
  }
  if (best === undefined) throw new KeyQueryError(`${op}: no categories`);
  if (tie !== undefined) throw new KeyQueryError(`${op}: "${best[0]}" and "${tie}" tie at ${best[1]}`);
  return best[0];
}

function networkDegrees(
  chart: Extract<ChartSpec, { type: 'network' }>,
  direction: 'all' | 'in' | 'out',
): Map<string, number> {
  const degrees = new Map<string, number>(chart.nodes.map((n) => [n.id, 0]));
  for (const row of chart.data) {
    const ends: unknown[] = [];
    if (direction !== 'in') ends.push(row[chart.source]);
    if (direction !== 'out') ends.push(row[chart.target]);
    for (const end of ends) {
      const id = String(end);
      if (!degrees.has(id)) throw new KeyQueryError(`a link names unknown node "${id}"`);
      degrees.set(id, degrees.get(id)! + 1);
    }
  }
  return degrees;
}
