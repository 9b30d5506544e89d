/**
 * `plotgauge simulate adaptive`: a simulation study of adaptive delivery on the current bank (or an
 * invented one), comparing adaptive attempts with fixed forms of the same precision, and item
 * exposure. Prints a table; `--svg` also writes a picture.
 *
 * Difficulties: `--difficulties items.csv` (the `calibrate --out` items.csv, or any CSV with
 * columns item,difficulty) gives calibrated values; otherwise the bank's items get the demo's
 * INVENTED generating difficulties derived from their features (server/demo/generating-difficulty.ts).
 * `--bank-size N` replaces the bank by N INVENTED items, difficulties evenly spaced on [−3, 3],
 * task levels and chart types in turn. `--study <id>` runs on what a stored study would deliver:
 * the items its latest converged calibration places (the same adaptive bank a join builds, via
 * `loadAdaptiveDelivery`), its content balance, area targets, SE target, item limits and
 * randomesque k; flags given explicitly override those settings.
 *
 * Exposure: the study runs with randomesque selection alone; when its largest exposure exceeds
 * `--max-exposure`, Sympson–Hetter parameters are tuned on separate simulated persons and the study
 * is run again with them (both tables are printed). With `--study` and `--save-exposure-control` the
 * outcome is stored for the study's new adaptive attempts (server/delivery/exposure-control-service.ts).
 */
import { readFile, writeFile } from 'node:fs/promises';
import type { Command } from 'commander';
import type { ItemBank } from '../bank/load-bank.js';
import { chartTypes } from '../charts/chart-spec.js';
import {
  type AdaptiveBank,
  type AdaptiveItem,
  buildAdaptiveBank,
} from '../delivery/adaptive/adaptive-bank.js';
import type { AdaptiveSettings } from '../delivery/adaptive/adaptive-settings.js';
import {
  type ContentBalanceMode,
  contentAreaOf,
  contentBalanceModes,
} from '../delivery/adaptive/content-area.js';
import {
  type DesignAccuracy,
  type FixedDesign,
  fixedDesigns,
  type SimulationResult,
  simulateAdaptive,
} from '../delivery/adaptive/simulate-adaptive.js';
import { renderSimulationChart } from '../delivery/adaptive/simulation-chart.js';
import { type ExposureTuning, tuneExposureControl } from '../delivery/adaptive/tune-exposure-control.js';
import { adaptiveSettingsOf, loadAdaptiveDelivery } from '../delivery/adaptive-delivery.js';
import { parseStudySettings } from '../delivery/attempt-service.js';
import { deliveryBankFrom } from '../delivery/bank-adapter.js';
import { saveExposureControl, tunedExposureControlOf } from '../delivery/exposure-control-service.js';
import {
  type ExposureControlSettings,
  exposureControlSettingsOf,
} from '../delivery/stored-exposure-control.js';
import type { StudySettings } from '../delivery/study-settings.js';
import { generatingDifficulty } from '../demo/generating-difficulty.js';
import { seededRandom } from '../scoring/seeded-random.js';
import { findStudyById } from '../storage/study-repository.js';
import { parseCsvText } from './calibrate-command.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabase, withDatabaseFlag } from './command-config.js';
import { openBank } from './open-bank.js';

export interface SimulateAdaptiveOptions {
  /** INVENTED bank of this many items instead of the item bank. */
  readonly bankSize?: number;
  /** CSV item,difficulty of calibrated difficulties for the bank's items. */
  readonly difficulties?: string;
  /** A stored study: its latest converged calibration and adaptive settings. */
  readonly study?: string;
  /** Database URL for `study` (default DATABASE_URL). */
  readonly database?: string;
  /** Persons per audience (default 500). */
  readonly persons?: number;
  readonly seTarget?: number;
  readonly minItems?: number;
  readonly maxItems?: number;
  readonly randomesque?: number;
  readonly balance?: ContentBalanceMode;
  /** Largest exposure allowed (default 0.3); exposure control is tuned when it is exceeded. */
  readonly maxExposure?: number;
  /** Skip Sympson–Hetter tuning. */
  readonly noExposureControl?: boolean;
  readonly seed?: number;
  readonly svg?: string;
  /** With `study`: store the tuned exposure control for the study's live attempts. */
  readonly saveExposureControl?: boolean;
}

