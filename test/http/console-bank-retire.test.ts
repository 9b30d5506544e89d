import { randomUUID } from 'node:crypto';
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertCalibration, listScoredResponses } from '../../server/storage/calibration-repository.js';
import { createAccessToken } from '../../server/storage/token-repository.js';
import { csrfOf, signInToConsole } from '../helpers/console-session.js';
import {
  admin,
  adminToken,
  bearer,
  correctAnswers,
  deliveryApp,
  joinAndConsent,
  studyWithCohort,
} from '../helpers/delivery-fixture.js';
import { storedAttempt } from '../helpers/stored-attempt.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const retiredId = 'isle-ferry-busiest-day';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: retiring items`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let analyst: string;
    let adminCookie: string;
    let analystCookie: string;
    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database);
      analyst = (await createAccessToken(database.db, 'analyst', 'report reader')).token;
      adminCookie = await signInToConsole(app, adminToken);
      analystCookie = await signInToConsole(app, analyst);
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    const changes = () =>
      database.db.selectFrom('item_status_changes').selectAll().orderBy('change_number').execute();
    const itemsRows = () => database.db.selectFrom('items').selectAll().orderBy('id').execute();
    const formOf = async (token: string) => (await storedAttempt(database, token)).form;

    it('refuses bad retire requests through the API without writing anything', async () => {
      const cases: [string, Record<string, string>, unknown, number, string][] = [
        ['analyst token', bearer(analyst), { reason: 'confusing axis' }, 403, 'FORBIDDEN'],
        ['no token', {}, { reason: 'confusing axis' }, 401, 'UNAUTHORIZED'],
        ['reason missing', admin, {}, 400, 'VALIDATION_FAILED'],
        ['reason too short', admin, { reason: ' x ' }, 400, 'VALIDATION_FAILED'],
        ['unknown field', admin, { reason: 'fine reason', extra: 1 }, 400, 'VALIDATION_FAILED'],
      ];
      for (const [label, headers, body, status, code] of cases) {
        const reply = await request(app.server)
          .post(`/api/admin/items/${retiredId}/retire`)
          .set(headers)
          .send(body as object);
        expect([label, reply.status, reply.body.error?.code]).toEqual([label, status, code]);
      }
      const tooShort = await request(app.server)
        .post(`/api/admin/items/${retiredId}/retire`)
        .set(admin)
        .send({ reason: 'x' });
      expect(tooShort.body.error.message).toContain('body.reason');
      const unknown = await request(app.server)
        .post('/api/admin/items/no-such-item/retire')
        .set(admin)
        .send({ reason: 'does not exist' });
      expect([unknown.status, unknown.body.error.code, unknown.body.error.details.field]).toEqual([
        404,
        'ITEM_NOT_FOUND',
        'params.itemId',
      ]);
      expect(await changes()).toEqual([]);
    });

    it('retires through the console: a new log row and an audit entry; the item file rows stay as they were', async () => {
      const { joinCode } = await studyWithCohort(app, { maxItems: 5 });
      // An attempt that starts before the retirement keeps the item.
      const early = await joinAndConsent(app, joinCode);
      expect((await formOf(early)).items.map((i) => i.itemId)).toContain(retiredId);
      const before = await itemsRows();

      const page = await request(app.server).get(`/console/bank/${retiredId}`).set('Cookie', adminCookie);
      expect(page.status).toBe(200);
      expect(page.text).toContain('Retire this item');
      const csrf = csrfOf(page.text);

      // An analyst sees no form and may not post one.
      const analystPage = await request(app.server)
        .get(`/console/bank/${retiredId}`)
        .set('Cookie', analystCookie);
      expect(analystPage.status).toBe(200);
      expect(analystPage.text).not.toContain('Retire this item');
      const analystPost = await request(app.server)
        .post(`/console/bank/${retiredId}/retire`)
        .set('Cookie', analystCookie)
        .type('form')
        .send({ csrf: csrfOf(analystPage.text), reason: 'I should not be able to' });
      expect(analystPost.status).toBe(403);

      // Without the CSRF token: refused.
      const forged = await request(app.server)
        .post(`/console/bank/${retiredId}/retire`)
        .set('Cookie', adminCookie)
        .type('form')
        .send({ reason: 'forged from elsewhere' });
      expect([forged.status, forged.body.error.code]).toEqual([403, 'FORBIDDEN']);

      // A reason that is too short comes back on the page, named and kept.
      const short = await request(app.server)
        .post(`/console/bank/${retiredId}/retire`)
        .set('Cookie', adminCookie)
        .type('form')
        .send({ csrf, reason: 'no' });
      expect(short.status).toBe(400);
      expect(short.text).toContain('Reason: say why in at least 3 characters.');
      expect(short.text).toContain('aria-invalid="true"');
      expect(short.text).toMatch(/<textarea[^>]*>no<\/textarea>/);
      expect(await changes()).toEqual([]);

      const done = await request(app.server)
        .post(`/console/bank/${retiredId}/retire`)
        .set('Cookie', adminCookie)
        .type('form')
        .send({ csrf, reason: 'Visitors read the Tuesday bar as Wednesday' });
      expect(done.status).toBe(303);
      expect(done.headers.location).toBe(`/console/bank/${retiredId}?changed=retired`);
      const rows = await changes();
      expect(rows).toMatchObject([
        {
          item_id: retiredId,
          item_version: 1,
          change_number: 1,
          status: 'retired',
          reason: 'Visitors read the Tuesday bar as Wednesday',
          actor: 'admin-token',
        },
      ]);
      expect(await itemsRows()).toEqual(before);
      const audit = await database.db
        .selectFrom('audit_log')
        .selectAll()
        .where('action', '=', 'item.retire')
        .execute();
      expect(audit.map((a) => [a.subject, a.actor, JSON.parse(a.details).changeNumber])).toEqual([
        [retiredId, 'admin-token', 1],
      ]);

      const after = await request(app.server).get(done.headers.location!).set('Cookie', adminCookie);
      expect(after.text).toContain('Item retired.');
      expect(after.text).toContain('Reinstate this item');
      expect(after.text).toContain('Visitors read the Tuesday bar as Wednesday');

      // Retiring again is a conflict, shown on the page; nothing more is written.
      const again = await request(app.server)
        .post(`/console/bank/${retiredId}/retire`)
        .set('Cookie', adminCookie)
        .type('form')
        .send({ csrf, reason: 'double click' });
      expect(again.status).toBe(409);
      expect(again.text).toContain('is already retired');
      expect((await changes()).length).toBe(1);

      // New attempts no longer get it; the early attempt still has it and its answer is stored.
      const late = await joinAndConsent(app, joinCode);
      const lateItems = (await formOf(late)).items.map((i) => i.itemId);
      expect(lateItems).not.toContain(retiredId);
      expect(lateItems.length).toBe(4);
      const state = await request(app.server).get('/api/attempt').set(bearer(early));
      expect(state.body.item.itemId).toBe(retiredId);
      const answer = await request(app.server)
        .post('/api/attempt/responses')
        .set(bearer(early))
        .send({ itemId: retiredId, answer: correctAnswers[retiredId] });
      expect(answer.status).toBe(201);
      // ... and counts for calibration: the scored responses include the retired item.
      const studyId = (
        await database.db
          .selectFrom('studies')
          .select('id')
          .orderBy('created_at', 'desc')
          .executeTakeFirstOrThrow()
      ).id;
      const scored = await listScoredResponses(database.db, studyId);
      expect(scored.some((r) => r.itemId === retiredId && r.score === 1)).toBe(true);
    });

    it('leaves a retired item out of rotated booklets of new attempts', async () => {
      const { joinCode } = await studyWithCohort(app, { design: 'rotated', maxItems: 2 });
      const seen = new Set<string>();
      for (let i = 0; i < 4; i++) {
        const token = await joinAndConsent(app, joinCode);
        for (const item of (await formOf(token)).items) seen.add(item.itemId);
      }
      // Four remaining items in booklets of 2 taken in turn: every one shows up, the retired one never.
      expect([...seen].sort()).toEqual(
        [
          'isle-ferry-monday-count',
          'isle-ferry-quiet-days',
          'isle-ferry-why-tuesday',
          'town-ferry-quietest-day',
        ].sort(),
      );
    });

    it('leaves a retired item out of adaptive selection for new attempts', async () => {
      const study = await studyWithCohort(app, { maxItems: 3 });
      const difficulty: Record<string, number> = {
        [retiredId]: 0,
        'isle-ferry-monday-count': -1.5,
        'isle-ferry-quiet-days': 1.5,
        'town-ferry-quietest-day': 2,
      };
      await insertCalibration(
        database.db,
        {
          id: randomUUID(),
          studyId: study.studyId,
          method: 'mml',
          settings: {
            groups: [{ cohortId: study.cohortId, label: 'x', mean: 0, sd: 1, meanStandardError: 0.1 }],
          },
          converged: true,
          iterations: 10,
          logLikelihood: -50,
          responseCount: 200,
          responsesUntil: null,
          createdAt: new Date().toISOString(),
        },
        Object.entries(difficulty).map(([itemId, b]) => ({
          itemId,
          itemVersion: 1,
          difficulty: b,
          standardError: 0.2,
          infit: 1,
          outfit: 1,
          anchored: false,
        })),
      );
      const switched = await request(app.server)
        .patch(`/api/admin/studies/${study.studyId}`)
        .set(admin)
        .send({
          settings: {
            title: 'Ferry adaptive',
            design: 'adaptive',
            maxItems: 3,
            adaptive: { randomesque: 1, contentBalance: 'none' },
          },
        });
      expect(switched.status).toBe(200);
      // With the prior at 0 and no randomness, the most informative item (b = 0) would come first;
      // it is retired, so the next best (b = -1.5) comes first instead.
      const token = await joinAndConsent(app, study.joinCode);
      expect((await formOf(token)).items.map((i) => i.itemId)).toEqual(['isle-ferry-monday-count']);

      // Reinstated through the API: the next new attempt gets it first again.
      const reinstated = await request(app.server)
        .post(`/api/admin/items/${retiredId}/reinstate`)
        .set(admin)
        .send({ reason: 'Axis labels redrawn in the file' });
      expect(reinstated.status).toBe(201);
      expect(reinstated.body).toMatchObject({ changeNumber: 2, status: 'active', actor: 'admin-token' });
      const next = await joinAndConsent(app, study.joinCode);
      expect((await formOf(next)).items.map((i) => i.itemId)).toEqual([retiredId]);

      const status = await request(app.server)
        .get(`/api/admin/items/${retiredId}/status`)
        .set(bearer(analyst));
      expect(status.status).toBe(200);
      expect(status.body.status).toBe('active');
      expect(status.body.changes.map((c: { status: string }) => c.status)).toEqual(['retired', 'active']);
      const twice = await request(app.server)
        .post(`/api/admin/items/${retiredId}/reinstate`)
        .set(admin)
        .send({ reason: 'again' });
      expect([twice.status, twice.body.error.code]).toEqual([409, 'CONFLICT']);
    });
  });
}
