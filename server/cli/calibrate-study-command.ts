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
 * line per fact. `calibrate` (calibrate-command.ts) calls this when `--study` is given.
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
