import { existsSync } from 'node:fs';
import path from 'node:path';
import Sqlite from 'better-sqlite3';
import type { Command } from 'commander';
import { integrityOf, sqliteFileOf } from './backup-command.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabaseFlag } from './command-config.js';

/**
 * Copies a backup over the configured SQLite database with SQLite's backup API (page by page, under
 * SQLite's own locks, so the WAL and any open reader stay consistent), after checking the backup's
 * integrity; checks the result again. An existing database is only replaced with `force`.
 */
export async function restoreSqlite(
  backup: string,
  target: string,
  force: boolean,
): Promise<{ pages: number }> {
  if (!existsSync(backup)) throw new CliError(`no backup file at ${backup}`);
  const before = integrityOf(backup);
  if (before !== 'ok') throw new CliError(`the backup fails its integrity check: ${before}`, 1);
  if (existsSync(target) && !force)
    throw new CliError(
      `${target} exists and a server may be using it; stop the server, then run restore again with --force`,
    );
  const source = new Sqlite(backup, { readonly: true, fileMustExist: true });
  let pages = 0;
  try {
    pages = (await source.backup(target)).totalPages;
  } finally {
    source.close();
  }
  const after = integrityOf(target);
  if (after !== 'ok') throw new CliError(`the restored database fails its integrity check: ${after}`, 1);
  return { pages };
}

/** `plotgauge restore <file> [--force]`: put a `plotgauge backup` copy back as the SQLite database. */
export function registerRestoreCommand(program: Command): void {
  withDatabaseFlag(program.command('restore').description('put a backup back as the SQLite database'))
    .argument('<file>', 'a file written by plotgauge backup')
    .option('--force', 'replace an existing database (stop the server first)')
    .action(async (file: string, flags: { database?: string; force?: boolean }) => {
      const target = sqliteFileOf(commandConfig(flags).databaseUrl);
      const { pages } = await restoreSqlite(path.resolve(file), target, flags.force === true);
      console.log(`restored ${target} from ${path.resolve(file)} (${pages} pages, integrity ok)`);
    });
}
