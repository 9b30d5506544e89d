import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import SqliteDatabase from 'better-sqlite3';
import { SqliteDialect } from 'kysely';
import { withStatementCache } from './statement-cache.js';

/**
 * The embedded engine. Settings, and why:
 * - `journal_mode = WAL`: readers do not block the writer; a crash leaves a consistent database.
 * - `synchronous = FULL` (default) or `NORMAL`: with FULL every commit is fsynced to the WAL
 *   before it returns, so an acknowledged answer survives a killed process AND a power cut.
 *   NORMAL survives a killed process (the OS still holds the write) but may lose the last
 *   commits on power loss. Cost measured by `scripts/bench/sqlite-durability.ts` (DEVELOPERS.md).
 * - `foreign_keys = ON`: SQLite leaves them off by default; PostgreSQL always enforces them.
 * - `busy_timeout = 5000`: a second process (a CLI command beside the server) waits for the
 *   write lock instead of failing at once.
 * - Prepared statements are reused (`statement-cache.ts`).
 */
export function createSqliteDialect(file: string, sync: 'full' | 'normal'): SqliteDialect {
  if (file !== ':memory:') mkdirSync(dirname(file), { recursive: true });
  const database = new SqliteDatabase(file);
  database.pragma('journal_mode = WAL');
  database.pragma(`synchronous = ${sync === 'full' ? 'FULL' : 'NORMAL'}`);
  database.pragma('foreign_keys = ON');
  database.pragma('busy_timeout = 5000');
  return new SqliteDialect({ database: withStatementCache(database) });
}
