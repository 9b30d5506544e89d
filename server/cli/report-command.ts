import type { Command } from 'commander';
import { AppError } from '../errors.js';
import { buildReport } from '../reports/build-report.js';
import type { FairnessGrouping } from '../reports/fairness-section.js';
import { parseFairnessQuery } from '../reports/fairness-service.js';
import { reportToCsv } from '../reports/report-rows.js';
import { reportToText } from '../reports/report-text.js';
import { CliError } from './cli-error.js';
import { commandConfig, listFlag, withDatabase, withDatabaseFlag } from './command-config.js';
import { openBank } from './open-bank.js';

interface ReportFlags {
  database?: string;
  cohort?: string;
  compare?: string;
  fairness?: string;
  format: string;
}

const formats = ['text', 'json', 'csv'] as const;

/**
 * `plotgauge report <study> [--cohort id] [--compare from,to] [--fairness question:reference,focal]
 * [--format text|json|csv]`: the readability report (calibrating first when the study has none or it is
 * stale), as a text summary, the report JSON, or its CSV; `--fairness` adds the Fairness section.
 */
export function registerReportCommand(program: Command): void {
  withDatabaseFlag(program.command('report').description('print the readability report of a study'))
    .argument('<study>', 'study id (see plotgauge study list)')
    .option('--cohort <id>', 'only this cohort')
    .option('--compare <from,to>', 'compare two cohorts (differences are to − from)')
    .option(
      '--fairness <question:reference,focal>',
      'add the Fairness section (DIF screen): a background question and two of its answers, or cohorts:<reference>,<focal>',
    )
    .option('--format <format>', 'text, json or csv', 'text')
    .action(async (studyId: string, flags: ReportFlags) => {
      if (!formats.includes(flags.format as (typeof formats)[number]))
        throw new CliError(`--format: must be text, json or csv (got ${JSON.stringify(flags.format)})`);
      const compare = listFlag(flags.compare);
      if (compare !== undefined && compare.length !== 2)
        throw new CliError('--compare: give two cohort ids separated by a comma (from,to)');
      if (compare !== undefined && flags.cohort !== undefined)
        throw new CliError('--cohort and --compare: choose one');
      let fairness: FairnessGrouping | undefined;
      try {
        fairness = flags.fairness === undefined ? undefined : parseFairnessQuery(flags.fairness);
      } catch (error) {
        if (error instanceof AppError) throw new CliError(`--fairness: ${error.message}`);
        throw error;
      }
      const config = commandConfig(flags);
      const bank = await openBank(config.itemsDir);
      const info = (id: string) => {
        const item = bank.byId.get(id);
        return item ? { chartType: item.chart.type, level: item.level } : undefined;
      };
      const report = await withDatabase(config, (db) =>
        buildReport(db, info, studyId, {
          ...(flags.cohort === undefined ? {} : { cohortId: flags.cohort }),
          ...(compare === undefined ? {} : { compare: [compare[0]!, compare[1]!] as const }),
          ...(fairness === undefined ? {} : { fairness }),
        }),
      );
      const out =
        flags.format === 'json'
          ? `${JSON.stringify(report, null, 2)}\n`
          : flags.format === 'csv'
            ? reportToCsv(report)
            : reportToText(report);
      process.stdout.write(out);
    });
}
