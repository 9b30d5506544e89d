import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  countAttemptsByCohort,
  findLatestCalibration,
  insertCalibration,
  listCalibrationItems,
  listScoredResponses,
  scoredResponseWatermark,
} from '../../server/storage/calibration-repository.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';
import { insertSimulatedStudy } from '../reports/simulated-study.js';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: calibration repository`, () => {
    let database: TestDatabase;
    let studyId: string;
    beforeAll(async () => {
      database = await engine.open();
      await migrateToLatest(database.db);
      ({ studyId } = await insertSimulatedStudy(database.db, {
        items: [
          { id: 'x', difficulty: 0 },
          { id: 'y', difficulty: 1 },
        ],
        seed: 1,
        cohorts: [{ label: 'A', abilities: [0, 1, -1] }],
        dontKnowShare: 1,
      }));
    });
    afterAll(async () => database.cleanup());

    it('stores a calibration with its items and reads the latest back', async () => {
      const record = {
        id: 'cal-1',
        studyId,
        method: 'mml' as const,
        settings: { groups: [{ cohortId: 'c', mean: 0 }] },
        converged: true,
        iterations: 7,
        logLikelihood: -12.5,
        responseCount: 6,
        responsesUntil: '2031-05-04T10:00:30.000Z',
        createdAt: '2031-05-05T09:00:00.000Z',
      };
      const items = [
        {
          itemId: 'x',
          itemVersion: 1,
          difficulty: -0.25,
          standardError: 0.5,
          infit: 1.01,
          outfit: null,
          anchored: false,
        },
        {
          itemId: 'y',
          itemVersion: 2,
          difficulty: 0.25,
          standardError: null,
          infit: null,
          outfit: 0.9,
          anchored: true,
        },
      ];
      await database.db.transaction().execute((trx) => insertCalibration(trx, record, items));
      await insertCalibration(
        database.db,
        { ...record, id: 'cal-0', createdAt: '2031-05-04T09:00:00.000Z' },
        [],
      );
      expect(await findLatestCalibration(database.db, studyId)).toEqual(record);
      expect(await listCalibrationItems(database.db, 'cal-1')).toEqual(items);
    });

    it("lists scored responses (I don't know = 0) with the watermark and attempt counts", async () => {
      const responses = await listScoredResponses(database.db, studyId);
      expect(responses).toHaveLength(6);
      for (const r of responses) if (r.answerKind === 'dont-know') expect(r.score).toBe(0);
      const watermark = await scoredResponseWatermark(database.db, studyId);
      expect(watermark.count).toBe(6);
      expect(watermark.newest).toBe(
        responses
          .map((r) => r.receivedAt)
          .sort()
          .at(-1),
      );
      expect(
        await listScoredResponses(database.db, studyId, responses.map((r) => r.receivedAt).sort()[1]),
      ).toHaveLength(2);
      const counts = await countAttemptsByCohort(database.db, studyId);
      expect(counts).toEqual([
        expect.objectContaining({ finished: 3, consented: 3, started: 0, abandoned: 0 }),
      ]);
    });
  });
}
