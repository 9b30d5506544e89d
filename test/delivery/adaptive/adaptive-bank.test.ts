import { describe, expect, it } from 'vitest';
import { buildAdaptiveBank } from '../../../server/delivery/adaptive/adaptive-bank.js';
import { contentAreaOf } from '../../../server/delivery/adaptive/content-area.js';

const items = [
  { id: 'a', difficulty: -1, area: 'read' },
  { id: 'b', difficulty: 0, area: 'read' },
  { id: 'c', difficulty: 1, area: 'envision' },
];

describe('buildAdaptiveBank', () => {
  it('defaults the targets to each area share of the pool', () => {
    const { bank } = buildAdaptiveBank(items);
    expect(bank.areas).toEqual(['read', 'envision']);
    expect(Array.from(bank.targets)).toEqual([2 / 3, 1 / 3]);
    expect(Array.from(bank.members[0]!)).toEqual([0, 1]);
    expect(bank.indexOf.get('c')).toBe(2);
  });

  it('normalises given targets, gives unnamed areas 0 and reports named areas without items', () => {
    const { bank, emptyAreas } = buildAdaptiveBank(items, { envision: 3, interpret: 1 });
    expect(Array.from(bank.targets)).toEqual([0, 1]);
    expect(emptyAreas).toEqual(['interpret']);
  });

  it('refuses bad input with terse messages', () => {
    expect(() => buildAdaptiveBank([])).toThrow('at least one item');
    expect(() => buildAdaptiveBank([items[0]!, items[0]!])).toThrow('unique ids');
    expect(() => buildAdaptiveBank([{ id: 'x', difficulty: Number.NaN, area: 'read' }])).toThrow('finite');
    expect(() => buildAdaptiveBank(items, { read: -1 })).toThrow('>= 0');
    expect(() => buildAdaptiveBank(items, { interpret: 1 })).toThrow('positive target');
  });
});

describe('contentAreaOf', () => {
  it('names the cell by mode', () => {
    const item = { chartType: 'bar', level: 'read' };
    expect(contentAreaOf(item, 'none')).toBe('all');
    expect(contentAreaOf(item, 'level')).toBe('read');
    expect(contentAreaOf(item, 'chart-type')).toBe('bar');
    expect(contentAreaOf(item, 'chart-type-and-level')).toBe('bar/read');
  });
});
