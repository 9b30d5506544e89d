/**
 * `plotgauge calibrate <responses.csv> [--method cml|mml] [--anchor items.csv] [--out dir]`:
 * calibrates a Rasch model from a CSV of responses, prints an item table, and writes item and
 * person results (CSV and JSON) to the output folder.
 * `plotgauge calibrate --study <id> [--anchor-to <calibration>] [--replicates n] [--seed n]`:
 * calibrates a stored study instead (see calibrate-study-command.ts).
 *
 * Input, detected by the header:
 * - long: columns `person,item,score` (any order, any case), one answer per line;
 * - wide: first column the person id, every other column one item; cells 0, 1, or empty / NA / . for
 *   an item not presented.
 * A byte-order mark, CRLF line ends, quoted cells and blank lines (as spreadsheets export) are fine.
 * Bad input (wrong columns, scores other than 0/1, a repeated person-item pair, an empty file)
 * stops with one line naming the file line, exit code 2.
 */
import { mkdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Command } from 'commander';
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import {
  buildResponseMatrix,
  buildResponseMatrixFromWide,
  type LongResponseRow,
  ResponseDataError,
} from '../scoring/build-response-matrix.js';
import { calibrateCml } from '../scoring/rasch/calibrate-cml.js';
import { calibrateMml } from '../scoring/rasch/calibrate-mml.js';
import { estimateAbilityMle } from '../scoring/rasch/estimate-ability-mle.js';
import { estimateAbilityWle } from '../scoring/rasch/estimate-ability-wle.js';
import { computeFitStatistics } from '../scoring/rasch/fit-statistics.js';
import { pointMeasureCorrelation } from '../scoring/rasch/point-measure-correlation.js';
import type { ItemCalibration } from '../scoring/rasch/types.js';
import { MISSING, type ResponseMatrix } from '../scoring/response-matrix.js';
import { runCalibrateStudy } from './calibrate-study-command.js';
import { CliError } from './cli-error.js';

/** Bad input to `calibrate`: one line naming the file and line; exit code 2. */
export class CalibrateInputError extends CliError {
  constructor(message: string) {
    super(message, 2);
  }
}

export interface CalibrateOptions {
  readonly method?: 'cml' | 'mml';
  /** CSV with columns item,difficulty: items fixed at earlier values. */
  readonly anchor?: string;
  /** Folder for items.csv, items.json, persons.csv, persons.json; nothing is written without it. */
  readonly out?: string;
}

export interface CalibrateOutput {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  /** Milliseconds since some origin; injectable so tests can drive the progress line. */
  readonly now?: () => number;
}

interface CsvRecord {
  readonly cells: string[];
  readonly line: number;
}

/**
 * Splits CSV text into records with their line numbers. Lines without a double quote are split
 * on commas directly (fast for large exports); lines with quotes go through csv-parse. A quoted
 * cell that spans lines is not supported in response files and is reported as an error.
 */
export function parseCsvText(text: string, file: string): CsvRecord[] {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split(/\r\n|\n|\r/);
  const records: CsvRecord[] = [];
  for (let k = 0; k < lines.length; k++) {
    const line = lines[k]!;
    let cells: string[];
    if (!line.includes('"')) cells = line.split(',').map((c) => c.trim());
    else {
      try {
        const parsed = parse(line, { relax_column_count: true, trim: true }) as string[][];
        if (parsed.length !== 1) throw new Error('more than one record on a line');
        cells = parsed[0]!;
      } catch (error) {
        throw new CalibrateInputError(
          `${file} line ${k + 1}: not valid CSV (${(error as Error).message.split('\n')[0]})`,
        );
      }
    }
    if (cells.some((c) => c !== '')) records.push({ cells, line: k + 1 });
  }
  return records;
}

async function readCsv(file: string): Promise<CsvRecord[]> {
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    throw new CalibrateInputError(`${file}: cannot be read`);
  }
  return parseCsvText(text, file);
}

function parseScore(text: string, file: string, line: number, what: string): number | null {
  if (text === '' || text.toUpperCase() === 'NA' || text === '.') return null;
  if (text === '0' || text === '1') return Number(text);
  throw new CalibrateInputError(`${file} line ${line}: score "${text}" for ${what} is not 0 or 1`);
}

