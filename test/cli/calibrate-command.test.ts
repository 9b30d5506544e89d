import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Command } from 'commander';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import {
  CalibrateInputError,
  registerCalibrateCommand,
  runCalibrate,
} from '../../server/cli/calibrate-command.js';
import { CliError } from '../../server/cli/cli-error.js';
import { buildResponseMatrixFromWide } from '../../server/scoring/build-response-matrix.js';
import { calibrateCml } from '../../server/scoring/rasch/calibrate-cml.js';

let folder = '';
const items = ['bar-1', 'line-2', 'scatter-3', 'map-4', 'pie-5', 'area-6'];

/** Invented demo answers: 80 persons, 6 items, from a fixed linear congruential generator. */
function demoRows(): (0 | 1 | null)[][] {
  let seed = 12345;
  const random = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  const difficulty = [-1.5, -0.8, 0, 0.4, 1, 1.6];
  return Array.from({ length: 80 }, (_, p) => {
    const ability = ((p % 9) - 4) / 2;
    return difficulty.map((b, i) => {
      if (p % 5 === 0 && i === 5) return null; // not shown
      return random() < 1 / (1 + Math.exp(b - ability)) ? 1 : 0;
    });
  });
}

/** What a spreadsheet "save as CSV" produces: BOM, quoted header, CRLF, trailing empty rows. */
function spreadsheetWide(rows: (0 | 1 | null)[][]): string {
  const header = ['"respondent"', ...items.map((i) => `"${i}"`)].join(',');
  const body = rows.map((r, p) => [`"r${p + 1}"`, ...r.map((x) => (x === null ? '' : String(x)))].join(','));
  return `\uFEFF${[header, ...body].join('\r\n')}\r\n,,,,,,\r\n\r\n`;
}

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  return { out, err, io: { stdout: (t: string) => out.push(t), stderr: (t: string) => err.push(t) } };
}

beforeAll(async () => {
  folder = await mkdtemp(path.join(tmpdir(), 'calibrate-cli-'));
});

afterEach(() => {
  vi.restoreAllMocks();
});

