/**
 * Benchmark of the Rasch calibrations (CML and MML) against reference R packages on the same data.
 *
 * Run by hand, never in tests:
 *   npx tsx scripts/bench/calibrate.ts            all four sets, R references when Rscript exists
 *   npx tsx scripts/bench/calibrate.ts --quick    the two smaller sets only
 *   npx tsx scripts/bench/calibrate.ts --no-r     skip the R references
 *   npx tsx scripts/bench/calibrate.ts --sets 2000x40,5000x120b --repeats 5
 *
 * Every fit runs in a fresh child process so that its peak memory (maxRSS) is its own. Our fits
 * are timed as the median of `repeats` runs after one warm-up run (JIT); the R fits are timed
 * once inside R (system.time around the fit only, not the CSV read). A reference fit whose
 * time, extrapolated from the last set it finished as (answers × items ratio)^1.2, exceeds
 * 5 minutes is skipped and printed as skipped; a hard 330 s timeout backs that up.
 *
 * Data: simulated Rasch responses (seeded Mulberry32, see test/helpers/random.ts), difficulties
 * evenly spaced on [−2, 2], abilities N(0.3, 1.1²). The booklet set has 10 rotated overlapping
 * booklets of 24 of the 120 items.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { calibrateMml } from '../../server/scoring/rasch/calibrate-mml.js';
import type { ItemCalibration } from '../../server/scoring/rasch/types.js';
import { MISSING, type ResponseMatrix } from '../../server/scoring/response-matrix.js';
import {
  createRandom,
  normalSample,
  rotatedBookletDesign,
  simulateRasch,
  spacedDifficulties,
} from '../../test/helpers/random.js';

interface BenchSet {
  readonly name: string;
  readonly persons: number;
  readonly items: number;
  readonly booklets?: { readonly count: number; readonly itemsPerBooklet: number };
}

const SETS: readonly BenchSet[] = [
  { name: '2000x40', persons: 2000, items: 40 },
  { name: '5000x120b', persons: 5000, items: 120, booklets: { count: 10, itemsPerBooklet: 24 } },
  { name: '20000x40', persons: 20000, items: 40 },
  { name: '100000x40', persons: 100000, items: 40 },
];
const QUICK_SETS = ['2000x40', '5000x120b'];
const R_METHODS = ['erm', 'psychotools', 'glmer0'] as const;
type RMethod = (typeof R_METHODS)[number];
const R_LIMIT_SECONDS = 300;

interface FitResult {
  readonly seconds: number | null;
  readonly peakMb: number | null;
  readonly itemIds: readonly string[];
  readonly difficulty: readonly number[];
  readonly note?: string;
}

function simulate(set: BenchSet): ResponseMatrix {
  const random = createRandom(20240611 + set.persons + set.items);
  const difficulty = spacedDifficulties(set.items, -2, 2);
  const abilities = normalSample(random, set.persons, 0.3, 1.1);
  const presented = set.booklets
    ? rotatedBookletDesign(set.persons, set.items, set.booklets.count, set.booklets.itemsPerBooklet)
    : undefined;
  return simulateRasch(
    presented ? { difficulty, abilities, random, presented } : { difficulty, abilities, random },
  );
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

/** Child process: simulate the set, fit it, print one JSON line. */
async function runChild(setName: string, method: string, repeats: number): Promise<void> {
  const set = SETS.find((s) => s.name === setName);
  if (!set) throw new Error(`unknown set ${setName}`);
  const matrix = simulate(set);
  let calibrate: (m: ResponseMatrix) => ItemCalibration;
  if (method === 'cml') {
    const { calibrateCml } = await import('../../server/scoring/rasch/calibrate-cml.js');
    calibrate = (m) => calibrateCml(m);
  } else if (method === 'mml') {
    calibrate = (m) => calibrateMml(m);
  } else {
    // 'data': the simulated matrix only, the memory baseline.
    const result: FitResult = {
      seconds: 0,
      peakMb: process.resourceUsage().maxRSS / 1024,
      itemIds: [],
      difficulty: [],
    };
    console.log(JSON.stringify(result));
    return;
  }
  let calibration = calibrate(matrix);
  const times: number[] = [];
  for (let r = 0; r < repeats; r++) {
    const start = performance.now();
    calibration = calibrate(matrix);
    times.push((performance.now() - start) / 1000);
  }
  const result: FitResult = {
    seconds: median(times),
    peakMb: process.resourceUsage().maxRSS / 1024,
    itemIds: calibration.itemIds,
    difficulty: Array.from(calibration.difficulty),
    note: calibration.converged ? `${calibration.iterations} it` : 'not converged',
  };
  console.log(JSON.stringify(result));
}

