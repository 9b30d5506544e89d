import type { Command } from 'commander';
import type { Kysely } from 'kysely';
import { type Config, loadConfig } from '../config.js';
import { AppError } from '../errors.js';
import type { Database } from '../storage/database.js';
import { CliError } from './cli-error.js';
import { openDatabase } from './open-database.js';

/** The `--database` flag every command that opens the database takes. */
export function withDatabaseFlag(command: Command): Command {
  return command.option('--database <url>', 'sqlite:<file> or postgres://… (DATABASE_URL)');
}

/** Configuration from the environment, with `--database` overriding DATABASE_URL. */
export function commandConfig(flags: { database?: string }): Config {
  return loadConfig(process.env, { databaseUrl: flags.database });
}

/** Splits a comma-separated flag value (`--levels read,interpret`); undefined stays undefined. */
export function listFlag(value: string | undefined): string[] | undefined {
  if (value === undefined) return undefined;
  return value
    .split(',')
    .map((part) => part.trim())
    .filter((part) => part.length > 0);
}

/**
 * Runs a command body with an open database, closing it after; a refusal from a service (AppError)
 * becomes a one-line CliError (exit 2).
 */
export async function withDatabase<T>(
  config: Config,
  body: (db: Kysely<Database>) => Promise<T>,
): Promise<T> {
  const db = await openDatabase(config);
  try {
    return await body(db);
  } catch (error) {
    if (error instanceof AppError) throw new CliError(error.message);
    throw error;
  } finally {
    await db.destroy();
  }
}
