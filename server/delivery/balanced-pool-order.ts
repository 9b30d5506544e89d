import type { DeliverableItem } from './delivery-bank.js';

type Facets = Pick<DeliverableItem, 'id' | 'scenario' | 'level' | 'chart'>;

/**
 * Orders a pool so that every prefix of it is spread over chart types, task levels and scenarios:
 * a fixed form that takes the first n items, and the blocks a rotated design cuts from the front, then
 * cover the study's mix instead of whatever sorts first by id (one scenario's items, say).
 *
 * Greedy and deterministic: the next item is the remaining one whose chart type, then level, then
 * scenario has been used least so far (compared in that order), ties broken by id. O(n²) in the pool
 * size, which is a few hundred items at most. Balancing a form's content by picking next from the
 * least-represented category is common practice, no source.
 *
 * @param items the pool's items, in any order.
 * @returns their ids in balanced order; the same items always give the same order.
 * @example
 * balancedPoolOrder([bar1, bar2, line1]).slice(0, 2) // [bar1.id, line1.id]: two chart types first
 */
export function balancedPoolOrder(items: readonly Facets[]): string[] {
  const remaining = [...items].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const used = {
    chart: new Map<string, number>(),
    level: new Map<string, number>(),
    scenario: new Map<string, number>(),
  };
  const order: string[] = [];
  while (remaining.length > 0) {
    let best = 0;
    let bestKey = keyOf(remaining[0]!, used);
    for (let i = 1; i < remaining.length; i++) {
      const key = keyOf(remaining[i]!, used);
      if (
        key[0] < bestKey[0] ||
        (key[0] === bestKey[0] && (key[1] < bestKey[1] || (key[1] === bestKey[1] && key[2] < bestKey[2])))
      ) {
        best = i;
        bestKey = key;
      }
    }
    const [chosen] = remaining.splice(best, 1);
    order.push(chosen!.id);
    bump(used.chart, chosen!.chart.type);
    bump(used.level, chosen!.level);
    bump(used.scenario, chosen!.scenario);
  }
  return order;
}

function keyOf(
  item: Facets,
  used: { chart: Map<string, number>; level: Map<string, number>; scenario: Map<string, number> },
): [number, number, number] {
  return [
    used.chart.get(item.chart.type) ?? 0,
    used.level.get(item.level) ?? 0,
    used.scenario.get(item.scenario) ?? 0,
  ];
}

function bump(counts: Map<string, number>, key: string): void {
  counts.set(key, (counts.get(key) ?? 0) + 1);
}
