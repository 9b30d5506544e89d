import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AttemptState } from '../../server/delivery/attempt-state.js';
import { studyWithSettings } from '../../server/delivery/study-settings-cache.js';
import type { StudyRow } from '../../server/storage/study-repository.js';
import {
  admin,
  bearer,
  correctAnswers,
  deliveryApp,
  joinAndConsent,
  studyWithCohort,
} from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** Answers the attempt's current item; returns the reply's attempt state. */
async function answerCurrent(app: FastifyInstance, token: string): Promise<AttemptState> {
  const state = await request(app.server).get('/api/attempt').set(bearer(token));
  expect(state.body.step).toBe('item');
  const itemId: string = state.body.item.itemId;
  const reply = await request(app.server)
    .post('/api/attempt/responses')
    .set(bearer(token))
    .send({ itemId, answer: correctAnswers[itemId] ?? { kind: 'dont-know' } });
  expect(reply.status).toBe(201);
  return reply.body.attempt as AttemptState;
}

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(
    `${engine.engine}: a study edit is seen by the next answer (settings cache)`,
    () => {
      let database: TestDatabase;
      let app: FastifyInstance;
      beforeAll(async () => {
        database = await engine.open();
        app = await deliveryApp(database);
      });
      afterAll(async () => {
        await app?.close();
        await database?.cleanup();
      });

      it('an edit through the admin API changes the very next reply', async () => {
        const study = await studyWithCohort(app, { title: 'Corrowen ferry check', maxItems: 10 });
        const token = await joinAndConsent(app, study.joinCode);
        const first = await answerCurrent(app, token);
        expect(first.study).toMatchObject({ title: 'Corrowen ferry check', kiosk: false, idleSeconds: 90 });

        const renamed = await request(app.server)
          .patch(`/api/admin/studies/${study.studyId}`)
          .set(admin)
          .send({ title: 'Corrowen ferry check, spring' });
        expect(renamed.status).toBe(200);
        const second = await answerCurrent(app, token);
        expect(second.study.title).toBe('Corrowen ferry check, spring');

        const kiosk = await request(app.server)
          .patch(`/api/admin/studies/${study.studyId}`)
          .set(admin)
          .send({ settings: { title: 'Lumen Hall kiosk', maxItems: 10, kiosk: true, idleSeconds: 45 } });
        expect(kiosk.status).toBe(200);
        const third = await answerCurrent(app, token);
        expect(third.study).toMatchObject({ title: 'Lumen Hall kiosk', kiosk: true, idleSeconds: 45 });
      });

      it('a change written to the table by any other path is seen too (the cache checks the stored text)', async () => {
        const study = await studyWithCohort(app, { title: 'Sprout Lane survey', maxItems: 10 });
        const token = await joinAndConsent(app, study.joinCode);
        expect((await answerCurrent(app, token)).study.endSummary).toBe(false);
        const row = await database.db
          .selectFrom('studies')
          .select('settings')
          .where('id', '=', study.studyId)
          .executeTakeFirstOrThrow();
        const settings = { ...(JSON.parse(row.settings) as Record<string, unknown>), endSummary: true };
        // Same updated_at on purpose: the cache must not rely on the timestamp.
        await database.db
          .updateTable('studies')
          .set({ settings: JSON.stringify(settings) })
          .where('id', '=', study.studyId)
          .execute();
        expect((await answerCurrent(app, token)).study.endSummary).toBe(true);
      });

      it('two studies never share an entry', async () => {
        const a = await studyWithCohort(app, { title: 'Orbelle Bikes riders', maxItems: 10 });
        const b = await studyWithCohort(app, { title: 'Velmora Isle visitors', maxItems: 10, kiosk: true });
        const tokenA = await joinAndConsent(app, a.joinCode);
        const tokenB = await joinAndConsent(app, b.joinCode);
        const stateA = await answerCurrent(app, tokenA);
        const stateB = await answerCurrent(app, tokenB);
        expect([stateA.study.title, stateA.study.kiosk]).toEqual(['Orbelle Bikes riders', false]);
        expect([stateB.study.title, stateB.study.kiosk]).toEqual(['Velmora Isle visitors', true]);
      });
    },
  );
}

describe('studyWithSettings', () => {
  const row = (settings: unknown): StudyRow => ({
    id: 'study-cache-unit',
    title: 'Corrowen',
    settings: JSON.stringify(settings),
    status: 'open',
    created_at: '2026-01-01T00:00:00.000Z',
    updated_at: '2026-01-01T00:00:00.000Z',
  });

  it('parses once per stored text and shares a frozen result', () => {
    const first = studyWithSettings(row({ title: 'Corrowen', maxItems: 12 }));
    const again = studyWithSettings(row({ title: 'Corrowen', maxItems: 12 }));
    expect(again.settings).toBe(first.settings);
    expect(first.settings.maxItems).toBe(12);
    expect(first.settings.idleSeconds).toBe(90); // the schema's default filled in
    expect(Object.isFrozen(first.settings)).toBe(true);
    expect(Object.isFrozen(first.settings.background)).toBe(true);
    expect(() => {
      (first.settings as { maxItems: number }).maxItems = 3;
    }).toThrow(TypeError);

    const changed = studyWithSettings(row({ title: 'Corrowen', maxItems: 7 }));
    expect(changed.settings).not.toBe(first.settings);
    expect(changed.settings.maxItems).toBe(7);
    expect(changed.study).toMatchObject({ id: 'study-cache-unit', settings: { maxItems: 7 } });
  });

  it('refuses stored settings that do not validate, and caches nothing for them', () => {
    expect(() => studyWithSettings(row({ title: 'Corrowen', maxItems: -1 }))).toThrow();
    expect(studyWithSettings(row({ title: 'Corrowen', maxItems: 5 })).settings.maxItems).toBe(5);
  });
});