function runOurs(setName: string, method: string, repeats: number): FitResult {
  const script = fileURLToPath(import.meta.url);
  const child = spawnSync(
    process.execPath,
    [...process.execArgv, script, '--child', setName, method, String(repeats)],
    {
      encoding: 'utf8',
      maxBuffer: 64 * 1024 * 1024,
    },
  );
  const line = child.stdout.trim().split('\n').pop() ?? '';
  if (child.status !== 0 || !line.startsWith('{')) {
    const reason = (
      child.stderr
        .trim()
        .split('\n')
        .find((l) => l.includes('Error')) ?? 'failed'
    ).slice(0, 80);
    return { seconds: null, peakMb: null, itemIds: [], difficulty: [], note: reason };
  }
  return JSON.parse(line) as FitResult;
}

const R_SCRIPT = `
args <- commandArgs(trailingOnly = TRUE)
csv <- args[[1]]; method <- args[[2]]; out <- args[[3]]
suppressPackageStartupMessages(library(jsonlite))
x <- as.matrix(read.csv(csv, check.names = FALSE))
ids <- colnames(x)
difficulty <- NULL
if (method == "erm") {
  suppressPackageStartupMessages(library(eRm))
  seconds <- system.time(fit <- RM(x))[["elapsed"]]
  difficulty <- -unname(fit$betapar)
} else if (method == "psychotools") {
  suppressPackageStartupMessages(library(psychotools))
  seconds <- system.time(fit <- raschmodel(x))[["elapsed"]]
  difficulty <- as.numeric(itempar(fit))
} else if (method == "glmer0") {
  suppressPackageStartupMessages(library(lme4))
  long <- data.frame(person = factor(as.vector(row(x))),
                     item = factor(ids[as.vector(col(x))], levels = ids),
                     score = as.vector(x))
  long <- long[!is.na(long$score), ]
  seconds <- system.time(fit <- glmer(score ~ 0 + item + (1 | person), data = long,
                                      family = binomial, nAGQ = 0))[["elapsed"]]
  difficulty <- -unname(fixef(fit))
}
status <- readLines("/proc/self/status")
peak <- as.numeric(gsub("[^0-9]", "", status[grepl("^VmHWM", status)])) / 1024
writeLines(toJSON(list(seconds = seconds, peakMb = peak, itemIds = ids, difficulty = difficulty),
                  auto_unbox = TRUE, digits = NA), out)
`;

function writeCsv(matrix: ResponseMatrix, path: string): void {
  const items = matrix.itemIds.length;
  const lines = [matrix.itemIds.join(',')];
  for (let p = 0; p < matrix.personIds.length; p++) {
    const cells: string[] = new Array(items);
    for (let i = 0; i < items; i++) {
      const x = matrix.scores[p * items + i]!;
      cells[i] = x === MISSING ? 'NA' : String(x);
    }
    lines.push(cells.join(','));
  }
  writeFileSync(path, `${lines.join('\n')}\n`);
}

function runR(method: RMethod, csv: string, scriptPath: string, workDir: string): FitResult {
  const out = join(workDir, `${method}.json`);
  const child = spawnSync('Rscript', [scriptPath, csv, method, out], {
    encoding: 'utf8',
    timeout: (R_LIMIT_SECONDS + 30) * 1000,
  });
  if (child.error || child.status !== 0) {
    const note = child.error
      ? `timeout (>${R_LIMIT_SECONDS + 30} s)`
      : (
          child.stderr
            .trim()
            .split('\n')
            .find((l) => l.startsWith('Error')) ?? 'failed'
        ).slice(0, 60);
    return { seconds: null, peakMb: null, itemIds: [], difficulty: [], note };
  }
  return JSON.parse(readFileSync(out, 'utf8')) as FitResult;
}

/** Largest |Δb| over common items after centring both on those items (removes the origin). */
function maxDifference(a: FitResult, b: FitResult, centre: boolean): number | null {
  if (a.difficulty.length === 0 || b.difficulty.length === 0) return null;
  const position = new Map(b.itemIds.map((id, i) => [id, i]));
  const pairs: [number, number][] = [];
  a.itemIds.forEach((id, i) => {
    const j = position.get(id);
    if (j !== undefined) pairs.push([a.difficulty[i]!, b.difficulty[j]!]);
  });
  if (pairs.length === 0) return null;
  const meanA = centre ? pairs.reduce((s, [x]) => s + x, 0) / pairs.length : 0;
  const meanB = centre ? pairs.reduce((s, [, y]) => s + y, 0) / pairs.length : 0;
  return Math.max(...pairs.map(([x, y]) => Math.abs(x - meanA - (y - meanB))));
}

function hasRscript(): boolean {
  const probe = spawnSync('Rscript', ['-e', 'cat(1)'], { encoding: 'utf8' });
  return probe.status === 0;
}

const seconds = (r: FitResult | undefined): string =>
  r?.seconds == null ? (r?.note ?? '-') : r.seconds < 10 ? r.seconds.toFixed(3) : r.seconds.toFixed(1);
