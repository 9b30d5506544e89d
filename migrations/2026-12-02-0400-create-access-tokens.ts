import type { Kysely } from 'kysely';

/**
 * Access tokens of the team: a label, a role (admin or analyst), the SHA-256 of the token (the token
 * itself is shown once and never stored), when it was made, last used and revoked.
 * Frozen once merged: later changes are new migrations.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('access_tokens')
    .addColumn('id', 'text', (c) => c.primaryKey().notNull())
    .addColumn('label', 'text', (c) => c.notNull())
    .addColumn('role', 'text', (c) => c.notNull())
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('last_used_at', 'text')
    .addColumn('revoked_at', 'text')
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('access_tokens').execute();
}
