import { describe, expect, it } from 'vitest';
import { evaluateKeyQuery, KeyQueryError, roundTo } from '../../server/bank/key-query.js';
import { type KeyQuery, keyQuerySchema } from '../../server/bank/key-query-schema.js';
import { type ChartSpec, chartSpecSchema } from '../../server/charts/chart-spec.js';

const q = (query: unknown): KeyQuery => keyQuerySchema.parse(query);
const chart = (spec: unknown): ChartSpec => chartSpecSchema.parse(spec);

// Invented data: visitors per room and season at a science centre (grouped bars).
const grouped = chart({
  type: 'grouped-bar',
  title: 'Visitors',
  fields: [
    { name: 'room', kind: 'nominal', label: 'Room' },
    { name: 'season', kind: 'nominal', label: 'Season' },
    { name: 'visitors', kind: 'quantitative', label: 'Visitors' },
  ],
  data: [
    { room: 'Dome', season: 'spring', visitors: 120 },
    { room: 'Dome', season: 'summer', visitors: 300 },
    { room: 'Lab', season: 'spring', visitors: 200 },
    { room: 'Lab', season: 'summer', visitors: 180 },
    { room: 'Cave', season: 'spring', visitors: 50 },
    { room: 'Cave', season: 'summer', visitors: 70 },
  ],
  category: 'room',
  series: 'season',
  value: 'visitors',
});

describe('evaluateKeyQuery on rows', () => {
  it('value-at reads one cell', () => {
    expect(
      evaluateKeyQuery(
        q({ op: 'value-at', field: 'visitors', where: { room: 'Lab', season: 'summer' } }),
        grouped,
      ),
    ).toBe(180);
  });
  it('value-at refuses a filter that matches several rows', () => {
    expect(() =>
      evaluateKeyQuery(q({ op: 'value-at', field: 'visitors', where: { room: 'Lab' } }), grouped),
    ).toThrow('value-at: 2 rows match room = "Lab", need exactly 1');
  });
  it('largest and smallest compare category totals, or values within a filter', () => {
    expect(evaluateKeyQuery(q({ op: 'largest', field: 'visitors', by: 'room' }), grouped)).toBe('Dome'); // 420 > 380 > 120
    expect(
      evaluateKeyQuery(
        q({ op: 'largest', field: 'visitors', by: 'room', where: { season: 'spring' } }),
        grouped,
      ),
    ).toBe('Lab');
    expect(
      evaluateKeyQuery(q({ op: 'smallest', field: 'visitors', by: 'room', aggregate: 'mean' }), grouped),
    ).toBe('Cave');
  });
  it('difference, ratio and sum compose and round half away from zero', () => {
    const dome = { op: 'sum', field: 'visitors', where: { room: 'Dome' } };
    const lab = { op: 'sum', field: 'visitors', where: { room: 'Lab' } };
    expect(evaluateKeyQuery(q({ op: 'difference', a: lab, b: dome }), grouped)).toBe(-40);
    expect(evaluateKeyQuery(q({ op: 'difference', a: lab, b: dome, absolute: true }), grouped)).toBe(40);
    expect(evaluateKeyQuery(q({ op: 'ratio', a: dome, b: lab, round: 2 }), grouped)).toBe(1.11); // 420 / 380 = 1.105...
    expect(evaluateKeyQuery(q({ op: 'sum', field: 'visitors' }), grouped)).toBe(920);
  });
  it('count counts rows strictly above or below a threshold', () => {
    expect(evaluateKeyQuery(q({ op: 'count', field: 'visitors', above: 150 }), grouped)).toBe(3);
    expect(evaluateKeyQuery(q({ op: 'count', field: 'visitors', below: 120 }), grouped)).toBe(2);
    expect(evaluateKeyQuery(q({ op: 'count', where: { season: 'summer' } }), grouped)).toBe(3);
  });
  it('rank gives the 1-based position when sorted', () => {
    expect(evaluateKeyQuery(q({ op: 'rank', field: 'visitors', by: 'room', equals: 'Lab' }), grouped)).toBe(
      2,
    );
    expect(
      evaluateKeyQuery(
        q({ op: 'rank', field: 'visitors', by: 'room', equals: 'Lab', order: 'ascending' }),
        grouped,
      ),
    ).toBe(2);
    expect(evaluateKeyQuery(q({ op: 'rank', field: 'visitors', by: 'room', equals: 'Cave' }), grouped)).toBe(
      3,
    );
  });
  it('categories-where lists the categories past a threshold', () => {
    expect(
      evaluateKeyQuery(q({ op: 'categories-where', field: 'visitors', by: 'room', above: 150 }), grouped),
    ).toEqual(['Dome', 'Lab']);
  });
  it('share gives percent of the total', () => {
    // Dome 420 of 920 = 45.652...%
    expect(evaluateKeyQuery(q({ op: 'share', equals: 'Dome', round: 1 }), grouped)).toBe(45.7);
  });
  it('throws a KeyQueryError on a tie', () => {
    const tied = chart({
      ...grouped,
      data: [
        { room: 'A', season: 'x', visitors: 5 },
        { room: 'B', season: 'x', visitors: 5 },
      ],
    });
    expect(() => evaluateKeyQuery(q({ op: 'largest', field: 'visitors', by: 'room' }), tied)).toThrow(
      KeyQueryError,
    );
  });
});

