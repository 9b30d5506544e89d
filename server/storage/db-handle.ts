import type { Kysely, Transaction } from 'kysely';
import type { Database } from './database.js';

/** What every repository function takes first: the database, or a transaction on it. */
export type DbHandle = Kysely<Database> | Transaction<Database>;

/** The current time as the ISO-8601 UTC text every timestamp column stores. */
export function nowIso(): string {
  return new Date().toISOString();
}

/**
 * True when an error is a unique-constraint violation (SQLite SQLITE_CONSTRAINT_UNIQUE or
 * SQLITE_CONSTRAINT_PRIMARYKEY, PostgreSQL 23505): two writers raced for the same row.
 */
export function isUniqueViolation(error: unknown): boolean {
  const code = (error as { code?: unknown } | null)?.code;
  return code === '23505' || code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY';
}
