import { existsSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import Sqlite from 'better-sqlite3';
import type { Command } from 'commander';
import { engineOf } from '../storage/create-database.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabaseFlag } from './command-config.js';

/** What `backup` says on PostgreSQL, where the database's own tools do the job. */
export const postgresBackupAdvice =
  'PostgreSQL: back up with the database\'s own tool: pg_dump --format=custom --file=<file> "$DATABASE_URL"; ' +
  'restore into an empty database with pg_restore --dbname="$DATABASE_URL" <file>';

/** The file of a `sqlite:<file>` URL, or a CliError for PostgreSQL and in-memory databases. */
export function sqliteFileOf(databaseUrl: string): string {
  if (engineOf(databaseUrl) !== 'sqlite') throw new CliError(postgresBackupAdvice, 2);
  const file = databaseUrl.slice('sqlite:'.length);
  if (file === '' || file === ':memory:')
    throw new CliError('DATABASE_URL: an in-memory database has no file to copy');
  return path.resolve(file);
}

/** The largest page count better-sqlite3 accepts for one backup step: every page at once. */
const allPages = 0x7fffffff;

/** `PRAGMA integrity_check` of a SQLite file: 'ok' or the first problems it reports. */
export function integrityOf(file: string): string {
  const db = new Sqlite(file, { readonly: true, fileMustExist: true });
  try {
    const rows = db.pragma('integrity_check') as { integrity_check: string }[];
    return rows.map((r) => r.integrity_check).join('; ');
  } finally {
    db.close();
  }
}

/**
 * Copies a live SQLite database with SQLite's online backup API (better-sqlite3 `backup`) in ONE
 * step: one read transaction copies every page, so the file is one consistent snapshot while the
 * server keeps answering (WAL: the writer is not blocked). Copying in small steps would restart
 * whenever another connection commits between two steps (SQLite documentation, sqlite3_backup_step),
 * which under steady load is never done: `test/durability/backup-under-load.test.ts` saw the copy
 * finish only after the load stopped. The copy is then integrity-checked.
 */
export async function backupSqlite(source: string, target: string): Promise<{ pages: number }> {
  if (!existsSync(source)) throw new CliError(`DATABASE_URL: no database file at ${source}`);
  if (existsSync(target)) throw new CliError(`${target} exists; choose a new file name`);
  mkdirSync(path.dirname(target), { recursive: true });
  const db = new Sqlite(source, { fileMustExist: true });
  let pages = 0;
  try {
    db.pragma('busy_timeout = 5000');
    // better-sqlite3 copies 0 pages in its first step, then as many as the progress callback asks.
    const result = await db.backup(target, { progress: () => allPages });
    pages = result.totalPages;
  } finally {
    db.close();
  }
  const integrity = integrityOf(target);
  if (integrity !== 'ok') throw new CliError(`the copy fails its integrity check: ${integrity}`, 1);
  return { pages };
}

/** `plotgauge backup <file>`: a consistent copy of the SQLite database, taken while the server runs. */
export function registerBackupCommand(program: Command): void {
  withDatabaseFlag(
    program
      .command('backup')
      .description('copy the SQLite database while the server runs (PostgreSQL: prints the pg_dump way)'),
  )
    .argument('<file>', 'where to write the copy (must not exist)')
    .action(async (file: string, flags: { database?: string }) => {
      const source = sqliteFileOf(commandConfig(flags).databaseUrl);
      const target = path.resolve(file);
      const { pages } = await backupSqlite(source, target);
      console.log(`backup written to ${target} (${pages} pages, integrity ok)`);
    });
}