export interface SimulateOutput {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  /** Loads the item bank (default: ITEMS_DIR from the environment). */
  readonly loadBank?: () => Promise<ItemBank>;
}

/** The audiences of the study: ability means −1, 0, +1, SD 1 (INVENTED). */
export const simulatedAudienceMeans = [-1, 0, 1] as const;

function positiveInteger(value: number | undefined, name: string, fallback: number, max: number): number {
  const v = value ?? fallback;
  if (!Number.isInteger(v) || v < 1 || v > max)
    throw new CliError(`--${name} must be an integer in 1..${max}`);
  return v;
}

/**
 * An INVENTED bank: difficulties evenly spaced on [−3, 3], dealt to the item ids in a seeded random
 * order (so the pool's id order, which the fixed design follows, is unrelated to difficulty, as in
 * a real bank); task levels and chart types in turn.
 */
export function inventedBankItems(size: number, mode: ContentBalanceMode): AdaptiveItem[] {
  const levels = ['read', 'interpret', 'envision'];
  const slot = Array.from({ length: size }, (_, i) => i);
  const random = seededRandom(size);
  for (let i = size - 1; i > 0; i--) {
    const j = random.integer(i + 1);
    [slot[i], slot[j]] = [slot[j]!, slot[i]!];
  }
  return slot.map((position, i) => ({
    id: `invented-${String(i + 1).padStart(5, '0')}`,
    difficulty: size === 1 ? 0 : -3 + (6 * position) / (size - 1),
    area: contentAreaOf({ level: levels[i % 3]!, chartType: chartTypes[i % chartTypes.length]! }, mode),
  }));
}

async function readDifficulties(file: string): Promise<Map<string, number>> {
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    throw new CliError(`${file}: cannot be read`);
  }
  const records = parseCsvText(text, file);
  const header = records[0];
  const names = header?.cells.map((c) => c.toLowerCase()) ?? [];
  const item = names.indexOf('item');
  const difficulty = names.indexOf('difficulty');
  if (header === undefined || item < 0 || difficulty < 0) {
    throw new CliError(`${file}: expected a header with columns item,difficulty`);
  }
  const values = new Map<string, number>();
  for (const { cells, line } of records.slice(1)) {
    const id = cells[item] ?? '';
    const raw = cells[difficulty] ?? '';
    if (raw === '') continue; // an item the calibration could not place
    const value = Number(raw);
    if (id === '' || !Number.isFinite(value))
      throw new CliError(`${file} line ${line}: needs an item id and a numeric difficulty`);
    values.set(id, value);
  }
  return values;
}

/** Builds the bank the study runs on, and says in one line what it is. */
async function studyBank(
  options: SimulateAdaptiveOptions,
  mode: ContentBalanceMode,
  output: SimulateOutput,
): Promise<{ items: AdaptiveItem[]; description: string }> {
  if (options.bankSize !== undefined) {
    const size = positiveInteger(options.bankSize, 'bank-size', 0, 100000);
    return {
      items: inventedBankItems(size, mode),
      description: `${size} INVENTED items, difficulties evenly spaced on [-3, 3]`,
    };
  }
  const bank = await (output.loadBank ?? (() => openBank(commandConfig({}).itemsDir)))();
  const active = [...bank.items]
    .filter((item) => item.status === 'active')
    .sort((a, b) => (a.id < b.id ? -1 : 1));
  const calibrated = options.difficulties === undefined ? null : await readDifficulties(options.difficulties);
  const items: AdaptiveItem[] = [];
  for (const item of active) {
    const difficulty =
      calibrated === null
        ? generatingDifficulty({ ...item.features, level: item.level })
        : calibrated.get(item.id);
    if (difficulty === undefined) continue;
    items.push({
      id: item.id,
      difficulty,
      area: contentAreaOf({ chartType: item.chart.type, level: item.level }, mode),
    });
  }
  if (calibrated !== null && items.length < active.length) {
    output.stderr(
      `simulate: ${active.length - items.length} active items have no difficulty in ${options.difficulties} and are left out\n`,
    );
  }
  if (items.length === 0) throw new CliError('simulate: no active item has a difficulty');
  const description =
    calibrated === null
      ? `${items.length} active bank items with INVENTED generating difficulties from their features`
      : `${items.length} active bank items with difficulties from ${options.difficulties}`;
  return { items, description };
}

