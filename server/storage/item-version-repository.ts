import type { ItemsTable } from './database.js';
import type { DbHandle } from './db-handle.js';

/** One item of the loaded bank as the version table needs it. */
export interface ItemVersionInput {
  id: string;
  contentHash: string;
  status: ItemsTable['status'];
}

/** item id → its current version (the version of the content hash now in the bank). */
export type ItemVersions = ReadonlyMap<string, number>;

/**
 * Records the loaded bank in the `items` table: a content hash seen for the first time becomes the
 * next version of its id (1, 2, 3, ...); a known hash keeps its version and takes the current status.
 * Call inside a transaction so two starting servers cannot hand out the same version twice (the
 * unique constraints would reject the second).
 *
 * @returns each id's current version
 */
export async function syncItemVersions(
  db: DbHandle,
  items: readonly ItemVersionInput[],
  at: string,
): Promise<Map<string, number>> {
  if (items.length === 0) return new Map();
  const known = await db
    .selectFrom('items')
    .select(['id', 'version', 'content_hash', 'status'])
    .where(
      'id',
      'in',
      items.map((item) => item.id),
    )
    .execute();
  const byHash = new Map(known.map((row) => [`${row.id}\u0000${row.content_hash}`, row]));
  const highest = new Map<string, number>();
  for (const row of known) highest.set(row.id, Math.max(highest.get(row.id) ?? 0, Number(row.version)));
  const versions = new Map<string, number>();
  for (const item of items) {
    const existing = byHash.get(`${item.id}\u0000${item.contentHash}`);
    if (existing) {
      versions.set(item.id, Number(existing.version));
      if (existing.status !== item.status) {
        await db
          .updateTable('items')
          .set({ status: item.status })
          .where('id', '=', item.id)
          .where('version', '=', Number(existing.version))
          .execute();
      }
      continue;
    }
    const version = (highest.get(item.id) ?? 0) + 1;
    highest.set(item.id, version);
    await db
      .insertInto('items')
      .values({
        id: item.id,
        version,
        content_hash: item.contentHash,
        status: item.status,
        first_seen_at: at,
      })
      .execute();
    versions.set(item.id, version);
  }
  return versions;
}

/** All stored versions of one item, oldest first. */
export async function listItemVersions(
  db: DbHandle,
  id: string,
): Promise<{ version: number; contentHash: string; status: string; firstSeenAt: string }[]> {
  const rows = await db.selectFrom('items').selectAll().where('id', '=', id).orderBy('version').execute();
  return rows.map((row) => ({
    version: Number(row.version),
    contentHash: row.content_hash,
    status: row.status,
    firstSeenAt: row.first_seen_at,
  }));
}
