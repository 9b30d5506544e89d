import type { Kysely } from 'kysely';

/**
 * An append-only log of item status changes made by the team (retire, reinstate). A change is a new
 * row, never an update: the item's file and its `items` rows stay as they are. `change_number` counts
 * an item's changes 1, 2, 3, ...; the highest is the item's status now, and the unique pair
 * (item_id, change_number) makes two racing changes of one item fail instead of both landing.
 * Frozen once merged: later changes are new migrations.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('item_status_changes')
    .addColumn('id', 'text', (c) => c.primaryKey().notNull())
    .addColumn('item_id', 'text', (c) => c.notNull())
    .addColumn('item_version', 'integer', (c) => c.notNull())
    .addColumn('change_number', 'integer', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('reason', 'text', (c) => c.notNull())
    .addColumn('actor', 'text', (c) => c.notNull())
    .addColumn('changed_at', 'text', (c) => c.notNull())
    .addUniqueConstraint('item_status_changes_item_change_unique', ['item_id', 'change_number'])
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('item_status_changes').execute();
}
