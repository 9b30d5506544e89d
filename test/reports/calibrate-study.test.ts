import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { courseAfter, demoCohorts } from '../../server/demo/simulated-audience.js';
import { AppError } from '../../server/errors.js';
import { buildReport } from '../../server/reports/build-report.js';
import { calibrateStudy, workerThreshold } from '../../server/reports/calibrate-study.js';
import type { ReportItemInfo } from '../../server/reports/compose-report.js';
import { listScoredResponses } from '../../server/storage/calibration-repository.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { insertResponse } from '../../server/storage/response-repository.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';
import { insertSimulatedStudy, normalDraws } from './simulated-study.js';

const chartTypes = ['bar', 'line', 'scatter', 'network'] as const;
const levels = ['read', 'interpret', 'envision'] as const;
/** 36 invented items: 3 per chart type × level cell, difficulties spread over −2..2.4 logits. */
const items = chartTypes.flatMap((type, t) =>
  levels.flatMap((level, l) =>
    [0, 1, 2].map((k) => ({
      id: `sim-${type}-${level}-${k}`,
      difficulty: -2 + 0.4 * t + 1.1 * l + 0.3 * (k - 1),
      chartType: type,
      level,
    })),
  ),
);
const itemInfo = (id: string): ReportItemInfo | undefined => {
  const item = items.find((i) => i.id === id);
  return item ? { chartType: item.chartType, level: item.level } : undefined;
};

