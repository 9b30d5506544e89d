import { type Kysely, sql } from 'kysely';
import type { Database } from './database.js';
import { pendingMigrations } from './migrate.js';

export type DatabaseState = { reachable: true; pending: string[] } | { reachable: false; reason: string };

/** Asks the database one trivial question and lists pending migrations. Never throws. */
export async function checkDatabase(db: Kysely<Database>): Promise<DatabaseState> {
  try {
    await sql`select 1`.execute(db);
    return { reachable: true, pending: await pendingMigrations(db) };
  } catch (error) {
    const code = (error as { code?: string }).code;
    return { reachable: false, reason: code ?? 'connection failed' };
  }
}
