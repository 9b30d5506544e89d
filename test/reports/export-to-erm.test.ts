/**
 * The long CSV export of a simulated study, read by eRm, gives the engine's item estimates: what a
 * researcher gets from exporting and fitting elsewhere agrees with what plotgauge reports.
 *
 * test/reference/export-erm-study.csv is written by the real export code (exportStudyResponses) from a
 * deterministic simulated study (fixed ids, fixed clock, seeded answers; invented data);
 * test/reference/export-erm-study.json is eRm's RM on that file (scripts/reference/export-to-erm.R).
 * To rewrite the CSV after a deliberate change of the export format: WRITE_EXPORT_FIXTURE=1 npx vitest
 * run test/reports/export-to-erm.test.ts, then Rscript scripts/reference/export-to-erm.R.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exportStudyResponses } from '../../server/delivery/export-service.js';
import { buildResponseMatrix } from '../../server/scoring/build-response-matrix.js';
import { calibrateCml } from '../../server/scoring/rasch/calibrate-cml.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';
import { insertAttempt, updateAttempt } from '../../server/storage/attempt-repository.js';
import { insertCohort } from '../../server/storage/cohort-repository.js';
import type { DbHandle } from '../../server/storage/db-handle.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { insertResponse } from '../../server/storage/response-repository.js';
import { insertStudy } from '../../server/storage/study-repository.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const csvUrl = new URL('../reference/export-erm-study.csv', import.meta.url);
const jsonUrl = new URL('../reference/export-erm-study.json', import.meta.url);

/** 8 invented items, difficulties −1.75..1.75 logits. */
const items = Array.from({ length: 8 }, (_, i) => ({
  id: `isle-item-${String(i + 1).padStart(2, '0')}`,
  difficulty: -1.75 + 0.5 * i,
}));

/**
 * A study with two cohorts of 50 simulated respondents; each answers 6 of the 8 items (a ring slice
 * starting at a rotating offset, so every pair of items is linked), a quarter of the wrong answers as
 * "I don't know". Every id and time is fixed, so the export is the same byte for byte on every run.
 */
async function insertDeterministicStudy(db: DbHandle): Promise<string> {
  const random = seededRandom(4242);
  let clock = Date.parse('2031-03-01T09:00:00.000Z');
  const tick = () => {
    clock += 1000;
    return new Date(clock).toISOString();
  };
  const studyId = 'study-export-erm';
  await insertStudy(db, {
    id: studyId,
    title: 'Export check (simulated)',
    settings: { title: 'Export check (simulated)' },
    status: 'open',
    at: tick(),
  });
  let person = 0;
  for (const [c, cohort] of [
    { label: 'Harbour school', mean: -0.3 },
    { label: 'Island library', mean: 0.5 },
  ].entries()) {
    const cohortId = `cohort-export-${c + 1}`;
    await insertCohort(db, {
      id: cohortId,
      studyId,
      label: cohort.label,
      joinCode: `EXPRT${c + 1}`,
      createdAt: tick(),
    });
    for (let k = 0; k < 50; k++, person++) {
      const ability = cohort.mean + random.normal();
      const attemptId = `attempt-${String(person).padStart(4, '0')}`;
      await insertAttempt(db, {
        id: attemptId,
        cohortId,
        tokenHash: `token-${attemptId}`,
        form: {},
        at: tick(),
      });
      const start = (person * 3) % items.length;
      for (let position = 0; position < 6; position++) {
        const item = items[(start + position) % items.length]!;
        const right = random.uniform() < 1 / (1 + Math.exp(-(ability - item.difficulty)));
        const dontKnow = !right && random.uniform() < 0.25;
        await insertResponse(db, {
          id: `${attemptId}-r${position}`,
          attemptId,
          itemId: item.id,
          itemVersion: 1,
          position,
          answerKind: dontKnow ? 'dont-know' : 'answer',
          answer: dontKnow ? null : { kind: 'choice', optionIds: [right ? 'a' : 'b'] },
          score: right ? 1 : 0,
          serverMs: 5000 + position,
          clientMs: 4800 + position,
          receivedAt: tick(),
        });
      }
      const at = tick();
      await updateAttempt(db, attemptId, { consentedAt: at, status: 'finished', finishedAt: at });
    }
  }
  return studyId;
}

interface ErmExportFixture {
  readonly source: string;
  readonly persons: number;
  readonly responses: number;
  readonly itemIds: string[];
  readonly difficulty: number[];
  readonly standardError: number[];
}

describe('long export → eRm agrees with the engine', () => {
  const sqlite = testEngines()[0]!;
  let database: TestDatabase;
  let exported = '';

  beforeAll(async () => {
    database = await sqlite.open();
    await migrateToLatest(database.db);
    const studyId = await insertDeterministicStudy(database.db);
    exported = await exportStudyResponses(database.db, studyId, { format: 'long' });
    if (process.env.WRITE_EXPORT_FIXTURE === '1') writeFileSync(csvUrl, exported);
  });
  afterAll(async () => {
    await database?.cleanup();
  });

  it('regenerates the committed CSV byte for byte through the export code', () => {
    expect(exported.length).toBeGreaterThan(0);
    expect(exported).toBe(readFileSync(csvUrl, 'utf8'));
    // 100 respondents × 6 answers, plus the header
    expect(exported.trimEnd().split('\r\n')).toHaveLength(1 + 100 * 6);
  });

  it("the engine's CML difficulties on the committed CSV are within 5e-4 of eRm RM", () => {
    const fixture = JSON.parse(readFileSync(jsonUrl, 'utf8')) as ErmExportFixture;
    const records = parse(readFileSync(csvUrl, 'utf8'), { columns: true }) as Record<string, string>[];
    const matrix = buildResponseMatrix(
      records.map((r) => ({
        person: r.attempt_id!,
        item: r.item_id!,
        score: r.score === '' ? null : Number(r.score),
      })),
    );
    expect(matrix.personIds).toHaveLength(fixture.persons);
    const cal = calibrateCml(matrix);
    expect(cal.converged).toBe(true);
    // eRm 1.0-2 RM (scripts/reference/export-to-erm.R): difficulty = −betapar, centred; the engine's
    // CML difficulties are centred too. Compared by item id.
    const engine = new Map(cal.itemIds.map((id, i) => [id, cal.difficulty[i]!]));
    const engineSe = new Map(cal.itemIds.map((id, i) => [id, cal.standardError[i]!]));
    expect([...engine.keys()].sort()).toEqual(fixture.itemIds);
    let worst = 0;
    let worstSe = 0;
    fixture.itemIds.forEach((id, i) => {
      worst = Math.max(worst, Math.abs(engine.get(id)! - fixture.difficulty[i]!));
      worstSe = Math.max(worstSe, Math.abs(engineSe.get(id)! - fixture.standardError[i]!));
    });
    expect(worst).toBeLessThan(5e-4);
    expect(worstSe).toBeLessThan(1e-3);
    // The generating difficulties are recovered in order at the ends (a sanity check on the data).
    expect(engine.get('isle-item-01')!).toBeLessThan(engine.get('isle-item-08')!);
  });
});
