import type { Command } from 'commander';
import { calibrateStudy } from '../reports/calibrate-study.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabase } from './command-config.js';

export interface CalibrateStudyFlags {
  readonly study: string;
  readonly database?: string;
  readonly anchorTo?: string;
  readonly replicates?: string;
  readonly seed?: string;
}

function wholeNumber(name: string, value: string | undefined): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0)
    throw new CliError(`${name}: must be a whole number (got ${JSON.stringify(value)})`);
  return n;
}

/**
 * `plotgauge calibrate --study <id> [--anchor-to <calibration>] [--replicates n] [--seed n]`: calibrates
 * a study from its stored responses (MML, cohorts as groups), stores the calibration, and prints one
 * line per fact. The lead hooks this into `calibrate` (whose CSV mode lives in calibrate-command.ts):
 * when `--study` is given, call `runCalibrateStudy(flags, console.log)` instead of the CSV path.
 *
 * @returns the stored calibration's id
 */
export async function runCalibrateStudy(
  flags: CalibrateStudyFlags,
  print: (line: string) => void,
): Promise<string> {
  const replicates = wholeNumber('--replicates', flags.replicates);
  const seed = wholeNumber('--seed', flags.seed);
  const config = commandConfig(flags);
  return withDatabase(config, async (db) => {
    const calibration = await calibrateStudy(db, flags.study, {
      ...(flags.anchorTo === undefined ? {} : { anchorTo: flags.anchorTo }),
      ...(replicates === undefined ? {} : { replicates }),
      ...(seed === undefined ? {} : { seed }),
    });
    const { record, settings, items } = calibration;
    print(`calibration ${record.id} stored`);
    print(
      `  ${record.responseCount} scored responses, ${items.length} items calibrated, ${settings.uncalibrated.length} not yet`,
    );
    for (const group of settings.groups) {
      print(
        `  ${group.label}: ${group.persons} respondents, mean ${group.mean.toFixed(2)}, SD ${group.sd.toFixed(2)} logits`,
      );
    }
    for (const u of settings.uncalibrated) {
      print(
        `  not calibrated: ${u.itemId} (${u.reason === 'too-few-answers' ? `${u.answers} answers, ${u.moreNeeded} more needed` : u.reason})`,
      );
    }
    if (!record.converged) {
      print(
        `  WARNING: did not converge after ${record.iterations} iterations; reports will refuse this calibration`,
      );
    }
    return record.id;
  });
}

/** Registers `calibrate-study` as its own command (until the lead merges it into `calibrate --study`). */
export function registerCalibrateStudyCommand(program: Command): void {
  program
    .command('calibrate-study')
    .description('calibrate a study from its stored responses and store the calibration')
    .requiredOption('--study <id>', 'study id')
    .option('--database <url>', 'sqlite:<file> or postgres://… (DATABASE_URL)')
    .option('--anchor-to <calibration>', 'keep the difficulties of an earlier calibration (linking)')
    .option('--replicates <n>', 'bootstrap replicates for the report intervals (default 200)')
    .option('--seed <n>', 'seed of the bootstrap (default 1)')
    .action(async (flags: CalibrateStudyFlags) => {
      await runCalibrateStudy(flags, (line) => console.log(line));
    });
}
