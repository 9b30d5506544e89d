import type SqliteDatabase from 'better-sqlite3';
import type { SqliteDatabase as KyselySqliteDatabase, SqliteStatement } from 'kysely';

/** Prepared statements kept per connection; the server's queries are a few dozen distinct texts. */
export const statementCacheSize = 256;

/**
 * A better-sqlite3 database for kysely's SQLite driver that reuses prepared statements: the driver
 * prepares every query anew, and preparing was about 7% of the server's CPU time under answer load
 * (a profile of `scripts/bench/load.ts`). Statements are keyed by their SQL text (parameters are
 * bound at each run), least recently used dropped first. A statement still being iterated (a
 * streamed query) is not handed out twice: a fresh one is prepared instead. SQLite re-prepares a
 * cached statement itself after a schema change (sqlite3_prepare_v3, SQLite documentation).
 */
export function withStatementCache(
  database: SqliteDatabase.Database,
  size = statementCacheSize,
): KyselySqliteDatabase {
  const cache = new Map<string, SqliteDatabase.Statement>();
  return {
    close: () => database.close(),
    prepare(sql: string): SqliteStatement {
      const cached = cache.get(sql);
      if (cached !== undefined && !cached.busy) {
        // Most recently used goes last.
        cache.delete(sql);
        cache.set(sql, cached);
        return cached;
      }
      const statement = database.prepare(sql);
      if (cached === undefined) {
        if (cache.size >= size) cache.delete(cache.keys().next().value as string);
        cache.set(sql, statement);
      }
      return statement;
    },
  };
}
