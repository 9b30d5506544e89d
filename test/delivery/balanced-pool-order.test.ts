import { describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import { balancedPoolOrder } from '../../server/delivery/balanced-pool-order.js';

const item = (id: string, type: string, level: 'read' | 'interpret' | 'envision', scenario: string) => ({
  id,
  level,
  scenario,
  chart: { type } as never,
});

describe('balancedPoolOrder', () => {
  it('takes chart types, then levels, then scenarios least used so far, ties by id', () => {
    // Worked by hand: a-bar-read first (all unused; ties by id); then b-line-interpret (line and interpret
    // unused); then e-pie-envision (nothing of it used); then c-bar-interpret and d-line-read tie on
    // (1, 1, 1) → c by id; d last.
    const items = [
      item('d-line-read', 'line', 'read', 'town'),
      item('a-bar-read', 'bar', 'read', 'town'),
      item('c-bar-interpret', 'bar', 'interpret', 'isle'),
      item('b-line-interpret', 'line', 'interpret', 'isle'),
      item('e-pie-envision', 'pie', 'envision', 'garden'),
    ];
    expect(balancedPoolOrder(items)).toEqual([
      'a-bar-read',
      'b-line-interpret',
      'e-pie-envision',
      'c-bar-interpret',
      'd-line-read',
    ]);
  });

  it('is a permutation and does not depend on the input order', () => {
    const items = [
      item('x1', 'bar', 'read', 's1'),
      item('x2', 'bar', 'read', 's1'),
      item('x3', 'line', 'envision', 's2'),
      item('x4', 'pie', 'interpret', 's3'),
    ];
    const once = balancedPoolOrder(items);
    expect([...once].sort()).toEqual(['x1', 'x2', 'x3', 'x4']);
    expect(balancedPoolOrder([...items].reverse())).toEqual(once);
  });

  it('spreads a 20-item prefix of the real bank over at least 12 chart types, all levels and all scenarios', async () => {
    const bank = await loadBank('items');
    const active = bank.items.filter((i) => i.status === 'active');
    const first = new Set(balancedPoolOrder(active).slice(0, 20));
    const chosen = active.filter((i) => first.has(i.id));
    expect(new Set(chosen.map((i) => i.chart.type)).size).toBeGreaterThanOrEqual(12);
    expect(new Set(chosen.map((i) => i.level)).size).toBe(3);
    expect(new Set(chosen.map((i) => i.scenario)).size).toBe(new Set(active.map((i) => i.scenario)).size);
    // Id order, the old default, gives one scenario only in its first 20 items.
    const byId = [...active].sort((a, b) => (a.id < b.id ? -1 : 1)).slice(0, 20);
    expect(new Set(byId.map((i) => i.scenario)).size).toBe(1);
  });
});