describe('calibrate command', () => {
  it('reads a spreadsheet-exported wide CSV and writes item and person files', async () => {
    const rows = demoRows();
    const file = path.join(folder, 'wide.csv');
    await writeFile(file, spreadsheetWide(rows));
    const out = path.join(folder, 'out-wide');
    const { out: stdout, io } = capture();
    await runCalibrate(file, { out }, io);
    const expected = calibrateCml(
      buildResponseMatrixFromWide(
        rows.map((_, p) => `r${p + 1}`),
        items,
        rows,
      ),
    );
    const json = JSON.parse(await readFile(path.join(out, 'items.json'), 'utf8'));
    expect(json.method).toBe('cml');
    expect(json.items.map((r: { item: string }) => r.item)).toEqual(items);
    json.items.forEach((r: { difficulty: number }, i: number) => {
      expect(r.difficulty).toBeCloseTo(expected.difficulty[i]!, 4);
    });
    expect(stdout.join('')).toMatch(/^CML calibration of 6 items from 80 persons \(converged/);
    expect(stdout.join('')).toContain('scatter-3');
    const itemsCsv = await readFile(path.join(out, 'items.csv'), 'utf8');
    expect(itemsCsv.split('\n')[0]).toBe(
      'item,difficulty,standardError,infit,outfit,infitZ,outfitZ,pointMeasure,answered,status',
    );
    const persons = JSON.parse(await readFile(path.join(out, 'persons.json'), 'utf8'));
    expect(persons.estimator).toBe('wle');
    expect(persons.persons).toHaveLength(80);
    expect(persons.persons.every((p: { ability: number }) => Number.isFinite(p.ability))).toBe(true);
    expect((await readFile(path.join(out, 'persons.csv'), 'utf8')).split('\n')[0]).toBe(
      'person,answered,rawScore,ability,standardError',
    );
  });

  it('reads the same answers in long format with the same result', async () => {
    const rows = demoRows();
    const lines = ['"Person","Item","Score"'];
    rows.forEach((r, p) => {
      r.forEach((x, i) => {
        if (x !== null) lines.push(`r${p + 1},${items[i]},${x}`);
      });
    });
    const file = path.join(folder, 'long.csv');
    await writeFile(file, `\uFEFF${lines.join('\r\n')}\r\n\r\n`);
    const out = path.join(folder, 'out-long');
    await runCalibrate(file, { out }, capture().io);
    const wide = JSON.parse(await readFile(path.join(folder, 'out-wide', 'items.json'), 'utf8'));
    const long = JSON.parse(await readFile(path.join(out, 'items.json'), 'utf8'));
    expect(long.items.map((r: { difficulty: number }) => r.difficulty)).toEqual(
      wide.items.map((r: { difficulty: number }) => r.difficulty),
    );
  });

  it.each([
    ['empty.csv', '', 'empty.csv: empty file (expected a header line)'],
    ['header-only.csv', 'person,item,score\r\n', 'header-only.csv: no responses after the header'],
    [
      'bad-score.csv',
      'person,item,score\r\np1,q1,1\r\np1,q2,2\r\n',
      'bad-score.csv line 3: score "2" for person p1, item q2 is not 0 or 1',
    ],
    [
      'duplicate.csv',
      'person,item,score\r\np1,q1,1\r\np2,q1,0\r\n\r\np1,q1,0\r\n',
      'duplicate.csv line 5: person p1, item q1 already answered in line 2',
    ],
    [
      'columns.csv',
      'person,item,score,extra\r\np1,q1,1,x\r\n',
      'columns.csv line 1: long format needs exactly the columns person,item,score',
    ],
    ['short-row.csv', 'id,q1,q2\r\np1,1,0\r\np2,1\r\n', 'short-row.csv line 3: 2 columns, expected 3'],
    [
      'one-column.csv',
      'person\r\np1\r\n',
      'one-column.csv line 1: expected person,item,score or a person column followed by item columns',
    ],
  ])('rejects %s with one line naming the line, exit code 2', async (name, text, message) => {
    const file = path.join(folder, name);
    await writeFile(file, text);
    const error = await runCalibrate(file, {}, capture().io).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(CalibrateInputError);
    expect(error).toBeInstanceOf(CliError);
    expect((error as CalibrateInputError).exitCode).toBe(2);
    expect((error as Error).message).toBe(path.join(folder, message));
    expect((error as Error).message).not.toContain('\n');
  });

  it('keeps anchored items at their values', async () => {
    const anchors = path.join(folder, 'anchors.csv');
    await writeFile(anchors, 'item,difficulty\r\nbar-1,-1.2\r\npie-5,0.9\r\n');
    const out = path.join(folder, 'out-anchor');
    await runCalibrate(path.join(folder, 'wide.csv'), { anchor: anchors, out }, capture().io);
    const json = JSON.parse(await readFile(path.join(out, 'items.json'), 'utf8'));
    expect(json.items[0]).toMatchObject({
      item: 'bar-1',
      difficulty: -1.2,
      standardError: 0,
      status: 'anchored',
    });
    expect(json.items[4]).toMatchObject({ item: 'pie-5', difficulty: 0.9, status: 'anchored' });
  });

  it('prints progress on stderr only once the fit has run for more than a second', async () => {
    let clock = 0;
    const slow = capture();
    await runCalibrate(path.join(folder, 'wide.csv'), {}, { ...slow.io, now: () => (clock += 400) });
    expect(slow.err.join('')).toMatch(/calibrate: iteration \d+ of at most 100/);
    expect(slow.out.join('')).not.toContain('calibrate:');
    const fast = capture();
    await runCalibrate(path.join(folder, 'wide.csv'), {}, { ...fast.io, now: () => 0 });
    expect(fast.err).toEqual([]);
  });

  it('registers on a commander program and runs mml too', async () => {
    const program = new Command('plotgauge').exitOverride();
    registerCalibrateCommand(program);
    const written: string[] = [];
    vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => {
      written.push(String(chunk));
      return true;
    });
    await program.parseAsync(['calibrate', path.join(folder, 'wide.csv'), '--method', 'mml'], {
      from: 'user',
    });
    expect(written.join('')).toMatch(/^MML calibration of 6 items/);
  });
});
