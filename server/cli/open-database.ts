import type { Kysely } from 'kysely';
import type { Config } from '../config.js';
import { createDatabase } from '../storage/create-database.js';
import type { Database } from '../storage/database.js';
import { checkDatabase } from '../storage/health.js';
import { MigrationError, migrateToLatest } from '../storage/migrate.js';
import { CliError } from './cli-error.js';

/**
 * Opens the configured database for a command, checks it answers, and (unless told not to)
 * brings its schema up to date. Failures become one-line CliErrors.
 */
export async function openDatabase(
  config: Config,
  options: { migrate?: boolean } = {},
): Promise<Kysely<Database>> {
  let db: Kysely<Database>;
  try {
    db = createDatabase(config.databaseUrl, { sqliteSync: config.sqliteSync });
  } catch (error) {
    throw new CliError(`DATABASE_URL: cannot open ${config.databaseUrl}: ${(error as Error).message}`);
  }
  const state = await checkDatabase(db);
  if (!state.reachable) {
    await db.destroy().catch(() => {});
    throw new CliError(`DATABASE_URL: cannot reach the database (${state.reason})`);
  }
  if (options.migrate !== false) {
    try {
      await migrateToLatest(db);
    } catch (error) {
      await db.destroy().catch(() => {});
      if (error instanceof MigrationError) throw new CliError(error.message, 1);
      throw error;
    }
  }
  return db;
}