/** Reads long or wide responses into a matrix, turning data errors into one-line input errors. */
export async function readResponsesCsv(file: string): Promise<ResponseMatrix> {
  const records = await readCsv(file);
  const header = records[0];
  if (header === undefined) throw new CalibrateInputError(`${file}: empty file (expected a header line)`);
  if (records.length === 1) throw new CalibrateInputError(`${file}: no responses after the header`);
  const names = header.cells.map((c) => c.toLowerCase());
  const data = records.slice(1);
  try {
    if (names.includes('item') && names.includes('score')) {
      const person = names.indexOf('person');
      const item = names.indexOf('item');
      const score = names.indexOf('score');
      if (person < 0 || names.length !== 3) {
        throw new CalibrateInputError(
          `${file} line ${header.line}: long format needs exactly the columns person,item,score`,
        );
      }
      const rows: LongResponseRow[] = data.map(({ cells, line }) => {
        if (cells.length !== 3)
          throw new CalibrateInputError(`${file} line ${line}: ${cells.length} columns, expected 3`);
        const who = `person ${cells[person]}, item ${cells[item]}`;
        return {
          person: cells[person]!,
          item: cells[item]!,
          score: parseScore(cells[score]!, file, line, who),
        };
      });
      return buildResponseMatrix(rows, { rowNumbers: data.map((r) => r.line) });
    }
    if (names.length < 2) {
      throw new CalibrateInputError(
        `${file} line ${header.line}: expected person,item,score or a person column followed by item columns`,
      );
    }
    const itemIds = header.cells.slice(1);
    const seen = new Set<string>();
    for (const id of itemIds) {
      if (id === '') throw new CalibrateInputError(`${file} line ${header.line}: an item column has no name`);
      if (seen.has(id))
        throw new CalibrateInputError(`${file} line ${header.line}: item ${id} appears twice`);
      seen.add(id);
    }
    const rows = data.map(({ cells, line }) => {
      if (cells.length !== header.cells.length) {
        throw new CalibrateInputError(
          `${file} line ${line}: ${cells.length} columns, expected ${header.cells.length}`,
        );
      }
      return cells
        .slice(1)
        .map((c, i) => parseScore(c, file, line, `person ${cells[0]}, item ${itemIds[i]}`));
    });
    return buildResponseMatrixFromWide(
      data.map((r) => r.cells[0]!),
      itemIds,
      rows,
      { rowNumbers: data.map((r) => r.line) },
    );
  } catch (error) {
    if (error instanceof ResponseDataError)
      throw new CalibrateInputError(`${file} ${error.message.replace(/\brow (\d+)/g, 'line $1')}`);
    throw error;
  }
}

async function readAnchors(file: string): Promise<Map<string, number>> {
  const records = await readCsv(file);
  const header = records[0];
  if (header === undefined)
    throw new CalibrateInputError(`${file}: empty file (expected a header item,difficulty)`);
  const names = header.cells.map((c) => c.toLowerCase());
  const item = names.indexOf('item');
  const difficulty = names.indexOf('difficulty');
  if (item < 0 || difficulty < 0)
    throw new CalibrateInputError(`${file} line ${header.line}: expected columns item,difficulty`);
  const anchors = new Map<string, number>();
  for (const { cells, line } of records.slice(1)) {
    const id = cells[item] ?? '';
    const value = Number(cells[difficulty]);
    if (id === '' || cells[difficulty] === '' || !Number.isFinite(value)) {
      throw new CalibrateInputError(`${file} line ${line}: needs an item id and a numeric difficulty`);
    }
    if (anchors.has(id)) throw new CalibrateInputError(`${file} line ${line}: item ${id} anchored twice`);
    anchors.set(id, value);
  }
  return anchors;
}

const round = (x: number, digits = 4) => (Number.isFinite(x) ? Number(x.toFixed(digits)) : null);

/**
 * Runs one calibration from files; returns nothing, throws {@link CalibrateInputError} for bad input.
 * Progress goes to `output.stderr` once the fit has run for more than a second.
 */
