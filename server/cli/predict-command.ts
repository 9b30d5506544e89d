import type { Command } from 'commander';
import { checkPlannedChart, designCheckItems } from '../reports/design-check-service.js';
import { designCheckToText } from '../reports/design-check-text.js';
import { type DesignFeatureKey, designFeatures, plannedChartSchema } from '../reports/design-features.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabase, withDatabaseFlag } from './command-config.js';
import { openBank } from './open-bank.js';

/** The command-line flag of each request field. */
const flagOf: Readonly<Record<string, string>> = {
  chartType: '--chart-type',
  level: '--level',
  cohortId: '--cohort',
  ...Object.fromEntries(
    designFeatures.map((f) => [
      `features.${f.key}`,
      `--${f.key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`,
    ]),
  ),
};

type PredictFlags = {
  study: string;
  chartType?: string;
  level?: string;
  cohort?: string;
  json?: boolean;
  database?: string;
} & Partial<Record<DesignFeatureKey, string>>;

function yesNo(flag: string, value: string): boolean {
  const v = value.trim().toLowerCase();
  if (v === 'yes' || v === 'true') return true;
  if (v === 'no' || v === 'false') return false;
  throw new CliError(`${flag}: must be yes or no (got ${JSON.stringify(value)})`);
}

function count(flag: string, value: string): number {
  const n = Number(value);
  if (!/^\s*\d+\s*$/.test(value) || !Number.isSafeInteger(n) || n < 1)
    throw new CliError(`${flag}: must be a whole number of at least 1 (got ${JSON.stringify(value)})`);
  return n;
}

/** The planned chart from the flags, validated by the same schema as the HTTP route. */
export function plannedChartFromFlags(flags: PredictFlags) {
  const features: Record<string, number | boolean> = {};
  for (const feature of designFeatures) {
    const value = flags[feature.key];
    if (value === undefined) continue;
    const flag = flagOf[`features.${feature.key}`]!;
    features[feature.key] = feature.kind === 'count' ? count(flag, value) : yesNo(flag, value);
  }
  const parsed = plannedChartSchema.safeParse({
    chartType: flags.chartType,
    level: flags.level,
    features,
    ...(flags.cohort === undefined ? {} : { cohortId: flags.cohort }),
  });
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const flag = flagOf[issue.path.join('.')] ?? issue.path.join('.');
    const given =
      issue.path[0] === 'chartType' ? flags.chartType : issue.path[0] === 'level' ? flags.level : undefined;
    throw new CliError(
      given === undefined && (issue.path[0] === 'chartType' || issue.path[0] === 'level')
        ? `${flag}: required`
        : `${flag}: ${issue.message}`,
    );
  }
  return parsed.data;
}

/**
 * `plotgauge predict --study <id> --chart-type scatter --level interpret --marks 40 --series 2 --legend yes
 * [--cohort <id>] [--json]`: the design check of a planned chart (server/reports/design-check.ts) against
 * the study's latest calibration. Only the features given enter the model. Prints the weights, the LR
 * test, the prediction with its interval and the cohorts' shares, labelled model-based.
 */
export function registerPredictCommand(program: Command): void {
  const command = withDatabaseFlag(
    program
      .command('predict')
      .description(
        "predict how hard a planned chart will be from its design features (model-based, from a study's answers)",
      ),
  )
    .requiredOption('--study <id>', 'study whose latest calibration the model is fitted to')
    .option('--chart-type <type>', 'chart type of the planned chart (bar, line, scatter, ...)')
    .option('--level <level>', 'task level: read, interpret or envision');
  for (const feature of designFeatures) {
    const flag = flagOf[`features.${feature.key}`]!;
    command.option(
      feature.kind === 'count' ? `${flag} <n>` : `${flag} <yes|no>`,
      `${feature.label} of the planned chart (enters the model when given)`,
    );
  }
  command
    .option('--cohort <id>', 'only this cohort (default: every calibrated cohort)')
    .option('--json', 'print the design check as JSON')
    .action(async (flags: PredictFlags) => {
      const planned = plannedChartFromFlags(flags);
      const config = commandConfig(flags);
      const bank = await openBank(config.itemsDir);
      const check = await withDatabase(config, (db) =>
        checkPlannedChart(db, designCheckItems(bank), flags.study, planned),
      );
      process.stdout.write(flags.json ? `${JSON.stringify(check, null, 2)}\n` : designCheckToText(check));
    });
}
