import type { Kysely } from 'kysely';

/**
 * Pilot items: a designer's own chart added to a study to be tried on its live audience, never
 * counted toward a respondent's estimate. The image (sanitized SVG text or PNG bytes) is stored as
 * base64 text (portable across SQLite and PostgreSQL); options and key are JSON.
 * Frozen once merged: later changes are new migrations.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('pilot_items')
    .addColumn('id', 'text', (c) => c.primaryKey().notNull())
    .addColumn('study_id', 'text', (c) => c.notNull().references('studies.id').onDelete('cascade'))
    .addColumn('prompt', 'text', (c) => c.notNull())
    .addColumn('alt', 'text', (c) => c.notNull())
    .addColumn('options', 'text', (c) => c.notNull())
    .addColumn('key', 'text', (c) => c.notNull())
    .addColumn('media_type', 'text', (c) => c.notNull())
    .addColumn('image', 'text', (c) => c.notNull())
    .addColumn('min_responses', 'integer', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('pilot_items_study_idx').on('pilot_items').column('study_id').execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('pilot_items').execute();
}
