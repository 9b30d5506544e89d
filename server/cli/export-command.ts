import { writeFile } from 'node:fs/promises';
import type { Command } from 'commander';
import { type ExportFormat, exportFormats, exportStudyResponses } from '../delivery/export-service.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabase, withDatabaseFlag } from './command-config.js';

interface ExportFlags {
  database?: string;
  cohort?: string;
  format: string;
  out?: string;
}

/**
 * `plotgauge export <study> [--cohort …] --format long|wide [--out file]`: the study's responses as
 * CSV, to a file or to standard output.
 */
export function registerExportCommand(program: Command): void {
  withDatabaseFlag(program.command('export').description('write the responses of a study as CSV'))
    .argument('<study>', 'study id (see plotgauge study list)')
    .option('--cohort <id>', 'only this cohort')
    .option('--format <format>', 'long (one row per response) or wide (attempt × item, 1/0/blank)', 'long')
    .option('--out <file>', 'write to this file instead of standard output')
    .action(async (studyId: string, flags: ExportFlags) => {
      if (!exportFormats.includes(flags.format as ExportFormat))
        throw new CliError(`--format: must be long or wide (got ${JSON.stringify(flags.format)})`);
      const config = commandConfig(flags);
      const csv = await withDatabase(config, (db) =>
        exportStudyResponses(db, studyId, { format: flags.format as ExportFormat, cohortId: flags.cohort }),
      );
      if (flags.out === undefined) process.stdout.write(csv);
      else {
        await writeFile(flags.out, csv, 'utf8');
        console.log(`wrote ${flags.out}`);
      }
    });
}
