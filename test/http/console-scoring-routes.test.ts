import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createAccessToken } from '../../server/storage/token-repository.js';
import { csrfOf, signInToConsole } from '../helpers/console-session.js';
import {
  adminToken,
  bearer,
  deliveryApp,
  joinAndConsent,
  studyWithCohort,
} from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const texts = ['Friday was busiest, midweek quiet.', 'It changed.'];

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: console scoring queue`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let cookie: string;
    let studyId: string;

    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database);
      cookie = await signInToConsole(app, adminToken);
      const study = await studyWithCohort(app, {
        title: 'Ferry notes',
        pool: { itemIds: ['isle-ferry-why-tuesday'] },
        maxItems: 1,
      });
      studyId = study.studyId;
      for (const text of texts) {
        const token = await joinAndConsent(app, study.joinCode);
        const reply = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send({ itemId: 'isle-ferry-why-tuesday', answer: { kind: 'text', text } });
        expect(reply.status).toBe(201);
      }
    });

    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    const entryOf = (page: string) => /action="\/console\/scoring\/([^"]+)"/.exec(page)?.[1];

    it('shows one answer with the rubric and three score buttons, never who wrote it', async () => {
      const picker = await request(app.server).get('/console/scoring').set('cookie', cookie);
      expect(picker.status).toBe(200);
      expect(picker.text).toContain(`<option value="${studyId}">Ferry notes</option>`);
      const page = await request(app.server).get(`/console/scoring?study=${studyId}`).set('cookie', cookie);
      expect(page.status).toBe(200);
      expect(page.text).toContain(texts[0]);
      expect(page.text).not.toContain(texts[1]);
      expect(page.text).toContain('2 answers wait for your score');
      expect(
        [...page.text.matchAll(/<button type="submit" name="score" value="(\d)"/g)].map((m) => m[1]),
      ).toEqual(['0', '1', '2']);
      const attempts = await database.db.selectFrom('attempts').select(['id', 'cohort_id']).execute();
      for (const a of attempts) {
        expect(page.text).not.toContain(a.id);
        expect(page.text).not.toContain(a.cohort_id);
      }
    });

    it('refuses a post without the CSRF token (403) and a score outside the rubric (400), storing nothing', async () => {
      const page = await request(app.server).get(`/console/scoring?study=${studyId}`).set('cookie', cookie);
      const entry = entryOf(page.text)!;
      const forged = await request(app.server)
        .post(`/console/scoring/${entry}`)
        .set('cookie', cookie)
        .type('form')
        .send({ study: studyId, score: '2' });
      expect(forged.status).toBe(403);
      const outside = await request(app.server)
        .post(`/console/scoring/${entry}`)
        .set('cookie', cookie)
        .type('form')
        .send({ csrf: csrfOf(page.text), study: studyId, score: '3' });
      expect(outside.status).toBe(400);
      expect(outside.text).toContain('score: choose 0, 1 or 2');
      expect(await database.db.selectFrom('rubric_scores').selectAll().execute()).toEqual([]);
    });

    it('stores a score, moves to the next answer, and a repeat by the same rater keeps the first score', async () => {
      const page = await request(app.server).get(`/console/scoring?study=${studyId}`).set('cookie', cookie);
      const entry = entryOf(page.text)!;
      const post = (score: string) =>
        request(app.server)
          .post(`/console/scoring/${entry}`)
          .set('cookie', cookie)
          .type('form')
          .send({ csrf: csrfOf(page.text), study: studyId, score });
      const scored = await post('2');
      expect(scored.status).toBe(303);
      expect(scored.headers.location).toBe(
        `/console/scoring?study=${encodeURIComponent(studyId)}&notice=scored`,
      );
      const next = await request(app.server).get(scored.headers.location!).set('cookie', cookie);
      expect(next.text).toContain('Score saved.');
      expect(next.text).toContain(texts[1]);
      expect(next.text).toContain('This is the last answer waiting for you.');

      const again = await post('0');
      expect(again.status).toBe(303);
      expect(again.headers.location).toContain('notice=already-scored');
      const stored = await database.db.selectFrom('rubric_scores').select(['rater', 'score']).execute();
      expect(stored.map((s) => [s.rater, Number(s.score)])).toEqual([['admin-token', 2]]);
      // One rater (the default): the answer now counts 2.
      const response = await database.db
        .selectFrom('responses')
        .select('score')
        .where('id', '=', entry)
        .executeTakeFirstOrThrow();
      expect(Number(response.score)).toBe(2);
    });

    it('keeps analysts out (403): scoring changes what calibration reads', async () => {
      const analyst = (await createAccessToken(database.db, 'analyst', 'report reader')).token;
      const reply = await request(app.server).get(`/console/scoring?study=${studyId}`).set(bearer(analyst));
      expect(reply.status).toBe(403);
      const api = await request(app.server)
        .get(`/api/admin/studies/${studyId}/scoring-queue`)
        .set(bearer(analyst));
      expect(api.status).toBe(403);
    });
  });
}
