import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  type ExposureControlRecord,
  insertExposureControl,
  listCalibrationExposureControls,
  listStudyExposureControls,
} from '../../server/storage/exposure-control-repository.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const control = (id: string, calibrationId: string, createdAt: string) => ({
  id,
  studyId: 's1',
  calibrationId,
  settingsJson: '{"seTarget":0.45}',
  settingsHash: 'h'.repeat(64),
  itemParameters: { 'isle-ferry-busiest-day': 0.25, 'isle-ferry-monday-count': 1 },
  targetMaxExposure: 0.3,
  achievedMaxExposure: 0.287,
  simulation: { outcome: 'tuned', seed: 1, maxExposureByRound: [0.58, 0.29] },
  createdAt,
  createdBy: 'cli',
});

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: exposure control repository`, () => {
    let database: TestDatabase;

    beforeAll(async () => {
      database = await engine.open();
      await migrateToLatest(database.db);
      const now = '2026-12-02T09:00:00.000Z';
      await database.db
        .insertInto('studies')
        .values({
          id: 's1',
          title: 'Tide pools',
          settings: '{}',
          status: 'open',
          created_at: now,
          updated_at: now,
        })
        .execute();
      for (const id of ['cal-1', 'cal-2']) {
        await database.db
          .insertInto('calibrations')
          .values({
            id,
            study_id: 's1',
            method: 'mml',
            settings: '{}',
            converged: 1,
            iterations: 10,
            log_likelihood: -10,
            response_count: 100,
            responses_until: null,
            created_at: now,
          })
          .execute();
      }
    });
    afterAll(async () => {
      await database?.cleanup();
    });

    it('stores values exactly and lists newest first, per calibration and per study', async () => {
      await insertExposureControl(database.db, control('x-old', 'cal-1', '2026-12-02T09:01:00.000Z'));
      await insertExposureControl(database.db, control('x-new', 'cal-1', '2026-12-02T09:02:00.000Z'));
      await insertExposureControl(database.db, control('y', 'cal-2', '2026-12-02T09:03:00.000Z'));
      const forCalibration = await listCalibrationExposureControls(database.db, 'cal-1');
      expect(forCalibration.map((c) => c.id)).toEqual(['x-new', 'x-old']);
      const { settingsJson: _, ...rest } = control('x-new', 'cal-1', '2026-12-02T09:02:00.000Z');
      expect(forCalibration[0]).toEqual({
        ...rest,
        settings: { seTarget: 0.45 },
      } satisfies ExposureControlRecord);
      expect((await listStudyExposureControls(database.db, 's1')).map((c) => c.id)).toEqual([
        'y',
        'x-new',
        'x-old',
      ]);
    });

    it('refuses a control of an unknown calibration, and deleting a calibration removes its controls', async () => {
      await expect(
        insertExposureControl(database.db, control('z', 'no-such-calibration', '2026-12-02T09:04:00.000Z')),
      ).rejects.toThrow();
      await database.db.deleteFrom('calibrations').where('id', '=', 'cal-2').execute();
      expect((await listStudyExposureControls(database.db, 's1')).map((c) => c.id)).toEqual([
        'x-new',
        'x-old',
      ]);
    });
  });
}