const ratio = (slow: FitResult | undefined, fast: FitResult | undefined): string =>
  slow?.seconds != null && fast?.seconds != null && fast.seconds > 0
    ? `${(slow.seconds / fast.seconds).toFixed(0)}x`
    : '-';
const mb = (r: FitResult | undefined): string => (r?.peakMb == null ? '-' : r.peakMb.toFixed(0));
const small = (v: number | null): string => (v == null ? '-' : v.toExponential(1));

async function main(): Promise<void> {
  const argv = process.argv.slice(2);
  const repeatsFlag = argv.indexOf('--repeats');
  const repeats = repeatsFlag >= 0 ? Number(argv[repeatsFlag + 1]) : 3;
  if (argv[0] === '--child') {
    await runChild(argv[1]!, argv[2]!, Number(argv[3] ?? 3));
    return;
  }
  const setsFlag = argv.indexOf('--sets');
  const wanted =
    setsFlag >= 0 ? argv[setsFlag + 1]!.split(',') : argv.includes('--quick') ? QUICK_SETS : null;
  const sets = SETS.filter((s) => !wanted || wanted.includes(s.name));
  const withR = !argv.includes('--no-r') && hasRscript();
  const workDir = mkdtempSync(join(tmpdir(), 'plotgauge-bench-'));
  const rScript = join(workDir, 'fit.R');
  writeFileSync(rScript, R_SCRIPT);
  const lastR = new Map<RMethod, { observations: number; seconds: number }>();
  const rows: string[][] = [];
  console.error(
    `node ${process.version}; ${withR ? 'R references on' : 'no R references'}; repeats ${repeats}`,
  );
  try {
    for (const set of sets) {
      // Work measure for extrapolating R times: answers x items (item-parameter count drives both
      // the CML symmetric functions and glmer's dense fixed-effects design).
      const observations = set.persons * (set.booklets?.itemsPerBooklet ?? set.items) * set.items;
      console.error(`${set.name}: data baseline, CML, MML ...`);
      const base = runOurs(set.name, 'data', 0);
      const cml = runOurs(set.name, 'cml', repeats);
      const mml = runOurs(set.name, 'mml', repeats);
      const reference = new Map<RMethod, FitResult>();
      if (withR) {
        const csv = join(workDir, `${set.name}.csv`);
        writeCsv(simulate(set), csv);
        for (const method of R_METHODS) {
          const previous = lastR.get(method);
          const estimate = previous ? previous.seconds * (observations / previous.observations) ** 1.2 : 0;
          if (estimate > R_LIMIT_SECONDS) {
            reference.set(method, {
              seconds: null,
              peakMb: null,
              itemIds: [],
              difficulty: [],
              note: `skipped (~${Math.round(estimate)} s)`,
            });
            continue;
          }
          console.error(`${set.name}: R ${method} ...`);
          const result = runR(method, csv, rScript, workDir);
          reference.set(method, result);
          if (result.seconds != null) lastR.set(method, { observations, seconds: result.seconds });
        }
        rmSync(csv);
      }
      const erm = reference.get('erm');
      const psychotools = reference.get('psychotools');
      const glmer = reference.get('glmer0');
      rows.push([
        set.name,
        seconds(cml),
        seconds(mml),
        seconds(erm),
        seconds(psychotools),
        seconds(glmer),
        ratio(erm, cml),
        ratio(psychotools, cml),
        ratio(glmer, mml),
        mb(base),
        mb(cml),
        mb(mml),
        `${mb(erm)}/${mb(psychotools)}/${mb(glmer)}`,
        small(psychotools ? maxDifference(cml, psychotools, true) : null),
        small(glmer ? maxDifference(mml, glmer, false) : null),
        `${cml.note ?? ''}; ${mml.note ?? ''}`,
      ]);
    }
  } finally {
    rmSync(workDir, { recursive: true, force: true });
  }
  const header = [
    'set',
    'CML s',
    'MML s',
    'eRm s',
    'psychotools s',
    'glmer0 s',
    'eRm/CML',
    'psy/CML',
    'glmer0/MML',
    'data MB',
    'CML MB',
    'MML MB',
    'R MB eRm/psy/glmer',
    '|Δb| CML-psy',
    '|Δb| MML-glmer0',
    'iterations',
  ];
  const table = [header, ...rows];
  const widths = header.map((_, c) => Math.max(...table.map((row) => row[c]!.length)));
  for (const row of table) console.log(row.map((cell, c) => cell.padEnd(widths[c]!)).join('  '));
  console.log(
    '\nTimes: our fits median of repeated runs after a warm-up, in a child process each; R fits timed',
    'once inside R around the fit call. MB: peak resident memory of that process (data MB = the',
    'simulated matrix alone in node). |Δb| CML-psy after centring; MML-glmer0 raw (both person mean 0;',
    'nAGQ = 0 is a Laplace-type approximation, so this is not an accuracy check of MML).',
  );
}

await main();
