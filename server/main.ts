#!/usr/bin/env node
/**
 * The `plotgauge` command line. `serve` (the default) migrates the database and listens;
 * `migrate` only migrates. Configuration problems print one line and exit with code 2.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Command, CommanderError } from 'commander';
import { buildApp } from './app.js';
import { registerBackupCommand } from './cli/backup-command.js';
import { registerCalibrateCommand } from './cli/calibrate-command.js';
import { CliError } from './cli/cli-error.js';
import { registerCohortCommand } from './cli/cohort-command.js';
import { registerDemoCommand } from './cli/demo-command.js';
import { registerEraseCommand } from './cli/erase-command.js';
import { registerExportCommand } from './cli/export-command.js';
import { openBank, recordItemVersions } from './cli/open-bank.js';
import { openDatabase } from './cli/open-database.js';
import { registerPredictCommand } from './cli/predict-command.js';
import { registerReportCommand } from './cli/report-command.js';
import { registerRestoreCommand } from './cli/restore-command.js';
import { registerRetentionCommand } from './cli/retention-command.js';
import { registerSimulateCommand } from './cli/simulate-command.js';
import { registerStudyCommand } from './cli/study-command.js';
import { registerTokenCommand } from './cli/token-command.js';
import { type Config, ConfigError, loadConfig } from './config.js';
import { migrateDownToZero } from './storage/migrate.js';
import { applyRetention } from './storage/retention-repository.js';

interface ServerFlags {
  port?: string;
  host?: string;
  database?: string;
}

function configFrom(flags: ServerFlags): Config {
  return loadConfig(process.env, { port: flags.port, host: flags.host, databaseUrl: flags.database });
}

async function serve(flags: ServerFlags): Promise<void> {
  const config = configFrom(flags);
  const bank = await openBank(config.itemsDir);
  const db = await openDatabase(config);
  await recordItemVersions(db, bank);
  if (config.retentionDays !== undefined) {
    await db.transaction().execute((trx) => applyRetention(trx, config.retentionDays as number, 'system'));
  }
  const app = await buildApp({ config, db, bank, logger: { level: config.logLevel } });
  const close = async (signal: string) => {
    app.log.info({ signal }, 'closing');
    await app.close();
    await db.destroy();
    process.exit(0);
  };
  process.once('SIGTERM', () => void close('SIGTERM'));
  process.once('SIGINT', () => void close('SIGINT'));
  try {
    await app.listen({ port: config.port, host: config.host });
  } catch (error) {
    await app.close();
    await db.destroy();
    const code = (error as { code?: string }).code;
    if (code === 'EADDRINUSE') throw new CliError(`PORT: ${config.port} is already in use on ${config.host}`);
    if (code === 'EADDRNOTAVAIL')
      throw new CliError(`HOST: ${config.host} is not an address of this machine`);
    throw error;
  }
}

export function buildProgram(): Command {
  const program = new Command('plotgauge')
    .description('Measure which charts an audience can read.')
    .exitOverride()
    .configureOutput({ outputError: (text, write) => write(text) });

  const withServerFlags = (command: Command) =>
    command
      .option('--port <port>', 'port to listen on (PORT)')
      .option('--host <host>', 'address to listen on (HOST)')
      .option('--database <url>', 'sqlite:<file> or postgres://… (DATABASE_URL)');

  withServerFlags(
    program.command('serve', { isDefault: true }).description('migrate the database and start the server'),
  ).action(serve);

  withServerFlags(program.command('migrate').description('bring the database schema up to date and exit'))
    .option('--down-to-zero', 'undo every migration (empties the database)')
    .action(async (flags: ServerFlags & { downToZero?: boolean }) => {
      const config = configFrom(flags);
      const db = await openDatabase(config, { migrate: !flags.downToZero });
      if (flags.downToZero) await migrateDownToZero(db);
      await db.destroy();
      console.log(flags.downToZero ? 'all migrations undone' : 'database schema is current');
    });

  registerCalibrateCommand(program);
  registerStudyCommand(program);
  registerSimulateCommand(program);
  registerCohortCommand(program);
  registerExportCommand(program);
  registerReportCommand(program);
  registerPredictCommand(program);
  registerDemoCommand(program);
  registerTokenCommand(program);
  registerBackupCommand(program);
  registerRestoreCommand(program);
  registerEraseCommand(program);
  registerRetentionCommand(program);

  return program;
}

/** Runs the command line; returns the exit code instead of exiting, so tests can call it. */
export async function runCli(argv: readonly string[]): Promise<number> {
  try {
    await buildProgram().parseAsync(argv as string[], { from: 'user' });
    return 0;
  } catch (error) {
    if (error instanceof CommanderError) return error.exitCode === 0 ? 0 : 2;
    if (error instanceof ConfigError || error instanceof CliError) {
      console.error(`plotgauge: ${error.message}`);
      return error instanceof CliError ? error.exitCode : 2;
    }
    console.error(`plotgauge: unexpected error: ${(error as Error).message}`);
    return 1;
  }
}

const invokedDirectly =
  process.argv[1] !== undefined && fileURLToPath(import.meta.url) === path.resolve(process.argv[1]);
if (invokedDirectly) {
  const code = await runCli(process.argv.slice(2));
  if (code !== 0) process.exit(code);
}
