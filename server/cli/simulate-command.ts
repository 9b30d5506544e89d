/**
 * `plotgauge simulate adaptive`: a simulation study of adaptive delivery on the current bank (or an
 * invented one), comparing adaptive attempts with fixed forms of the same precision, and item
 * exposure. Prints a table; `--svg` also writes a picture.
 *
 * Difficulties: `--difficulties items.csv` (the `calibrate --out` items.csv, or any CSV with
 * columns item,difficulty) gives calibrated values; otherwise the bank's items get the demo's
 * INVENTED generating difficulties derived from their features (server/demo/generating-difficulty.ts).
 * `--bank-size N` replaces the bank by N INVENTED items, difficulties evenly spaced on [−3, 3],
 * task levels and chart types in turn.
 *
 * Exposure: the study runs with randomesque selection alone; when its largest exposure exceeds
 * `--max-exposure`, Sympson–Hetter parameters are tuned on separate simulated persons and the study
 * is run again with them (both tables are printed).
 */
import { readFile, writeFile } from 'node:fs/promises';
import type { Command } from 'commander';
import type { ItemBank } from '../bank/load-bank.js';
import { chartTypes } from '../charts/chart-spec.js';
import { type AdaptiveItem, buildAdaptiveBank } from '../delivery/adaptive/adaptive-bank.js';
import type { AdaptiveSettings } from '../delivery/adaptive/adaptive-settings.js';
import {
  type ContentBalanceMode,
  contentAreaOf,
  contentBalanceModes,
} from '../delivery/adaptive/content-area.js';
import {
  type DesignAccuracy,
  type SimulationResult,
  simulateAdaptive,
} from '../delivery/adaptive/simulate-adaptive.js';
import { renderSimulationChart } from '../delivery/adaptive/simulation-chart.js';
import { tuneExposureControl } from '../delivery/adaptive/tune-exposure-control.js';
import { generatingDifficulty } from '../demo/generating-difficulty.js';
import { seededRandom } from '../scoring/seeded-random.js';
import { parseCsvText } from './calibrate-command.js';
import { CliError } from './cli-error.js';
import { commandConfig } from './command-config.js';
import { openBank } from './open-bank.js';

export interface SimulateAdaptiveOptions {
  /** INVENTED bank of this many items instead of the item bank. */
  readonly bankSize?: number;
  /** CSV item,difficulty of calibrated difficulties for the bank's items. */
  readonly difficulties?: string;
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

const pad = (text: string, width: number, right = false) =>
  right ? text.padStart(width) : text.padEnd(width);

/** The result as a plain-text table, one row per audience and design. */
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
    for (const [design, fixed] of [
      ['fixed, best-targeted', a.fixed],
      ['fixed, pool order', a.poolOrder],
    ] as const) {
      if (fixed === null) rows.push([label, design, 'not reached', '', '', '', '', '', '']);
      else rows.push(row(label, design, fixed, String(fixed.length)));
    }
  }
  const widths = header.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  const lines = rows.map((r) =>
    r
      .map((v, c) => pad(v, widths[c]!, c >= 2))
      .join('  ')
      .trimEnd(),
  );
  for (const a of result.audiences) {
    const vs = (form: { length: number } | null) =>
      form === null ? 'n/a' : `${((a.adaptive.items / form.length) * 100).toFixed(0)}%`;
    lines.push(
      `${a.audience.label}: adaptive uses ${vs(a.fixed)} of the best-targeted fixed form's items, ${vs(a.poolOrder)} of the pool-order form's`,
    );
  }
  lines.push(
    `all ${result.persons} persons: largest adaptive exposure ${result.maxExposure.toFixed(3)}, ${(result.neverUsed * 100).toFixed(0)}% of the bank never used`,
  );
  return `${lines.join('\n')}\n`;
}

/**
 * Runs the simulation study and prints it.
 *
 * @throws CliError for bad options or an unusable bank or difficulties file.
 */