export async function runCalibrate(
  file: string,
  options: CalibrateOptions,
  output: CalibrateOutput,
): Promise<void> {
  const method = options.method ?? 'cml';
  if (method !== 'cml' && method !== 'mml')
    throw new CalibrateInputError(`--method must be cml or mml, not ${String(method)}`);
  const now = output.now ?? (() => performance.now());
  const started = now();
  const progress = (text: string) => {
    const seconds = (now() - started) / 1000;
    if (seconds > 1) output.stderr(`calibrate: ${text} (${seconds.toFixed(1)} s)\n`);
  };
  const matrix = await readResponsesCsv(file);
  const anchors = options.anchor === undefined ? undefined : await readAnchors(options.anchor);
  for (const id of anchors?.keys() ?? []) {
    if (!matrix.itemIds.includes(id))
      throw new CalibrateInputError(`${options.anchor}: anchored item ${id} is not in ${file}`);
  }
  progress(`read ${matrix.personIds.length} persons and ${matrix.itemIds.length} items`);
  let calibration: ItemCalibration;
  try {
    calibration =
      method === 'cml'
        ? calibrateCml(matrix, {
            anchors,
            onIteration: (k, step) =>
              progress(`iteration ${k} of at most 100, largest change ${step.toExponential(1)}`),
          })
        : calibrateMml(matrix, { anchors });
  } catch (error) {
    throw new CalibrateInputError(`${file}: ${(error as Error).message}`);
  }
  progress(`${method.toUpperCase()} done after ${calibration.iterations} iterations; estimating persons`);

  const nItems = matrix.itemIds.length;
  const difficultyByColumn = new Float64Array(nItems).fill(Number.NaN);
  const standardErrorByColumn = new Float64Array(nItems).fill(Number.NaN);
  calibration.itemIds.forEach((id, k) => {
    const column = matrix.itemIds.indexOf(id);
    difficultyByColumn[column] = calibration.difficulty[k]!;
    standardErrorByColumn[column] = calibration.standardError[k]!;
  });
  const words = new Uint16Array(Math.ceil(nItems / 16));
  const estimatesByPattern = new Map<
    string,
    { ability: number | null; standardError: number | null; mle: number }
  >();
  const persons = matrix.personIds.map((person, p) => {
    const answered: number[] = [];
    const responses: number[] = [];
    words.fill(0);
    for (let i = 0; i < nItems; i++) {
      const x = matrix.scores[p * nItems + i]!;
      if (x === MISSING || Number.isNaN(difficultyByColumn[i]!)) continue;
      answered.push(difficultyByColumn[i]!);
      responses.push(x);
      words[i >> 4]! |= 1 << (i & 15);
    }
    const rawScore = responses.reduce((a, b) => a + b, 0);
    if (answered.length === 0)
      return { person, answered: 0, rawScore, ability: null, standardError: null, mle: Number.NaN };
    // Persons with the same items and raw score share their estimates (the raw score is sufficient).
    const key = `${String.fromCharCode(...words)}|${rawScore}`;
    let estimates = estimatesByPattern.get(key);
    if (estimates === undefined) {
      const b = Float64Array.from(answered);
      const wle = estimateAbilityWle(b, rawScore);
      const mle = estimateAbilityMle(b, rawScore);
      estimates = {
        ability: round(wle.estimate),
        standardError: round(wle.standardError),
        mle: mle.kind === 'estimate' ? mle.estimate : Number.NaN,
      };
      estimatesByPattern.set(key, estimates);
    }
    return { person, answered: answered.length, rawScore, ...estimates };
  });
  // Fit uses the MLE of persons with non-extreme scores (as Wright & Masters 1982 and eRm do).
  const abilities = Float64Array.from(persons, (p) => p.mle);
  const fit = computeFitStatistics(matrix, difficultyByColumn, abilities);
  const pointMeasure = pointMeasureCorrelation(matrix, abilities);
  const excludedReason = new Map(calibration.excludedItems.map((e) => [e.id, e.reason]));
  const items = matrix.itemIds.map((item, i) => ({
    item,
    difficulty: round(difficultyByColumn[i]!),
    standardError: round(standardErrorByColumn[i]!),
    infit: round(fit.items.infit[i]!, 3),
    outfit: round(fit.items.outfit[i]!, 3),
    infitZ: round(fit.items.infitZ[i]!, 2),
    outfitZ: round(fit.items.outfitZ[i]!, 2),
    pointMeasure: round(pointMeasure[i]!, 3),
    answered: fit.items.count[i]!,
    status: excludedReason.get(item) ?? (anchors?.has(item) ? 'anchored' : 'calibrated'),
  }));

  const cell = (v: number | null) => (v === null ? '' : String(v));
  const table = [
    ['item', 'difficulty', 'se', 'infit', 'outfit', 'pt-measure', 'n', 'status'],
    ...items.map((r) => [
      r.item,
      cell(r.difficulty),
      cell(r.standardError),
      cell(r.infit),
      cell(r.outfit),
      cell(r.pointMeasure),
      String(r.answered),
      r.status,
    ]),
  ];
  const widths = table[0]!.map((_, c) => Math.max(...table.map((row) => row[c]!.length)));
  output.stdout(
    `${method.toUpperCase()} calibration of ${calibration.itemIds.length} items from ${matrix.personIds.length} persons` +
      ` (${calibration.converged ? 'converged' : 'NOT converged'} after ${calibration.iterations} iterations; difficulty in logits)\n`,
  );
  for (const row of table)
    output.stdout(
      `${row
        .map((v, c) => (c === 0 || c === 7 ? v.padEnd(widths[c]!) : v.padStart(widths[c]!)))
        .join('  ')
        .trimEnd()}\n`,
    );
  if (calibration.excludedPersons.length > 0) {
    output.stdout(
      `${calibration.excludedPersons.length} persons left out of the calibration (no responses or all right/all wrong); they still get a WLE\n`,
    );
  }

  if (options.out === undefined) return;
  await mkdir(options.out, { recursive: true });
  const summary = {
    method,
    converged: calibration.converged,
    iterations: calibration.iterations,
    logLikelihood: calibration.logLikelihood,
    excludedItems: calibration.excludedItems,
    excludedPersons: calibration.excludedPersons,
  };
  const personRows = persons.map(({ mle: _mle, ...rest }) => rest);
  await writeFile(
    path.join(options.out, 'items.json'),
    `${JSON.stringify({ ...summary, items }, null, 2)}\n`,
  );
  await writeFile(path.join(options.out, 'items.csv'), stringify(items, { header: true }));
  await writeFile(
    path.join(options.out, 'persons.json'),
    `${JSON.stringify({ estimator: 'wle', method, persons: personRows }, null, 2)}\n`,
  );
  await writeFile(path.join(options.out, 'persons.csv'), stringify(personRows, { header: true }));
  output.stderr(`calibrate: wrote items.csv, items.json, persons.csv, persons.json to ${options.out}\n`);
}