/** What the study runs on: the adaptive bank, the stop rules, and one line saying what they are. */
interface SimulationSetup {
  readonly bank: AdaptiveBank;
  readonly settings: AdaptiveSettings;
  readonly balance: ContentBalanceMode;
  readonly description: string;
  /** A stored study's calibration and the settings a saved exposure control holds for. */
  readonly stored?: {
    readonly studyId: string;
    readonly calibrationId: string;
    readonly exposureSettings: ExposureControlSettings;
  };
}

/**
 * The adaptive bank and rules of a stored study, as a join would build them from its latest
 * converged calibration; explicit options override the study's adaptive settings.
 *
 * Side effect: like a join, it records the bank's current item versions in `items` (idempotent).
 */
async function storedStudySetup(
  studyId: string,
  options: SimulateAdaptiveOptions,
  output: SimulateOutput,
): Promise<SimulationSetup> {
  const loaded = await (output.loadBank ?? (() => openBank(commandConfig({}).itemsDir)))();
  const bank = deliveryBankFrom(loaded, () => {
    throw new Error('simulate: item views are not drawn');
  });
  return withDatabase(commandConfig({ database: options.database }), async (db) => {
    const study = await findStudyById(db, studyId);
    if (study === undefined) throw new CliError(`--study: there is no study ${studyId}`);
    const stored = parseStudySettings(study);
    const own = adaptiveSettingsOf(stored);
    const adaptive = {
      ...own,
      seTarget: options.seTarget ?? own.seTarget,
      minItems: options.minItems ?? own.minItems,
      randomesque: options.randomesque ?? own.randomesque,
      contentBalance: options.balance ?? own.contentBalance,
    };
    const settings: StudySettings = { ...stored, maxItems: options.maxItems ?? stored.maxItems, adaptive };
    const delivery = await loadAdaptiveDelivery(db, bank, studyId, settings);
    const overridden = (['seTarget', 'minItems', 'maxItems', 'randomesque', 'balance'] as const).filter(
      (name) => options[name] !== undefined,
    );
    return {
      bank: delivery.bank,
      // Time is not simulated: the time limit is left out.
      settings: { ...delivery.rules, timeLimitSeconds: undefined },
      balance: adaptive.contentBalance,
      stored: {
        studyId,
        calibrationId: delivery.calibrationId,
        exposureSettings: exposureControlSettingsOf(delivery.adaptive, delivery.rules),
      },
      description:
        `study ${studyId}: ${delivery.bank.ids.length} items placed by calibration ${delivery.calibrationId}` +
        (delivery.notEligible.length > 0
          ? ` (${delivery.notEligible.length} pool item${delivery.notEligible.length === 1 ? '' : 's'} not eligible)`
          : '') +
        `; the study's adaptive settings${overridden.length > 0 ? ` except ${overridden.join(', ')} from the command line` : ''}`,
    };
  });
}

const pad = (text: string, width: number, right = false) =>
  right ? text.padStart(width) : text.padEnd(width);

/** Table labels of the fixed designs. */
export const fixedDesignLabels: Readonly<Record<FixedDesign, string>> = {
  spanning: 'fixed, spanning the bank',
  bestTargeted: 'fixed, peaked at the centre',
  poolOrder: 'fixed, pool order',
};

const percent = (ratio: number | null) => (ratio === null ? 'n/a' : `${(ratio * 100).toFixed(0)}%`);