export async function runSimulateAdaptive(
  options: SimulateAdaptiveOptions,
  output: SimulateOutput,
): Promise<SimulationResult> {
  const balance = options.balance ?? 'level';
  if (!contentBalanceModes.includes(balance)) {
    throw new CliError(`--balance must be one of ${contentBalanceModes.join(', ')}`);
  }
  const persons = positiveInteger(options.persons, 'persons', 500, 100000);
  const seTarget = options.seTarget ?? 0.45;
  if (!(seTarget >= 0.1 && seTarget <= 2)) throw new CliError('--se-target must be a number in 0.1..2');
  const maxExposure = options.maxExposure ?? 0.3;
  if (!(maxExposure > 0 && maxExposure <= 1)) throw new CliError('--max-exposure must be a number in (0, 1]');
  const seed = options.seed ?? 1;
  if (!Number.isInteger(seed)) throw new CliError('--seed must be an integer');
  const { items, description } = await studyBank(options, balance, output);
  const { bank } = buildAdaptiveBank(items);
  const maxItems = positiveInteger(options.maxItems, 'max-items', 30, 500);
  if (maxItems > items.length) {
    output.stderr(
      `simulate: --max-items ${maxItems} exceeds the bank's ${items.length} items; attempts stop when the pool is exhausted\n`,
    );
  }
  const settings: AdaptiveSettings = {
    seTarget,
    minItems: Math.min(positiveInteger(options.minItems, 'min-items', 5, 500), maxItems),
    maxItems,
    randomesque: positiveInteger(options.randomesque, 'randomesque', 5, 50),
  };
  const audiences = simulatedAudienceMeans.map((mean) => ({ label: `mean ${mean}`, mean, sd: 1, persons }));
  const input = { bank, audiences, settings, seed };
  output.stdout(
    `Simulated adaptive delivery: ${description}; ${persons} persons per audience (ability SD 1, prior = audience distribution); ` +
      `SE target ${seTarget}, items ${settings.minItems}..${maxItems}, randomesque k = ${settings.randomesque}, balance by ${balance}; seed ${seed}\n\n`,
  );
  let result = simulateAdaptive(input);
  output.stdout(`Randomesque exposure control alone:\n${formatSimulationTable(result, seTarget)}`);
  let control = `randomesque k = ${settings.randomesque}`;
  if (result.maxExposure > maxExposure && !options.noExposureControl) {
    const tuning = tuneExposureControl(input, { maxExposure, rounds: 10 });
    output.stdout(
      `\nSympson-Hetter exposure control tuned for ${maxExposure} (${tuning.iterations} rounds, largest exposure by round: ${tuning.maxExposureByRound.map((v) => v.toFixed(3)).join(', ')}${tuning.converged ? '' : '; not reached'}):\n`,
    );
    result = simulateAdaptive({
      ...input,
      settings: { ...settings, exposureControl: tuning.exposureControl },
    });
    output.stdout(formatSimulationTable(result, seTarget));
    control += ` + Sympson-Hetter tuned for ${maxExposure}`;
  }
  if (options.svg !== undefined) {
    const svg = renderSimulationChart(result, {
      seTarget,
      maxExposure,
      subtitle: `${description}; ${control}; seed ${seed}`,
    });
    await writeFile(options.svg, `${svg}\n`);
    output.stderr(`simulate: wrote ${options.svg}\n`);
  }
  return result;
}

const numberFlag = (value: string) => Number(value);

/** Adds `simulate adaptive` to the program; bad options surface as CliError (exit code 2). */
export function registerSimulateCommand(program: Command): void {
  const simulate = program.command('simulate').description('simulation studies');
  simulate
    .command('adaptive')
    .description(
      'simulated audiences (ability means -1, 0, +1) through adaptive and fixed forms; items, accuracy, exposure',
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
    .option('--persons <n>', 'persons per audience', numberFlag, 500)
    .option('--se-target <logits>', 'stop when the posterior SD reaches this', numberFlag, 0.45)
    .option('--min-items <n>', 'no SE stop before this many items', numberFlag, 5)
    .option('--max-items <n>', 'stop after this many items', numberFlag, 30)
    .option('--randomesque <k>', 'pick among the k most informative items', numberFlag, 5)
    .option('--balance <mode>', `content balancing: ${contentBalanceModes.join(', ')}`, 'level')
    .option('--max-exposure <rate>', 'largest item exposure allowed', numberFlag, 0.3)
    .option('--no-exposure-control', 'do not tune Sympson-Hetter exposure control')
    .option('--seed <n>', 'random seed', numberFlag, 1)
    .option('--svg <file>', 'also write the picture as SVG')
    .action(async (flags: Record<string, unknown>) => {
      if (flags['bankSize'] !== undefined && flags['fromBank']) {
        throw new CliError('--bank-size and --from-bank exclude each other');
      }
      await runSimulateAdaptive(
        {
          bankSize: flags['bankSize'] as number | undefined,
          difficulties: flags['difficulties'] as string | undefined,
          persons: flags['persons'] as number,
          seTarget: flags['seTarget'] as number,
          minItems: flags['minItems'] as number,
          maxItems: flags['maxItems'] as number,
          randomesque: flags['randomesque'] as number,
          balance: flags['balance'] as ContentBalanceMode,
          maxExposure: flags['maxExposure'] as number,
          noExposureControl: flags['exposureControl'] === false,
          seed: flags['seed'] as number,
          svg: flags['svg'] as string | undefined,
        },
        { stdout: (t) => process.stdout.write(t), stderr: (t) => process.stderr.write(t) },
      );
    });
}
