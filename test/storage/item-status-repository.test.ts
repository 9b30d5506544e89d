import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertCalibration } from '../../server/storage/calibration-repository.js';
import {
  itemExposureCounts,
  latestItemCalibrations,
} from '../../server/storage/item-statistics-repository.js';
import {
  findLatestItemStatusChange,
  type ItemStatusChange,
  insertItemStatusChange,
  latestItemStatusChanges,
  listItemStatusChanges,
  listRetiredItemIds,
} from '../../server/storage/item-status-repository.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

function change(itemId: string, changeNumber: number, status: 'retired' | 'active'): ItemStatusChange {
  return {
    id: `${itemId}-${changeNumber}`,
    itemId,
    itemVersion: 1,
    changeNumber,
    status,
    reason: `change ${changeNumber} of ${itemId}`,
    actor: 'curator laptop',
    // Same instant for every row: the order must come from change_number, not the clock.
    changedAt: '2031-06-01T09:00:00.000Z',
  };
}

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: item status repository`, () => {
    let database: TestDatabase;
    beforeAll(async () => {
      database = await engine.open();
      await migrateToLatest(database.db);
    });
    afterAll(async () => database.cleanup());

    it('appends changes and takes the highest change number as the status now', async () => {
      const { db } = database;
      expect(await findLatestItemStatusChange(db, 'harbour-tides')).toBeUndefined();
      expect(await listRetiredItemIds(db)).toEqual(new Set());
      // Inserted out of order on purpose: "latest" must not mean "inserted last".
      await insertItemStatusChange(db, change('harbour-tides', 2, 'active'));
      await insertItemStatusChange(db, change('harbour-tides', 1, 'retired'));
      await insertItemStatusChange(db, change('harbour-tides', 3, 'retired'));
      await insertItemStatusChange(db, change('orchard-rain', 1, 'retired'));
      await insertItemStatusChange(db, change('orchard-rain', 2, 'active'));

      const history = await listItemStatusChanges(db, 'harbour-tides');
      expect(history.map((c) => [c.changeNumber, c.status])).toEqual([
        [1, 'retired'],
        [2, 'active'],
        [3, 'retired'],
      ]);
      expect(history[0]).toEqual(change('harbour-tides', 1, 'retired'));
      expect((await findLatestItemStatusChange(db, 'harbour-tides'))?.changeNumber).toBe(3);

      const latest = await latestItemStatusChanges(db);
      expect([...latest.keys()]).toEqual(['harbour-tides', 'orchard-rain']);
      expect(latest.get('orchard-rain')?.status).toBe('active');
      expect(await listRetiredItemIds(db)).toEqual(new Set(['harbour-tides']));
    });

    it('refuses a second change with the same number (two writers racing)', async () => {
      const { db } = database;
      await expect(
        insertItemStatusChange(db, { ...change('harbour-tides', 3, 'active'), id: 'racer' }),
      ).rejects.toThrow();
      expect((await listItemStatusChanges(db, 'harbour-tides')).length).toBe(3);
    });

    it('reads exposure counts and the newest converged calibration of each item', async () => {
      const { db } = database;
      const at = '2031-06-01T10:00:00.000Z';
      await db
        .insertInto('studies')
        .values({
          id: 's1',
          title: 'Dune walk',
          settings: '{}',
          status: 'open',
          created_at: at,
          updated_at: at,
        })
        .execute();
      await db
        .insertInto('cohorts')
        .values({ id: 'c1', study_id: 's1', label: 'Morning', join_code: 'DUNE42', created_at: at })
        .execute();
      const attempt = (id: string, consented: boolean) => ({
        id,
        cohort_id: 'c1',
        token_hash: `hash-${id}`,
        status: 'finished' as const,
        form: '{}',
        background: '{}',
        consented_at: consented ? at : null,
        started_at: at,
        last_seen_at: at,
      });
      await db
        .insertInto('attempts')
        .values([attempt('a1', true), attempt('a2', true), attempt('a3', false), attempt('a4', true)])
        .execute();
      const response = (id: string, attemptId: string, itemId: string) => ({
        id,
        attempt_id: attemptId,
        item_id: itemId,
        item_version: 1,
        position: 0,
        answer_kind: 'answer' as const,
        answer: '"a"',
        score: 1,
        received_at: at,
      });
      await db
        .insertInto('responses')
        .values([response('r1', 'a1', 'x'), response('r2', 'a2', 'x'), response('r3', 'a1', 'y')])
        .execute();
      const exposure = await itemExposureCounts(db);
      // a3 never consented and a4 answered nothing: 2 attempts with answers, not 3 or 4.
      expect(exposure.attempts).toBe(2);
      expect(exposure.responsesByItem).toEqual(
        new Map([
          ['x', 2],
          ['y', 1],
        ]),
      );

      const calibration = (id: string, createdAt: string, converged: boolean) => ({
        id,
        studyId: 's1',
        method: 'mml' as const,
        settings: {},
        converged,
        iterations: 5,
        logLikelihood: null,
        responseCount: 3,
        responsesUntil: at,
        createdAt,
      });
      const item = (itemId: string, difficulty: number) => ({
        itemId,
        itemVersion: 1,
        difficulty,
        standardError: 0.4,
        infit: 1.1,
        outfit: 0.9,
        anchored: false,
      });
      await insertCalibration(db, calibration('old', '2031-06-01T11:00:00.000Z', true), [
        item('x', -1),
        item('y', 1),
      ]);
      await insertCalibration(db, calibration('new', '2031-06-02T11:00:00.000Z', true), [item('x', -0.5)]);
      await insertCalibration(db, calibration('failed', '2031-06-03T11:00:00.000Z', false), [
        item('x', 9),
        item('y', 9),
      ]);
      const latest = await latestItemCalibrations(db);
      expect(latest.get('x')).toMatchObject({ calibrationId: 'new', difficulty: -0.5, studyId: 's1' });
      // y is not in the newest converged calibration: it keeps the older one, never the failed one.
      expect(latest.get('y')).toMatchObject({ calibrationId: 'old', difficulty: 1, infit: 1.1, outfit: 0.9 });
    });
  });
}