/** The result as a plain-text table, one row per audience and design, then the ratios and exposure. */
export function formatSimulationTable(result: SimulationResult, seTarget: number): string {
  const header = [
    'audience',
    'design',
    'items',
    'mean SE',
    'RMSE',
    'bias',
    `SE<=${seTarget}`,
    'max exposure',
    'never used',
  ];
  const row = (label: string, design: string, a: DesignAccuracy, items: string) => [
    label,
    design,
    items,
    a.meanStandardError.toFixed(3),
    a.rmse.toFixed(3),
    a.bias.toFixed(3),
    `${(a.reachedTarget * 100).toFixed(0)}%`,
    a.maxExposure.toFixed(2),
    `${(a.neverUsed * 100).toFixed(0)}%`,
  ];
  const rows: string[][] = [header];
  for (const a of result.audiences) {
    const label = a.audience.label;
    rows.push(row(label, 'adaptive', a.adaptive, a.adaptive.items.toFixed(1)));
    for (const design of fixedDesigns) {
      const fixed = a.fixed[design];
      if (fixed === null)
        rows.push([label, fixedDesignLabels[design], 'not reached', '', '', '', '', '', '']);
      else rows.push(row(label, fixedDesignLabels[design], fixed, String(fixed.length)));
    }
  }
  const widths = header.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  const lines = rows.map((r) =>
    r
      .map((v, c) => pad(v, widths[c]!, c >= 2))
      .join('  ')
      .trimEnd(),
  );
  lines.push('');
  for (const a of result.audiences) {
    const r = a.itemRatio;
    lines.push(
      `${a.audience.label}: adaptive uses ${percent(r.spanning)} of the spanning form's items, ` +
        `${percent(r.bestTargeted)} of the peaked form's, ${percent(r.poolOrder)} of the pool-order form's`,
    );
    const b = a.bound;
    if (b !== null) {
      lines.push(
        `  information bound: the best items at the true ability need ${b.items.toFixed(1)} (spanning form ${b.spanningLength ?? 'n/a'}, ` +
          `ratio ${percent(b.ratio)}); without the content rule ${b.itemsWithoutContentRule.toFixed(1)} (ratio ${percent(b.ratioWithoutContentRule)})`,
      );
    }
  }
  const floor = result.meanItems / result.exposure.length;
  lines.push(
    `all ${result.persons} persons: largest adaptive exposure ${result.maxExposure.toFixed(3)} ` +
      `(floor: mean items / bank size = ${result.meanItems.toFixed(1)}/${result.exposure.length} = ${floor.toFixed(3)}), ` +
      `${(result.neverUsed * 100).toFixed(0)}% of the bank never used`,
  );
  return `${lines.join('\n')}\n`;
}

/** What a run produced: the result printed last, and the bank and rules it ran on. */
export interface SimulateAdaptiveRun {
  readonly result: SimulationResult;
  readonly bank: AdaptiveBank;
  readonly settings: AdaptiveSettings;
}

/**
 * Runs the simulation study and prints it.
 *
 * @throws CliError for bad options or an unusable bank, difficulties file or study.
 */