/** Adds `calibrate` to the program; errors surface as {@link CalibrateInputError} (a CliError, exit code 2). */
export function registerCalibrateCommand(program: Command): void {
  program
    .command('calibrate')
    .description(
      'fit a Rasch model to a CSV of responses (print the item table, write item and person files), ' +
        'or with --study calibrate a study from its stored responses and store the calibration',
    )
    .argument(
      '[responses.csv]',
      'long (person,item,score) or wide (person column, then one column per item) CSV',
    )
    .option('--method <method>', 'cml (conditional) or mml (marginal)', 'cml')
    .option('--anchor <items.csv>', 'CSV item,difficulty: keep these items at earlier values')
    .option('--out <dir>', 'write items.csv, items.json, persons.csv, persons.json here')
    .option(
      '--study <id>',
      'calibrate this study from the database instead of a CSV (MML, cohorts as groups)',
    )
    .option('--database <url>', 'with --study: sqlite:<file> or postgres://… (DATABASE_URL)')
    .option('--anchor-to <calibration>', 'with --study: keep the difficulties of an earlier calibration')
    .option('--replicates <n>', 'with --study: bootstrap replicates for the report intervals (default 200)')
    .option('--seed <n>', 'with --study: seed of the bootstrap (default 1)')
    .action(async (file: string | undefined, flags: CalibrateFlags) => {
      if (flags.study !== undefined) {
        if (file !== undefined)
          throw new CliError('calibrate: give either a responses CSV or --study <id>, not both');
        await runCalibrateStudy(
          {
            study: flags.study,
            ...(flags.database === undefined ? {} : { database: flags.database }),
            ...(flags.anchorTo === undefined ? {} : { anchorTo: flags.anchorTo }),
            ...(flags.replicates === undefined ? {} : { replicates: flags.replicates }),
            ...(flags.seed === undefined ? {} : { seed: flags.seed }),
          },
          (line) => console.log(line),
        );
        return;
      }
      if (file === undefined)
        throw new CliError('calibrate: give a responses CSV, or --study <id> to calibrate a stored study');
      await runCalibrate(
        file,
        { method: flags.method as CalibrateOptions['method'], anchor: flags.anchor, out: flags.out },
        { stdout: (t) => process.stdout.write(t), stderr: (t) => process.stderr.write(t) },
      );
    });
}

interface CalibrateFlags {
  method: string;
  anchor?: string;
  out?: string;
  study?: string;
  database?: string;
  anchorTo?: string;
  replicates?: string;
  seed?: string;
}
