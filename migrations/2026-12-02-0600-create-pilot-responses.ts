import type { Kysely } from 'kysely';

/**
 * Answers to pilot items, kept apart from `responses` so that no estimate, calibration of the
 * study or export of bank answers can see them. One answer per pilot and attempt. Erasing an
 * attempt erases its pilot answers (ON DELETE CASCADE); removing a pilot removes its answers.
 * Frozen once merged: later changes are new migrations.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('pilot_responses')
    .addColumn('id', 'text', (c) => c.primaryKey().notNull())
    .addColumn('attempt_id', 'text', (c) => c.notNull().references('attempts.id').onDelete('cascade'))
    .addColumn('pilot_id', 'text', (c) => c.notNull().references('pilot_items.id').onDelete('cascade'))
    .addColumn('position', 'integer', (c) => c.notNull())
    .addColumn('answer_kind', 'text', (c) => c.notNull())
    .addColumn('answer', 'text')
    .addColumn('score', 'integer', (c) => c.notNull())
    .addColumn('server_ms', 'integer')
    .addColumn('received_at', 'text', (c) => c.notNull())
    .addUniqueConstraint('pilot_responses_attempt_pilot_unique', ['attempt_id', 'pilot_id'])
    .execute();
  await db.schema.createIndex('pilot_responses_pilot_idx').on('pilot_responses').column('pilot_id').execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('pilot_responses').execute();
}