export async function runSimulateAdaptive(
  options: SimulateAdaptiveOptions,
  output: SimulateOutput,
): Promise<SimulateAdaptiveRun> {
  if (options.study !== undefined && (options.bankSize !== undefined || options.difficulties !== undefined)) {
    throw new CliError('--study excludes --bank-size and --difficulties');
  }
  if (options.balance !== undefined && !contentBalanceModes.includes(options.balance)) {
    throw new CliError(`--balance must be one of ${contentBalanceModes.join(', ')}`);
  }
  const persons = positiveInteger(options.persons, 'persons', 500, 100000);
  if (options.seTarget !== undefined && !(options.seTarget >= 0.1 && options.seTarget <= 2)) {
    throw new CliError('--se-target must be a number in 0.1..2');
  }
  const maxExposure = options.maxExposure ?? 0.3;
  if (!(maxExposure > 0 && maxExposure <= 1)) throw new CliError('--max-exposure must be a number in (0, 1]');
  const seed = options.seed ?? 1;
  if (!Number.isInteger(seed)) throw new CliError('--seed must be an integer');
  if (options.maxItems !== undefined) positiveInteger(options.maxItems, 'max-items', 30, 200);
  if (options.minItems !== undefined) positiveInteger(options.minItems, 'min-items', 5, 200);
  if (options.randomesque !== undefined) positiveInteger(options.randomesque, 'randomesque', 5, 20);
  if (options.saveExposureControl) {
    if (options.study === undefined) throw new CliError('--save-exposure-control needs --study <id>');
    const overridden = (['seTarget', 'minItems', 'maxItems', 'randomesque', 'balance'] as const).filter(
      (name) => options[name] !== undefined,
    );
    if (overridden.length > 0 || options.noExposureControl) {
      throw new CliError(
        "--save-exposure-control tunes for the study's own adaptive settings; leave out --se-target, --min-items, --max-items, --randomesque, --balance and --no-exposure-control",
      );
    }
  }

  let setup: SimulationSetup;
  if (options.study !== undefined) {
    setup = await storedStudySetup(options.study, options, output);
  } else {
    const balance = options.balance ?? 'level';
    const { items, description } = await studyBank(options, balance, output);
    const maxItems = options.maxItems ?? 30;
    setup = {
      bank: buildAdaptiveBank(items).bank,
      settings: {
        seTarget: options.seTarget ?? 0.45,
        minItems: Math.min(options.minItems ?? 5, maxItems),
        maxItems,
        randomesque: options.randomesque ?? 5,
      },
      balance,
      description,
    };
  }
  const { bank, settings, balance, description } = setup;
  if (settings.maxItems > bank.ids.length) {
    output.stderr(
      `simulate: --max-items ${settings.maxItems} exceeds the bank's ${bank.ids.length} items; attempts stop when the pool is exhausted\n`,
    );
  }
  const audiences = simulatedAudienceMeans.map((mean) => ({ label: `mean ${mean}`, mean, sd: 1, persons }));
  const input = { bank, audiences, settings, seed };
  output.stdout(
    `Simulated adaptive delivery: ${description}; ${persons} persons per audience (ability SD 1, prior = audience distribution); ` +
      `SE target ${settings.seTarget}, items ${settings.minItems}..${settings.maxItems}, randomesque k = ${settings.randomesque}, balance by ${balance}; seed ${seed}\n\n`,
  );
  let result = simulateAdaptive(input);
  const randomesqueOnly = result;
  let tuned: { tuning: ExposureTuning; evaluated: SimulationResult } | null = null;
  output.stdout(`Randomesque exposure control alone:\n${formatSimulationTable(result, settings.seTarget)}`);
  let control = `randomesque k = ${settings.randomesque}`;
  const floor = result.meanItems / bank.ids.length;
  if (result.maxExposure > maxExposure && !options.noExposureControl && floor >= maxExposure) {
    output.stdout(
      `\nSympson-Hetter exposure control not tuned: attempts take ${result.meanItems.toFixed(1)} of the ${bank.ids.length} items on average, ` +
        `so the mean exposure ${floor.toFixed(3)} is already at least ${maxExposure} and no exposure control can bring the largest below it ` +
        '(it would only cut attempts short); a larger bank or fewer items per attempt would.\n',
    );
  } else if (result.maxExposure > maxExposure && !options.noExposureControl) {
    const tuning = tuneExposureControl(input, { maxExposure, rounds: 12 });
    output.stdout(
      `\nSympson-Hetter exposure control for ${maxExposure}, tuned toward ${tuning.tunedFor.toFixed(3)} ` +
        `(${tuning.iterations} rounds on fresh persons, largest exposure by round: ${tuning.maxExposureByRound.map((v) => v.toFixed(3)).join(', ')}; ` +
        `round ${tuning.bestRound} kept${tuning.converged ? '' : `; ${maxExposure} not reached`}), evaluated on the study's persons:\n`,
    );
    result = simulateAdaptive({
      ...input,
      settings: { ...settings, exposureControl: tuning.exposureControl },
    });
    output.stdout(formatSimulationTable(result, settings.seTarget));
    control += ` + Sympson-Hetter tuned for ${maxExposure}`;
    tuned = { tuning, evaluated: result };
  }
  if (options.saveExposureControl && setup.stored !== undefined) {
    await saveStudyExposureControl(
      setup.stored,
      tunedExposureControlOf(
        bank,
        maxExposure,
        { seed, personsPerAudience: persons, rounds: 12 },
        randomesqueOnly,
        tuned,
      ),
      options.database,
      output,
    );
  }
  if (options.svg !== undefined) {
    const svg = renderSimulationChart(result, {
      seTarget: settings.seTarget,
      maxExposure,
      subtitle: `${description}; ${control}; seed ${seed}`,
    });
    await writeFile(options.svg, `${svg}\n`);
    output.stderr(`simulate: wrote ${options.svg}\n`);
  }
  return { result, bank, settings };
}

