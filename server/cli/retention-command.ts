import type { Command } from 'commander';
import { applyRetention } from '../storage/retention-repository.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabase, withDatabaseFlag } from './command-config.js';

/**
 * `plotgauge retention apply [--days N]`: drops background answers older than RETENTION_DAYS (or
 * --days); `serve` does the same at start-up when RETENTION_DAYS is set.
 */
export function registerRetentionCommand(program: Command): void {
  const retention = program
    .command('retention')
    .description('drop background answers after a retention period');
  withDatabaseFlag(
    retention.command('apply').description('drop background answers older than the period now'),
  )
    .option('--days <n>', 'the period in days (default RETENTION_DAYS)')
    .action(async (flags: { database?: string; days?: string }) => {
      const config = commandConfig(flags);
      const days = flags.days === undefined ? config.retentionDays : Number(flags.days);
      if (days === undefined) throw new CliError('set RETENTION_DAYS or give --days <n>');
      if (!Number.isInteger(days) || days < 1)
        throw new CliError(`--days: must be a whole number, at least 1`);
      const count = await withDatabase(config, (db) =>
        db.transaction().execute((trx) => applyRetention(trx, days, 'cli')),
      );
      console.log(`background answers dropped from ${count} attempts started more than ${days} days ago`);
    });
}
