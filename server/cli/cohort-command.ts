import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Command } from 'commander';
import { joinQrSvg } from '../delivery/join-qr-svg.js';
import { publicBaseUrl } from '../delivery/public-url.js';
import { addCohort } from '../delivery/study-service.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabase, withDatabaseFlag } from './command-config.js';

interface CohortAddFlags {
  database?: string;
  label: string;
  baseUrl?: string;
  qr?: string;
}

/**
 * `plotgauge cohort add <study> --label … [--base-url …] [--qr file.svg]`: adds a cohort, prints
 * its join code and link, and writes the link's QR code as SVG (default `join-<CODE>.svg`).
 */
export function registerCohortCommand(program: Command): void {
  const cohort = program.command('cohort').description('add cohorts (groups with their own join code)');
  withDatabaseFlag(cohort.command('add').description('add a cohort; prints the join link, writes a QR code'))
    .argument('<study>', 'study id (see plotgauge study list)')
    .requiredOption('--label <text>', 'e.g. "Saturday walk-ups"')
    .option('--base-url <url>', 'base of the join link (PUBLIC_URL; default http://HOST:PORT)')
    .option('--qr <file>', 'where to write the QR code SVG (default join-<CODE>.svg)')
    .action(async (studyId: string, flags: CohortAddFlags) => {
      const config = commandConfig(flags);
      let base = publicBaseUrl(config);
      if (flags.baseUrl !== undefined) {
        if (!/^https?:\/\/[^\s]+$/.test(flags.baseUrl))
          throw new CliError(`--base-url: must be an http(s) URL (got ${JSON.stringify(flags.baseUrl)})`);
        base = flags.baseUrl;
      }
      const label = flags.label.trim();
      if (label.length === 0 || label.length > 100)
        throw new CliError('--label: must be 1 to 100 characters');
      const created = await withDatabase(config, (db) =>
        db.transaction().execute((trx) => addCohort(trx, studyId, label, 'cli', base)),
      );
      const file = path.resolve(flags.qr ?? `join-${created.joinCode}.svg`);
      await writeFile(file, await joinQrSvg(created.joinUrl), 'utf8');
      console.log(`cohort "${created.label}": join code ${created.joinCode}`);
      console.log(`join link: ${created.joinUrl}`);
      console.log(`QR code: ${file}`);
    });
}
