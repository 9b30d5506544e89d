import { Kysely } from 'kysely';
import type { Database } from './database.js';
import { createPostgresDialect } from './dialects/postgres.js';
import { createSqliteDialect } from './dialects/sqlite.js';

export type Engine = 'sqlite' | 'postgres';

/** Which engine a DATABASE_URL names. */
export function engineOf(databaseUrl: string): Engine {
  return databaseUrl.startsWith('sqlite:') ? 'sqlite' : 'postgres';
}

/** Opens the database a DATABASE_URL names: `sqlite:<file>` (or `sqlite::memory:`) or `postgres://`. */
export function createDatabase(
  databaseUrl: string,
  options: { sqliteSync?: 'full' | 'normal' } = {},
): Kysely<Database> {
  const dialect =
    engineOf(databaseUrl) === 'sqlite'
      ? createSqliteDialect(databaseUrl.slice('sqlite:'.length), options.sqliteSync ?? 'full')
      : createPostgresDialect(databaseUrl);
  return new Kysely<Database>({ dialect });
}
