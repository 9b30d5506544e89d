import type { ItemStatusChangesTable } from './database.js';
import type { DbHandle } from './db-handle.js';

/** A status the team can give an item through the log (a file may also say `draft`). */
export type LoggedItemStatus = ItemStatusChangesTable['status'];

/** One retire or reinstate of an item, as stored in `item_status_changes`. */
export interface ItemStatusChange {
  id: string;
  itemId: string;
  /** The item's version when the change was made. */
  itemVersion: number;
  /** 1, 2, 3, ... per item; the highest is the item's status now. */
  changeNumber: number;
  status: LoggedItemStatus;
  reason: string;
  /** The token label of who made it. */
  actor: string;
  changedAt: string;
}

function toChange(row: {
  id: string;
  item_id: string;
  item_version: number;
  change_number: number;
  status: LoggedItemStatus;
  reason: string;
  actor: string;
  changed_at: string;
}): ItemStatusChange {
  return {
    id: row.id,
    itemId: row.item_id,
    itemVersion: Number(row.item_version),
    changeNumber: Number(row.change_number),
    status: row.status,
    reason: row.reason,
    actor: row.actor,
    changedAt: row.changed_at,
  };
}

/**
 * Appends one change to the log. The caller gives the next `changeNumber` of the item (one more
 * than the latest it read in the same transaction); if another writer took that number first, the
 * unique (item_id, change_number) pair rejects this insert (see `isUniqueViolation`). Never updates
 * or deletes a row.
 */
export async function insertItemStatusChange(db: DbHandle, change: ItemStatusChange): Promise<void> {
  await db
    .insertInto('item_status_changes')
    .values({
      id: change.id,
      item_id: change.itemId,
      item_version: change.itemVersion,
      change_number: change.changeNumber,
      status: change.status,
      reason: change.reason,
      actor: change.actor,
      changed_at: change.changedAt,
    })
    .execute();
}

/** Every change of one item, oldest first. */
export async function listItemStatusChanges(db: DbHandle, itemId: string): Promise<ItemStatusChange[]> {
  const rows = await db
    .selectFrom('item_status_changes')
    .selectAll()
    .where('item_id', '=', itemId)
    .orderBy('change_number')
    .execute();
  return rows.map(toChange);
}

/** The latest change of one item, or undefined when the team never changed it. */
export async function findLatestItemStatusChange(
  db: DbHandle,
  itemId: string,
): Promise<ItemStatusChange | undefined> {
  const row = await db
    .selectFrom('item_status_changes')
    .selectAll()
    .where('item_id', '=', itemId)
    .orderBy('change_number', 'desc')
    .executeTakeFirst();
  return row ? toChange(row) : undefined;
}

/** The latest change of every item the team ever changed, by item id. */
export async function latestItemStatusChanges(db: DbHandle): Promise<Map<string, ItemStatusChange>> {
  const rows = await db
    .selectFrom('item_status_changes as c')
    .selectAll('c')
    .where(({ eb, selectFrom }) =>
      eb(
        'c.change_number',
        '=',
        selectFrom('item_status_changes as d')
          .select(({ fn }) => fn.max<number>('d.change_number').as('latest'))
          .whereRef('d.item_id', '=', 'c.item_id'),
      ),
    )
    .orderBy('c.item_id')
    .execute();
  return new Map(rows.map((row) => [row.item_id, toChange(row)]));
}

/** Ids of the items whose latest change retired them (delivery leaves them out of new attempts). */
export async function listRetiredItemIds(db: DbHandle): Promise<Set<string>> {
  const latest = await latestItemStatusChanges(db);
  return new Set([...latest.values()].filter((c) => c.status === 'retired').map((c) => c.itemId));
}
