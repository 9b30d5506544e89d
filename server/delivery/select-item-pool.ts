import { balancedPoolOrder } from './balanced-pool-order.js';
import type { DeliverableItem } from './delivery-bank.js';
import type { ItemPool } from './study-settings.js';

/**
 * The items a study may present: active items that pass every filter of the pool. With explicit
 * `itemIds` the pool keeps their order (ids not in the bank, or not active, are dropped and reported);
 * otherwise items are in balanced order (balanced-pool-order.ts: each prefix spread over chart types,
 * levels and scenarios, ties by id), so the same bank gives the same pool and a fixed form's first n
 * items cover the study's mix.
 *
 * @param retired ids the team retired since the bank was written (the latest row of
 *   `item_status_changes`; server/delivery/item-status-service.ts): left out like retired files.
 * @returns the pool's item ids and the explicit ids that could not be used
 * @example selectItemPool(items, { levels: ['read'] }) // { itemIds: [...read items, balanced], unavailable: [] }
 */
export function selectItemPool(
  items: readonly DeliverableItem[],
  pool: ItemPool,
  retired: ReadonlySet<string> = new Set(),
): { itemIds: string[]; unavailable: string[] } {
  const accepts = (item: DeliverableItem) =>
    item.status === 'active' &&
    !retired.has(item.id) &&
    (pool.chartTypes === undefined ||
      pool.chartTypes.length === 0 ||
      pool.chartTypes.includes(item.chart.type)) &&
    (pool.levels === undefined || pool.levels.length === 0 || pool.levels.includes(item.level)) &&
    (pool.scenarios === undefined || pool.scenarios.length === 0 || pool.scenarios.includes(item.scenario));
  if (pool.itemIds !== undefined) {
    const byId = new Map(items.map((item) => [item.id, item]));
    const itemIds: string[] = [];
    const unavailable: string[] = [];
    for (const id of new Set(pool.itemIds)) {
      const item = byId.get(id);
      if (item && accepts(item)) itemIds.push(id);
      else unavailable.push(id);
    }
    return { itemIds, unavailable };
  }
  return { itemIds: balancedPoolOrder(items.filter(accepts)), unavailable: [] };
}