describe('calibrateStudy and buildReport on a simulated audience (service layer)', () => {
  const sqlite = testEngines()[0]!;
  let database: TestDatabase;
  let studyId: string;
  let cohortIds: string[];
  const generating = [demoCohorts.weekday, demoCohorts.weekend, demoCohorts.before, courseAfter];

  beforeAll(async () => {
    database = await sqlite.open();
    await migrateToLatest(database.db);
    ({ studyId, cohortIds } = await insertSimulatedStudy(database.db, {
      items,
      seed: 11,
      itemsPerPerson: 18,
      cohorts: generating.map((c, g) => ({
        label: c.label,
        abilities: normalDraws(100 + g, c.size, c.mean, c.sd),
      })),
    }));
  }, 120_000);
  afterAll(async () => database.cleanup());

  // Eight intervals are checked at once, so each is taken at the Bonferroni level 1 − 0.05/8 (common
  // practice, no source): a correct implementation then misses none with probability about 0.95.
  it('recovers each cohort generating mean and SD within its simultaneous bootstrap interval (seed 1, 200 replicates)', async () => {
    const calibration = await calibrateStudy(database.db, studyId);
    expect(calibration.record.converged).toBe(true);
    expect(calibration.settings.bootstrap.draws).toHaveLength(200);
    for (const [g, cohortId] of cohortIds.entries()) {
      const report = await buildReport(database.db, itemInfo, studyId, {
        cohortId,
        calibrate: 'never',
        confidenceLevel: 1 - 0.05 / 8,
      });
      const { ability } = report.audiences[0]!;
      // Invented generating values (server/demo/simulated-audience.ts); the first cohort's mean is 0,
      // matching the calibration's identification, so the scales agree.
      const truth = generating[g]!;
      expect(ability.meanInterval!.lower).toBeLessThanOrEqual(truth.mean);
      expect(ability.meanInterval!.upper).toBeGreaterThanOrEqual(truth.mean);
      expect(ability.sdInterval!.lower).toBeLessThanOrEqual(truth.sd);
      expect(ability.sdInterval!.upper).toBeGreaterThanOrEqual(truth.sd);
      // The intervals are informative, not vacuous: narrower than a logit.
      expect(ability.meanInterval!.upper - ability.meanInterval!.lower).toBeLessThan(1);
    }
  }, 120_000);

  it('reports the item table with fit flags outside 0.7–1.3 and the share of "I don\'t know"', async () => {
    const report = await buildReport(database.db, itemInfo, studyId, { calibrate: 'never' });
    expect(report.items).toHaveLength(items.length);
    for (const item of report.items) {
      expect(item.infitFlag).toBe(item.infit! < 0.7 ? 'low' : item.infit! > 1.3 ? 'high' : null);
      expect(item.dontKnowShare).toBeGreaterThan(0);
      expect(item.dontKnowShare).toBeLessThan(0.5);
    }
    // The generating difficulties are recovered up to the identification shift (first cohort mean 0,
    // generating mean also 0): correlation above 0.95.
    const pairs = report.items.map(
      (i) => [i.difficulty, items.find((x) => x.id === i.itemId)!.difficulty] as const,
    );
    const mean = (k: 0 | 1) => pairs.reduce((s, p) => s + p[k], 0) / pairs.length;
    const [mx, my] = [mean(0), mean(1)];
    const cov = pairs.reduce((s, p) => s + (p[0] - mx) * (p[1] - my), 0);
    const vx = pairs.reduce((s, p) => s + (p[0] - mx) ** 2, 0);
    const vy = pairs.reduce((s, p) => s + (p[1] - my) ** 2, 0);
    expect(cov / Math.sqrt(vx * vy)).toBeGreaterThan(0.95);
    expect(report.foot.caution).toContain('not for high-stakes decisions');
    expect(report.audiences[0]!.ladder.sentences.length).toBeGreaterThan(0);
  }, 60_000);

  it('compares the course cohorts: the difference, its bootstrap SE and d', async () => {
    const report = await buildReport(database.db, itemInfo, studyId, {
      compare: [cohortIds[2]!, cohortIds[3]!],
      calibrate: 'never',
    });
    const cmp = report.comparison!;
    // Generating gain 0.7 logits (invented); inside the 95% interval.
    expect(cmp.meanDifferenceInterval!.lower).toBeLessThanOrEqual(0.7);
    expect(cmp.meanDifferenceInterval!.upper).toBeGreaterThanOrEqual(0.7);
    expect(cmp.standardError).toBeGreaterThan(0);
    const [from, to] = report.audiences;
    // d = (μ_to − μ_from)/√((σ_from² + σ_to²)/2), recomputed from the rounded report values.
    const d =
      (to!.ability.mean - from!.ability.mean) / Math.sqrt((from!.ability.sd ** 2 + to!.ability.sd ** 2) / 2);
    expect(cmp.effectSize).toBeCloseTo(d, 2);
    expect(cmp.cells).toHaveLength(12);
  }, 60_000);

  it('fits the same in a worker thread as in the server thread (large studies go to a worker)', async () => {
    // The simulated study has 520 × 18 = 9,360 answers: above the threshold, so the default path is
    // the worker; both paths must store the same numbers.
    const responses = await listScoredResponses(database.db, studyId);
    expect(responses.length).toBeGreaterThanOrEqual(workerThreshold);
    const options = { replicates: 20, seed: 3 };
    const here = await calibrateStudy(database.db, studyId, { ...options, inWorker: false });
    const there = await calibrateStudy(database.db, studyId, { ...options, inWorker: true });
    expect(there.items).toEqual(here.items);
    expect(there.settings).toEqual(here.settings);
    expect(there.record.logLikelihood).toBe(here.record.logLikelihood);
    expect(there.settings.bootstrap.draws).toHaveLength(20);
  });

  it('refuses a non-converged calibration with a clear message', async () => {
    const forced = await calibrateStudy(database.db, studyId, { maxIterations: 1, replicates: 0 });
    expect(forced.record.converged).toBe(false);
    const attempt = buildReport(database.db, itemInfo, studyId, { calibrate: 'never' });
    await expect(attempt).rejects.toMatchObject({ code: 'CALIBRATION_NOT_CONVERGED' });
    await expect(attempt).rejects.toThrow(/did not converge after 1 iterations/);
  }, 60_000);

  it('says how many more respondents are needed when too few finished', async () => {
    const small = await insertSimulatedStudy(database.db, {
      items,
      seed: 5,
      cohorts: [{ label: 'Few', abilities: normalDraws(7, 12, 0, 1) }],
    });
    const error = await calibrateStudy(database.db, small.studyId).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).code).toBe('TOO_FEW_RESPONSES');
    expect((error as AppError).message).toContain('12 respondents who finished; 18 more are needed');
  });

  it('lists items with fewer than 10 answers as not yet calibrated, with how many more they need', async () => {
    const study = await insertSimulatedStudy(database.db, {
      items: items.slice(0, 12),
      seed: 9,
      cohorts: [{ label: 'All', abilities: normalDraws(8, 40, 0, 1) }],
    });
    // Seven of the respondents also answered one more item.
    const attempts = [
      ...new Set((await listScoredResponses(database.db, study.studyId)).map((r) => r.attemptId)),
    ];
    for (const [k, attemptId] of attempts.slice(0, 7).entries()) {
      await insertResponse(database.db, {
        id: `rare-${k}-${attemptId}`,
        attemptId,
        itemId: 'sim-rare',
        itemVersion: 1,
        position: 12,
        answerKind: 'answer',
        answer: { kind: 'choice', optionIds: ['a'] },
        score: k % 2,
        serverMs: null,
        clientMs: null,
        receivedAt: '2031-06-01T00:00:00.000Z',
      });
    }
    const calibration = await calibrateStudy(database.db, study.studyId, { replicates: 0 });
    expect(calibration.items.map((i) => i.itemId)).not.toContain('sim-rare');
    expect(calibration.items).toHaveLength(12);
    expect(calibration.settings.uncalibrated).toEqual([
      { itemId: 'sim-rare', answers: 7, reason: 'too-few-answers', moreNeeded: 3 },
    ]);
  });
});
