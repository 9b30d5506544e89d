import { PostgresDialect } from 'kysely';
import pg from 'pg';

/**
 * The multi-instance engine: a `pg` connection pool. Several plotgauge servers may share one
 * database; every write is one transaction, committed before the client is answered.
 * Numeric columns (`double precision`, `bigint` counts) are parsed to JS numbers.
 */
export function createPostgresDialect(url: string): PostgresDialect {
  const pool = new pg.Pool({ connectionString: url, max: 10, connectionTimeoutMillis: 5000 });
  // An idle client that loses its connection must not crash the process.
  pool.on('error', () => {});
  return new PostgresDialect({ pool });
}

/** pg returns int8 (count(*)) as a string by default; counts here fit in a double. */
pg.types.setTypeParser(pg.types.builtins.INT8, (value) => Number.parseInt(value, 10));
