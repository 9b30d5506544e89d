/**
 * `plotgauge predict` on a stored study of real bank items (bar, line, scatter, table) whose answers
 * come from the demo's INVENTED generating formula: the text table, --json, and one-line refusals.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import { generatingDifficulty } from '../../server/demo/generating-difficulty.js';
import type { DesignCheck } from '../../server/reports/design-check.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { runCliCapturedText } from '../helpers/run-cli.js';
import { insertSimulatedStudy, normalDraws } from '../reports/simulated-study.js';

const run = runCliCapturedText;

describe('plotgauge predict', () => {
  let folder: string;
  let url: string;
  let studyId: string;
  let cohortIds: string[];
  const planned = ['--chart-type', 'scatter', '--level', 'interpret', '--marks', '40', '--legend', 'yes'];
  const predict = (...extra: string[]) =>
    run(['predict', '--study', studyId, '--database', url, ...planned, ...extra]);

  beforeAll(async () => {
    folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-predict-cli-'));
    url = `sqlite:${path.join(folder, 'p.db')}`;
    const bank = await loadBank('items');
    const types = new Set(['bar', 'line', 'scatter', 'table']);
    const items = bank.items
      .filter((i) => i.status === 'active' && i.response.kind !== 'short-text' && types.has(i.chart.type))
      .map((i) => ({ id: i.id, difficulty: generatingDifficulty({ ...i.features, level: i.level }) }));
    const db = createDatabase(url);
    try {
      await migrateToLatest(db);
      ({ studyId, cohortIds } = await insertSimulatedStudy(db, {
        items,
        seed: 43,
        itemsPerPerson: 14,
        cohorts: [
          { label: 'Harbour school', abilities: normalDraws(31, 150, 0, 1) },
          { label: 'Island library', abilities: normalDraws(32, 150, 0.5, 1) },
        ],
      }));
    } finally {
      await db.destroy();
    }
  }, 120_000);
  afterAll(() => {
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('says to calibrate first when the study has no calibration', async () => {
    const { code, errors } = await predict();
    expect(code).toBe(2);
    expect(errors.join('\n')).toContain(
      `has no calibration yet, and a design check needs one: run plotgauge calibrate --study ${studyId}`,
    );
    const calibrated = await run(['calibrate', '--study', studyId, '--database', url, '--replicates', '40']);
    expect(calibrated.errors).toEqual([]);
    expect(calibrated.code).toBe(0);
  }, 120_000);

  it('prints the weights, the LR test, the prediction with its interval, the shares and the caveat', async () => {
    const { code, out, errors } = await predict();
    expect(errors).toEqual([]);
    expect(code).toBe(0);
    expect(out).toMatch(/^Design check \(MODEL-BASED PREDICTION, not a measurement\), calibration cal-/);
    expect(out).toContain('Planned chart: scatter, interpret; marks 40, legend yes');
    expect(out).toMatch(/^ {2}chart type: scatter \(vs table\) +[+-]\d\.\d{3} +\d\.\d{3}$/m);
    expect(out).toMatch(/^ {2}legend +[+-]\d\.\d{3} +\d\.\d{3}$/m);
    expect(out).toMatch(/^Likelihood-ratio test against the Rasch model: LR = \d+\.\d on \d+ df, p [<=] /m);
    expect(out).toMatch(
      /^Predicted difficulty: [+-]\d\.\d{3} logits .*95% prediction interval [+-]\d\.\d{3} to [+-]\d\.\d{3}\.$/m,
    );
    expect(out).toMatch(/^ {2}Harbour school +\d+% +\(\d+% to \d+%\)$/m);
    expect(out).toMatch(/^ {2}Island library +\d+% +\(\d+% to \d+%\)$/m);
    expect(out).toContain('A model-based prediction, not a measured difficulty');
  }, 60_000);

  it('prints JSON with --json, for one cohort with --cohort', async () => {
    const { code, out } = await predict('--json', '--cohort', cohortIds[0]!);
    expect(code).toBe(0);
    const check = JSON.parse(out) as DesignCheck;
    expect(check.basis).toBe('model-based');
    expect(check.planned).toEqual({
      chartType: 'scatter',
      level: 'interpret',
      features: { marks: 40, legend: true },
      cohortId: cohortIds[0],
    });
    expect(check.shares.map((s) => s.label)).toEqual(['Harbour school']);
  }, 60_000);

  it('refuses bad flags in one line naming the flag, and names collinear features', async () => {
    const cases: [string[], string][] = [
      [['--legend', 'maybe'], '--legend: must be yes or no (got "maybe")'],
      [['--marks', '4.5'], '--marks: must be a whole number of at least 1 (got "4.5")'],
      [['--chart-type', 'pie3d'], '--chart-type: '],
      [['--chart-type', 'pie'], 'no calibrated item of this study is a pie chart'],
      [['--series', '2'], '"legend" is a linear combination of the constant and "series (per series drawn)"'],
      [['--cohort', 'cohort-nowhere'], 'Cohort cohort-nowhere is not a cohort of study'],
    ];
    for (const [extra, message] of cases) {
      const { code, errors } = await predict(...extra);
      expect(code, extra.join(' ')).toBe(2);
      expect(errors.join('\n')).toContain(message);
    }
    const missing = await run(['predict', '--study', studyId, '--database', url, '--chart-type', 'bar']);
    expect(missing.code).toBe(2);
    expect(missing.errors.join('\n')).toContain('plotgauge: --level: required');
  }, 60_000);
});
