import type { Command } from 'commander';
import { deliveryBankFrom } from '../delivery/bank-adapter.js';
import { bankChartRenderer, respondentItemViews } from '../delivery/item-view.js';
import { createStudy, getStudies } from '../delivery/study-service.js';
import { CliError } from './cli-error.js';
import { commandConfig, listFlag, withDatabase, withDatabaseFlag } from './command-config.js';
import { openBank } from './open-bank.js';

interface StudyCreateFlags {
  database?: string;
  title: string;
  chartTypes?: string;
  levels?: string;
  scenarios?: string;
  items?: string;
  design?: string;
  maxItems?: string;
  timeLimit?: string;
  kiosk?: boolean;
  idleSeconds?: string;
  consentText?: string;
  endSummary?: boolean;
}

function wholeNumber(flag: string, value: string | undefined): number | undefined {
  if (value === undefined) return undefined;
  if (!/^\d+$/.test(value))
    throw new CliError(`${flag}: must be a whole number (got ${JSON.stringify(value)})`);
  return Number(value);
}

/** The study settings a `study create` command line describes (validated later by the service). */
export function settingsFromFlags(flags: StudyCreateFlags): Record<string, unknown> {
  const pool = Object.fromEntries(
    Object.entries({
      chartTypes: listFlag(flags.chartTypes),
      levels: listFlag(flags.levels),
      scenarios: listFlag(flags.scenarios),
      itemIds: listFlag(flags.items),
    }).filter(([, v]) => v !== undefined),
  );
  const settings: Record<string, unknown> = { title: flags.title, pool };
  if (flags.design !== undefined) settings.design = flags.design;
  const maxItems = wholeNumber('--max-items', flags.maxItems);
  if (maxItems !== undefined) settings.maxItems = maxItems;
  const timeLimit = wholeNumber('--time-limit', flags.timeLimit);
  if (timeLimit !== undefined) settings.timeLimitSeconds = timeLimit;
  const idle = wholeNumber('--idle-seconds', flags.idleSeconds);
  if (idle !== undefined) settings.idleSeconds = idle;
  if (flags.kiosk) settings.kiosk = true;
  if (flags.endSummary) settings.endSummary = true;
  if (flags.consentText !== undefined) settings.consentText = flags.consentText;
  return settings;
}

/**
 * `plotgauge study create --title … [pool filters] [--design fixed|rotated] [--max-items N] …` and
 * `plotgauge study list`. Background questions are set through the admin API (they are structured).
 */
export function registerStudyCommand(program: Command): void {
  const study = program.command('study').description('create and list studies');

  withDatabaseFlag(study.command('create').description('create a study; prints its id'))
    .requiredOption('--title <text>', 'what respondents see as the title')
    .option('--chart-types <list>', 'comma-separated chart types, e.g. bar,line (default: all)')
    .option('--levels <list>', 'comma-separated task levels: read,interpret,envision (default: all)')
    .option('--scenarios <list>', 'comma-separated scenario ids (default: all)')
    .option('--items <list>', 'comma-separated item ids: the pool itself, in this order')
    .option('--design <design>', 'fixed (one order) or rotated (linked booklets)', 'fixed')
    .option('--max-items <n>', 'items per attempt (per booklet when rotated)')
    .option('--time-limit <seconds>', 'time limit of an attempt, from consent')
    .option('--kiosk', 'kiosk mode: return to the welcome screen after the end or when idle')
    .option('--idle-seconds <n>', 'kiosk idle time before the reset (default 90)')
    .option('--consent-text <text>', 'the consent text respondents agree to')
    .option('--end-summary', 'show "you read N charts" at the end')
    .action(async (flags: StudyCreateFlags) => {
      const config = commandConfig(flags);
      const loaded = await openBank(config.itemsDir);
      const bank = deliveryBankFrom(loaded, respondentItemViews(bankChartRenderer(loaded)));
      const created = await withDatabase(config, (db) =>
        db.transaction().execute((trx) => createStudy(trx, bank, settingsFromFlags(flags), 'cli')),
      );
      console.log(
        `study ${created.id} created: "${created.title}", ${created.settings.design} form, ${created.poolSize} items in the pool`,
      );
      console.log(`next: plotgauge cohort add ${created.id} --label "…"`);
    });

  withDatabaseFlag(study.command('list').description('list studies: id, status, title')).action(
    async (flags: { database?: string }) => {
      const config = commandConfig(flags);
      const loaded = await openBank(config.itemsDir);
      const bank = deliveryBankFrom(loaded, respondentItemViews(bankChartRenderer(loaded)));
      const studies = await withDatabase(config, (db) => getStudies(db, bank));
      for (const s of studies) console.log(`${s.id}\t${s.status}\t${s.title}`);
      if (studies.length === 0) console.log('no studies yet: plotgauge study create --title "…"');
    },
  );
}