describe('chart-type-aware queries', () => {
  it('bin-count counts observations in [from, to) and needs bin edges', () => {
    const histogram = chart({
      type: 'histogram',
      title: 'Waits',
      fields: [{ name: 'wait', kind: 'quantitative', label: 'Wait', unit: 'min' }],
      data: [1, 4, 5, 5, 9, 10, 14].map((wait) => ({ wait })),
      value: 'wait',
      binStart: 0,
      binWidth: 5,
    });
    expect(evaluateKeyQuery(q({ op: 'bin-count', from: 5, to: 10 }), histogram)).toBe(3); // 5, 5, 9 (10 is in the next bin)
    expect(evaluateKeyQuery(q({ op: 'bin-count', from: 0, to: 15 }), histogram)).toBe(7);
    expect(() => evaluateKeyQuery(q({ op: 'bin-count', from: 2, to: 10 }), histogram)).toThrow(
      '2 is not a bin edge',
    );
  });

  it('box-statistic uses R type 7 quartiles (Hyndman and Fan 1996, definition 7)', () => {
    const box = chart({
      type: 'box-plot',
      title: 'Times',
      fields: [
        { name: 'group', kind: 'nominal', label: 'Group' },
        { name: 'time', kind: 'quantitative', label: 'Time' },
      ],
      data: [1, 2, 3, 4, 10].map((time) => ({ group: 'a', time })),
      category: 'group',
      value: 'time',
    });
    // type 7: h = (n - 1) p; for 1,2,3,4,10: Q1 at h = 1 -> 2, median 3, Q3 at h = 3 -> 4
    // R: quantile(c(1,2,3,4,10)) gives 1 2 3 4 10 (from memory; matches the formula)
    const stat = (statistic: string) =>
      evaluateKeyQuery(q({ op: 'box-statistic', box: 'a', statistic }), box);
    expect([
      stat('lowest'),
      stat('lower-quartile'),
      stat('median'),
      stat('upper-quartile'),
      stat('highest'),
    ]).toEqual([1, 2, 3, 4, 10]);
    const even = chart({ ...box, data: [1, 2, 3, 4].map((time) => ({ group: 'a', time })) });
    // n = 4, p = 0.25: h = 0.75 -> 1 + 0.75 * (2 - 1) = 1.75
    expect(evaluateKeyQuery(q({ op: 'box-statistic', box: 'a', statistic: 'lower-quartile' }), even)).toBe(
      1.75,
    );
    expect(
      evaluateKeyQuery(q({ op: 'box-statistic', box: 'a', statistic: 'interquartile-range' }), even),
    ).toBe(1.5);
  });

  it('degree and most-connected count links per node', () => {
    const network = chart({
      type: 'network',
      title: 'Ferries',
      fields: [
        { name: 'from', kind: 'nominal', label: 'From' },
        { name: 'to', kind: 'nominal', label: 'To' },
      ],
      nodes: [
        { id: 'port', label: 'Port', x: 0.5, y: 0.5 },
        { id: 'bay', label: 'Bay', x: 0.1, y: 0.1 },
        { id: 'cove', label: 'Cove', x: 0.9, y: 0.1 },
        { id: 'reef', label: 'Reef', x: 0.5, y: 0.9 },
      ],
      data: [
        { from: 'port', to: 'bay' },
        { from: 'port', to: 'cove' },
        { from: 'reef', to: 'port' },
        { from: 'bay', to: 'cove' },
      ],
      source: 'from',
      target: 'to',
      directed: true,
    });
    expect(evaluateKeyQuery(q({ op: 'degree', node: 'port' }), network)).toBe(3);
    expect(evaluateKeyQuery(q({ op: 'degree', node: 'port', direction: 'in' }), network)).toBe(1);
    expect(evaluateKeyQuery(q({ op: 'degree', node: 'reef' }), network)).toBe(1);
    expect(evaluateKeyQuery(q({ op: 'most-connected' }), network)).toBe('port');
  });

  it('share on a treemap can use the group field', () => {
    const treemap = chart({
      type: 'treemap',
      title: 'Budget',
      fields: [
        { name: 'item', kind: 'nominal', label: 'Item' },
        { name: 'area', kind: 'nominal', label: 'Area' },
        { name: 'cost', kind: 'quantitative', label: 'Cost' },
      ],
      data: [
        { item: 'Seeds', area: 'garden', cost: 30 },
        { item: 'Tools', area: 'garden', cost: 20 },
        { item: 'Hives', area: 'bees', cost: 50 },
      ],
      category: 'item',
      group: 'area',
      value: 'cost',
    });
    expect(evaluateKeyQuery(q({ op: 'share', equals: 'Seeds' }), treemap)).toBe(30);
    expect(evaluateKeyQuery(q({ op: 'share', by: 'area', equals: 'garden' }), treemap)).toBe(50);
  });
});

describe('roundTo', () => {
  it('rounds half away from zero despite binary noise', () => {
    expect(roundTo(2.345, 2)).toBe(2.35); // 2.345 * 100 is 234.49999999999997 in binary
    expect(roundTo(-2.5, 0)).toBe(-3);
    expect(roundTo(1.005, 2)).toBe(1.01);
  });
});
