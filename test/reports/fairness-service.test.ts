/**
 * The Fairness section on the service layer: a study written through the repositories with the
 * demo's INVENTED background question and its injected DIF (server/demo/simulated-background.ts),
 * answers from the Rasch model with a fixed seed, and one fixed form of 20 items.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  difficultiesFor,
  injectedDifItems,
  simulateWorksWithData,
  worksWithDataQuestion,
} from '../../server/demo/simulated-background.js';
import { AppError } from '../../server/errors.js';
import { renderReportPage } from '../../server/pages/report-page.js';
import { buildReport } from '../../server/reports/build-report.js';
import type { ReportItemInfo } from '../../server/reports/compose-report.js';
import { parseFairnessQuery } from '../../server/reports/fairness-service.js';
import { reportToCsv } from '../../server/reports/report-rows.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';
import { insertAttempt, updateAttempt } from '../../server/storage/attempt-repository.js';
import { insertCohort } from '../../server/storage/cohort-repository.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { insertResponse } from '../../server/storage/response-repository.js';
import { insertStudy } from '../../server/storage/study-repository.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const items = Array.from({ length: 20 }, (_, i) => ({
  id: `fair-bar-read-${i}`,
  difficulty: -1.9 + 0.2 * i,
}));
const itemInfo = (id: string): ReportItemInfo | undefined =>
  items.some((i) => i.id === id) ? { chartType: 'bar', level: 'read' } : undefined;
const difItems = injectedDifItems(items.map((i) => i.id));

describe('buildReport with a Fairness section (service layer)', () => {
  const sqlite = testEngines()[0]!;
  let database: TestDatabase;
  let studyId: string;
  const cohortIds: string[] = [];

  beforeAll(async () => {
    database = await sqlite.open();
    const db = database.db;
    await migrateToLatest(db);
    const random = seededRandom(2031);
    studyId = `study-${randomUUID().slice(0, 8)}`;
    const at = '2031-05-04T10:00:00.000Z';
    const settings = { title: 'Fairness test', background: [worksWithDataQuestion] };
    await insertStudy(db, { id: studyId, title: settings.title, settings, status: 'open', at });
    const common = new Map(items.map((i) => [i.id, i.difficulty]));
    let person = 0;
    for (const label of ['Weekday', 'Weekend']) {
      const cohortId = `cohort-${randomUUID().slice(0, 8)}`;
      cohortIds.push(cohortId);
      await insertCohort(db, {
        id: cohortId,
        studyId,
        label,
        joinCode: randomUUID().slice(0, 8),
        createdAt: at,
      });
      for (let k = 0; k < 300; k++) {
        const attemptId = `${studyId}-a${String(person++).padStart(5, '0')}`;
        const ability = random.normal();
        const answer = simulateWorksWithData(random);
        const b = difficultiesFor(answer, common, difItems);
        await insertAttempt(db, { id: attemptId, cohortId, tokenHash: randomUUID(), form: {}, at });
        for (const [position, item] of items.entries()) {
          const right = random.uniform() < 1 / (1 + Math.exp(-(ability - b.get(item.id)!)));
          await insertResponse(db, {
            id: randomUUID(),
            attemptId,
            itemId: item.id,
            itemVersion: 1,
            position,
            answerKind: 'answer',
            answer: { kind: 'choice', optionIds: [right ? 'a' : 'b'] },
            score: right ? 1 : 0,
            serverMs: 1000,
            clientMs: 1000,
            receivedAt: at,
          });
        }
        await updateAttempt(db, attemptId, {
          background: { [worksWithDataQuestion.id]: answer },
          consentedAt: at,
          status: 'finished',
          finishedAt: at,
        });
      }
    }
  }, 120_000);
  afterAll(async () => database?.cleanup());

  it('flags exactly the two items given DIF, explains them, and compares again without them', async () => {
    const report = await buildReport(database.db, itemInfo, studyId, {
      fairness: parseFairnessQuery('works-with-data:yes,no'),
      calibration: { replicates: 0 },
    });
    const fairness = report.fairness!;
    // generating model: "no" answers find difItems 1.5 logits harder (injected, invented)
    expect(fairness.flaggedItemIds).toEqual(difItems);
    for (const id of difItems) {
      const item = fairness.items.find((i) => i.itemId === id)!;
      expect(item.etsClass).toMatch(/^[BC]-$/);
      expect(item.explanation).toContain('found it harder');
      expect(item.raschContrast!).toBeGreaterThan(0.8);
    }
    const { allItems, flaggedExcluded } = fairness.comparison;
    expect(allItems.itemCount).toBe(20);
    expect(flaggedExcluded!.itemCount).toBe(18);
    // both groups are N(0,1) in the generating model, so the gap itself is sampling noise; but the
    // same people lose the flagged items, and those made "no" look weaker: about 2 × 1.5 / 20 ≈ 0.15
    // logits comes back when they are left out (expected from the generating model, not a reference)
    const change = flaggedExcluded!.difference - allItems.difference;
    expect(change).toBeGreaterThan(0.05);
    expect(change).toBeLessThan(0.3);
    expect(fairness.referencePersons + fairness.focalPersons).toBeLessThan(600);
    expect(fairness.smallStrata).toContain('skipped');

    const csv = reportToCsv(report);
    expect(csv).toContain(`fairness,,${difItems[0]},ets_class,C-`);
    expect(csv).toContain(`fairness,,flagged-excluded,difference,${flaggedExcluded!.difference}`);
    const page = renderReportPage(report, {
      studyUrl: '/',
      cohorts: [],
      comparisons: [],
      jsonUrl: '/j',
      csvUrl: '/c',
    });
    expect(page).toContain(`data-key="fairness||flagged-excluded|difference">`);
    expect(page).toContain(fairness.items.find((i) => i.flagged)!.explanation!.slice(0, 40));
  });

  it('forms groups from two cohorts too', async () => {
    const report = await buildReport(database.db, itemInfo, studyId, {
      fairness: { kind: 'cohorts', reference: cohortIds[0]!, focal: cohortIds[1]! },
      calibration: { replicates: 0 },
    });
    expect(report.fairness!.referencePersons).toBe(300);
    expect(report.fairness!.focalPersons).toBe(300);
    expect(report.fairness!.referenceLabel).toBe('Weekday');
  });

  it('refuses an unknown question or answer, an empty group and a malformed query', async () => {
    const attempt = (fairness: string) =>
      buildReport(database.db, itemInfo, studyId, {
        fairness: parseFairnessQuery(fairness),
        calibration: { replicates: 0 },
      });
    await expect(attempt('age-band:young,old')).rejects.toThrow('has no background question "age-band"');
    await expect(attempt('works-with-data:yes,maybe')).rejects.toThrow('has no answer "maybe"');
    const same = await attempt('works-with-data:yes,yes').catch((e: unknown) => e);
    expect((same as AppError).code).toBe('VALIDATION_FAILED');
    await insertCohort(database.db, {
      id: 'cohort-empty',
      studyId,
      label: 'Evening',
      joinCode: 'EMPTY001',
      createdAt: '2031-05-04T10:00:00.000Z',
    });
    const empty = await attempt(`cohorts:${cohortIds[0]},cohort-empty`).catch((e: unknown) => e);
    expect((empty as AppError).code).toBe('TOO_FEW_RESPONSES');
    expect((empty as AppError).message).toContain('needs people in both groups');
    expect(() => parseFairnessQuery('yes,no')).toThrow(AppError);
  });
});
