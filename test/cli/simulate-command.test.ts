import { rmSync } from 'node:fs';
import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Command } from 'commander';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import { CliError } from '../../server/cli/cli-error.js';
import {
  inventedBankItems,
  registerSimulateCommand,
  runSimulateAdaptive,
} from '../../server/cli/simulate-command.js';
import { needsCalibrationMessage } from '../../server/delivery/adaptive-delivery.js';
import { calibrateStudy } from '../../server/reports/calibrate-study.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { findStudyById, updateStudy } from '../../server/storage/study-repository.js';
import { capturedOutput } from '../helpers/run-cli.js';
import { insertSimulatedStudy } from '../reports/simulated-study.js';
import { type StoredStudy, storeSimulatedStudy } from './stored-study.js';

describe('simulate adaptive', () => {
  it('prints a row per audience and design and writes the SVG', { timeout: 60000 }, async () => {
    const folder = await mkdtemp(path.join(tmpdir(), 'simulate-'));
    const svg = path.join(folder, 'out.svg');
    const { out, err, output } = capturedOutput();
    const { result } = await runSimulateAdaptive(
      { bankSize: 90, persons: 40, maxItems: 20, noExposureControl: true, seed: 3, svg },
      output,
    );
    const text = out.join('');
    expect(text).toContain('90 INVENTED items');
    for (const [a, mean] of ['-1', '0', '1'].entries()) {
      expect(text).toMatch(new RegExp(`mean ${mean} +adaptive +\\d+\\.\\d`));
      for (const label of ['fixed, spanning the bank', 'fixed, peaked at the centre', 'fixed, pool order']) {
        expect(text).toMatch(new RegExp(`mean ${mean} +${label} +\\d+ `));
      }
      const audience = result.audiences[a]!;
      const pct = (r: number | null) => `${(r! * 100).toFixed(0)}%`;
      expect(text).toContain(
        `mean ${mean}: adaptive uses ${pct(audience.itemRatio.spanning)} of the spanning form's items, ` +
          `${pct(audience.itemRatio.bestTargeted)} of the peaked form's, ${pct(audience.itemRatio.poolOrder)} of the pool-order form's`,
      );
      expect(text).toContain(
        `need ${audience.bound!.items.toFixed(1)} (spanning form ${audience.bound!.spanningLength}`,
      );
    }
    // The exposure floor: mean items over the bank size.
    expect(text).toContain(`${result.meanItems.toFixed(1)}/90 = ${(result.meanItems / 90).toFixed(3)}`);
    expect(text).toContain(`largest adaptive exposure ${result.maxExposure.toFixed(3)}`);
    expect(text).not.toContain('Sympson-Hetter exposure control');
    expect(err.join('')).toContain(`wrote ${svg}`);
    expect(await readFile(svg, 'utf8')).toMatch(/^<svg[^>]*role="img"/);
  });

  it('tunes Sympson-Hetter when the largest exposure is above the limit', { timeout: 120000 }, async () => {
    const { out, output } = capturedOutput();
    await runSimulateAdaptive({ bankSize: 90, persons: 30, maxItems: 15, randomesque: 1, seed: 2 }, output);
    expect(out.join('')).toMatch(
      /Sympson-Hetter exposure control for 0.3, tuned toward 0\.\d{3} \(\d+ rounds on fresh persons, largest exposure by round: 0\.\d{3}/,
    );
  });

  it('explains instead of tuning when the exposure floor is above the limit', {
    timeout: 60000,
  }, async () => {
    const { out, output } = capturedOutput();
    // 12 items, attempts of up to 10: everyone takes most of the bank.
    const { result } = await runSimulateAdaptive(
      { bankSize: 12, persons: 10, maxItems: 10, seed: 2 },
      output,
    );
    const text = out.join('');
    expect(result.meanItems / 12).toBeGreaterThan(0.3);
    expect(text).toContain(
      `Sympson-Hetter exposure control not tuned: attempts take ${result.meanItems.toFixed(1)} of the 12 items on average`,
    );
    expect(text).not.toContain('tuned toward');
  });

  it('reads calibrated difficulties and refuses bad options with one line', async () => {
    const folder = await mkdtemp(path.join(tmpdir(), 'simulate-'));
    const bad = path.join(folder, 'bad.csv');
    await writeFile(bad, 'item,value\na,1\n');
    const { output } = capturedOutput();
    await expect(runSimulateAdaptive({ bankSize: 20, persons: 0 }, output)).rejects.toThrow(
      '--persons must be an integer',
    );
    await expect(runSimulateAdaptive({ bankSize: 20, seTarget: 0 }, output)).rejects.toThrow('--se-target');
    await expect(runSimulateAdaptive({ bankSize: 20, balance: 'colour' as 'level' }, output)).rejects.toThrow(
      '--balance',
    );
    await expect(
      runSimulateAdaptive(
        { difficulties: bad },
        { ...output, loadBank: async () => ({ items: [] }) as never },
      ),
    ).rejects.toThrow('columns item,difficulty');
    await expect(
      runSimulateAdaptive(
        { difficulties: path.join(folder, 'missing.csv') },
        { ...output, loadBank: async () => ({ items: [] }) as never },
      ),
    ).rejects.toBeInstanceOf(CliError);
  });

  it('deals invented difficulties in an order unrelated to the ids', () => {
    const items = inventedBankItems(30, 'level');
    const difficulties = items.map((i) => i.difficulty);
    expect([...difficulties].sort((a, b) => a - b)[0]).toBe(-3);
    expect(difficulties).not.toEqual([...difficulties].sort((a, b) => a - b));
    expect(new Set(items.map((i) => i.area))).toEqual(new Set(['read', 'interpret', 'envision']));
  });

  it('registers `simulate adaptive` and rejects --bank-size with --from-bank', async () => {
    const program = new Command('plotgauge').exitOverride();
    registerSimulateCommand(program);
    await expect(
      program.parseAsync(['simulate', 'adaptive', '--bank-size', '20', '--from-bank'], { from: 'user' }),
    ).rejects.toThrow('exclude each other');
  });
});

/** `simulate adaptive --study <id>`: the stored study's calibration and adaptive settings. */
describe('simulate adaptive --study', () => {
  let stored: StoredStudy;
  let calibrationId: string;
  let difficulties: Map<string, number>;
  const bank = () => loadBank('items');

  beforeAll(async () => {
    stored = await storeSimulatedStudy();
    const db = createDatabase(stored.url);
    try {
      const calibration = await calibrateStudy(db, stored.studyId, { replicates: 5 });
      expect(calibration.record.converged).toBe(true);
      calibrationId = calibration.record.id;
      difficulties = new Map(calibration.items.map((item) => [item.itemId, item.difficulty]));
      // The study is still fixed (a team asking what adaptive delivery would do before switching);
      // its pool is the calibrated items plus one never answered.
      const study = (await findStudyById(db, stored.studyId))!;
      const uncalibrated = (await bank()).items.find(
        (item) => item.status === 'active' && !difficulties.has(item.id),
      )!;
      await updateStudy(db, stored.studyId, {
        title: study.title,
        status: study.status,
        at: new Date().toISOString(),
        settings: {
          title: study.title,
          pool: { itemIds: [...difficulties.keys(), uncalibrated.id] },
          maxItems: 8,
          adaptive: { seTarget: 0.6, minItems: 3, randomesque: 2, contentBalance: 'none' },
        },
      });
    } finally {
      await db.destroy();
    }
  }, 60000);

  afterAll(() => {
    if (stored) rmSync(stored.folder, { recursive: true, force: true });
  });

  it('runs on the latest converged calibration and the study settings', { timeout: 60000 }, async () => {
    const { out, output } = capturedOutput();
    const run = await runSimulateAdaptive(
      { study: stored.studyId, database: stored.url, persons: 40, noExposureControl: true, seed: 4 },
      { ...output, loadBank: bank },
    );
    const text = out.join('');
    expect(text).toContain(
      `study ${stored.studyId}: 10 items placed by calibration ${calibrationId} (1 pool item not eligible); the study's adaptive settings;`,
    );
    expect(text).toContain('SE target 0.6, items 3..8, randomesque k = 2, balance by none');
    // The bank is the calibration's difficulties, not the demo's generating values.
    expect(run.bank.ids).toHaveLength(10);
    run.bank.ids.forEach((id, i) => {
      expect(run.bank.difficulty[i]).toBe(difficulties.get(id));
    });
    expect(new Set(run.bank.areas)).toEqual(new Set(['all']));
    expect(run.settings).toMatchObject({ seTarget: 0.6, minItems: 3, maxItems: 8, randomesque: 2 });
    expect(run.result.exposure).toHaveLength(10);
    // Stops at 8 items at most.
    for (const a of run.result.audiences) expect(a.adaptive.items).toBeLessThanOrEqual(8);
  });

  it('lets explicit options override the study settings', { timeout: 60000 }, async () => {
    const { out, output } = capturedOutput();
    const run = await runSimulateAdaptive(
      {
        study: stored.studyId,
        database: stored.url,
        persons: 20,
        seTarget: 0.5,
        balance: 'level',
        noExposureControl: true,
      },
      { ...output, loadBank: bank },
    );
    expect(out.join('')).toContain(
      "the study's adaptive settings except seTarget, balance from the command line",
    );
    expect(run.settings.seTarget).toBe(0.5);
    expect(run.settings.maxItems).toBe(8);
    expect(new Set(run.bank.areas)).toEqual(new Set(['read', 'interpret', 'envision']));
  });

  it('refuses an unknown study, a study without a calibration, and --study with another bank', async () => {
    const { output } = capturedOutput();
    const withBank = { ...output, loadBank: bank };
    await expect(
      runSimulateAdaptive({ study: 'no-such-study', database: stored.url }, withBank),
    ).rejects.toThrow('--study: there is no study no-such-study');
    const db = createDatabase(stored.url);
    const { studyId } = await insertSimulatedStudy(db, {
      items: [{ id: [...difficulties.keys()][0]!, difficulty: 0 }],
      cohorts: [],
      seed: 1,
    }).finally(() => db.destroy());
    await expect(runSimulateAdaptive({ study: studyId, database: stored.url }, withBank)).rejects.toThrow(
      needsCalibrationMessage,
    );
    await expect(
      runSimulateAdaptive({ study: stored.studyId, database: stored.url, bankSize: 20 }, withBank),
    ).rejects.toThrow('--study excludes --bank-size and --difficulties');
    const program = new Command('plotgauge').exitOverride();
    registerSimulateCommand(program);
    await expect(
      program.parseAsync(['simulate', 'adaptive', '--study', 'x', '--from-bank'], { from: 'user' }),
    ).rejects.toThrow('exclude each other');
  });
});