/** Stores the run's exposure control for the study (actor `cli`) and says what was stored. */
async function saveStudyExposureControl(
  stored: NonNullable<SimulationSetup['stored']>,
  tuned: ReturnType<typeof tunedExposureControlOf>,
  database: string | undefined,
  output: SimulateOutput,
): Promise<void> {
  const record = await withDatabase(commandConfig({ database }), (db) =>
    db.transaction().execute((trx) =>
      saveExposureControl(
        trx,
        {
          studyId: stored.studyId,
          calibrationId: stored.calibrationId,
          settings: stored.exposureSettings,
          tuned,
        },
        'cli',
      ),
    ),
  );
  const ks = Object.values(record.itemParameters);
  const below = ks.filter((k) => k < 1);
  const what =
    record.outcome === 'tuned'
      ? `K < 1 for ${below.length} of ${ks.length} items (smallest ${Math.min(...ks).toFixed(3)})`
      : `K = 1 for all ${ks.length} items (${record.outcome === 'not-needed' ? 'randomesque alone keeps the largest exposure within the target' : 'the mean exposure is already at the target; no control can help'})`;
  output.stdout(
    `\nStored exposure control ${record.id} for study ${stored.studyId}, calibration ${stored.calibrationId}: ${what}; ` +
      `target ${record.targetMaxExposure}, largest exposure in simulation ${record.achievedMaxExposure.toFixed(3)}. ` +
      "New adaptive attempts use it while the study's calibration and adaptive settings stay as they are.\n",
  );
}

const numberFlag = (value: string) => Number(value);

/** Adds `simulate adaptive` to the program; bad options surface as CliError (exit code 2). */
export function registerSimulateCommand(program: Command): void {
  const simulate = program.command('simulate').description('simulation studies');
  withDatabaseFlag(
    simulate
      .command('adaptive')
      .description(
        'simulated audiences (ability means -1, 0, +1) through adaptive and fixed forms; items, accuracy, exposure',
      ),
  )
    .option(
      '--bank-size <n>',
      'use N INVENTED items with difficulties evenly spaced on [-3, 3] instead of the bank',
      numberFlag,
    )
    .option('--from-bank', 'use the item bank in ITEMS_DIR (the default)')
    .option(
      '--difficulties <items.csv>',
      'CSV item,difficulty of calibrated difficulties (else INVENTED generating ones)',
    )
    .option('--study <id>', "a stored study's latest converged calibration and adaptive settings")
    .option('--persons <n>', 'persons per audience', numberFlag, 500)
    .option(
      '--se-target <logits>',
      "stop when the posterior SD reaches this (default 0.45 or the study's)",
      numberFlag,
    )
    .option('--min-items <n>', "no SE stop before this many items (default 5 or the study's)", numberFlag)
    .option('--max-items <n>', "stop after this many items (default 30 or the study's)", numberFlag)
    .option(
      '--randomesque <k>',
      "pick among the k most informative items (default 5 or the study's)",
      numberFlag,
    )
    .option(
      '--balance <mode>',
      `content balancing: ${contentBalanceModes.join(', ')} (default level or the study's)`,
    )
    .option('--max-exposure <rate>', 'largest item exposure allowed', numberFlag, 0.3)
    .option('--no-exposure-control', 'do not tune Sympson-Hetter exposure control')
    .option('--seed <n>', 'random seed', numberFlag, 1)
    .option('--svg <file>', 'also write the picture as SVG')
    .option(
      '--save-exposure-control',
      "with --study: store the tuned exposure control for the study's new adaptive attempts",
    )
    .action(async (flags: Record<string, unknown>) => {
      if (flags['bankSize'] !== undefined && flags['fromBank']) {
        throw new CliError('--bank-size and --from-bank exclude each other');
      }
      if (flags['study'] !== undefined && flags['fromBank']) {
        throw new CliError('--study and --from-bank exclude each other');
      }
      await runSimulateAdaptive(
        {
          bankSize: flags['bankSize'] as number | undefined,
          difficulties: flags['difficulties'] as string | undefined,
          study: flags['study'] as string | undefined,
          database: flags['database'] as string | undefined,
          persons: flags['persons'] as number,
          seTarget: flags['seTarget'] as number | undefined,
          minItems: flags['minItems'] as number | undefined,
          maxItems: flags['maxItems'] as number | undefined,
          randomesque: flags['randomesque'] as number | undefined,
          balance: flags['balance'] as ContentBalanceMode | undefined,
          maxExposure: flags['maxExposure'] as number,
          noExposureControl: flags['exposureControl'] === false,
          seed: flags['seed'] as number,
          svg: flags['svg'] as string | undefined,
          saveExposureControl: flags['saveExposureControl'] === true,
        },
        { stdout: (t) => process.stdout.write(t), stderr: (t) => process.stderr.write(t) },
      );
    });
}
