import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashAttemptToken } from '../../server/delivery/attempt-token.js';
import {
  admin,
  ageBand,
  bearer,
  correctAnswers,
  deliveryApp,
  joinAndConsent,
  storedState,
  studyWithCohort,
} from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(
    `${engine.engine}: respondent API, one attempt end to end`,
    () => {
      let database: TestDatabase;
      let app: FastifyInstance;
      let study: { studyId: string; cohortId: string; joinCode: string };
      beforeAll(async () => {
        database = await engine.open();
        app = await deliveryApp(database);
        study = await studyWithCohort(app, { background: [ageBand], endSummary: true, maxItems: 10 });
      });
      afterAll(async () => {
        await app?.close();
        await database?.cleanup();
      });

      it('join → consent → background → five items → finished, each answer stored before the reply', async () => {
        const typed = ` ${study.joinCode.toLowerCase().replace('-', ' ')} `;
        const joined = await request(app.server).post('/api/join').send({ code: typed });
        expect(joined.status).toBe(201);
        const token: string = joined.body.token;
        expect(token).toMatch(/^[A-Za-z0-9_-]{22}$/); // 128 bits in base64url
        expect(joined.body.attempt.step).toBe('consent');
        expect(joined.body.attempt.progress).toEqual({ answered: 0, total: 5 });

        // Only the hash is stored.
        const stored = await database.db.selectFrom('attempts').select('token_hash').execute();
        expect(stored.map((r) => r.token_hash)).toEqual([hashAttemptToken(token)]);

        const resumed = await request(app.server).get('/api/attempt').set(bearer(token));
        expect(resumed.status).toBe(200);
        expect(resumed.body.step).toBe('consent');

        const consent = await request(app.server)
          .post('/api/attempt/consent')
          .set(bearer(token))
          .send({ agree: true });
        expect(consent.status).toBe(200);
        expect(consent.body.step).toBe('background');
        expect(consent.body.background[0].options.map((o: { id: string }) => o.id)).toEqual([
          'under-12',
          '12-17',
          '18-plus',
          'prefer-not-to-say',
        ]);

        const background = await request(app.server)
          .post('/api/attempt/background')
          .set(bearer(token))
          .send({ answers: { 'age-band': 'prefer-not-to-say' } });
        expect(background.status).toBe(200);
        expect(background.body.step).toBe('item');
        expect(background.body.item.position).toBe(0);

        let state = background.body;
        const seen: string[] = [];
        while (state.step === 'item') {
          const itemId: string = state.item.itemId;
          seen.push(itemId);
          // A reload mid-attempt resumes at the same item.
          const reload = await request(app.server).get('/api/attempt').set(bearer(token));
          expect(reload.body.item.itemId).toBe(itemId);
          const answer =
            itemId === 'town-ferry-quietest-day' ? { kind: 'dont-know' } : (correctAnswers[itemId] as object);
          const reply = await request(app.server)
            .post('/api/attempt/responses')
            .set(bearer(token))
            .send({ itemId, answer, clientMs: 4200 });
          expect(reply.status).toBe(201);
          expect(reply.body.status).toBe('stored');
          // Committed before the reply: a separate read sees the row now.
          const row = await database.db
            .selectFrom('responses')
            .selectAll()
            .where('item_id', '=', itemId)
            .executeTakeFirst();
          expect(row?.position).toBe(seen.length - 1);
          state = reply.body.attempt;
        }
        // The pool in balanced order (server/delivery/balanced-pool-order.ts): levels spread first.
        expect(seen).toEqual([
          'isle-ferry-busiest-day',
          'isle-ferry-quiet-days',
          'isle-ferry-why-tuesday',
          'town-ferry-quietest-day',
          'isle-ferry-monday-count',
        ]);
        expect(state.step).toBe('finished');
        // End summary: 3 scored correct (choice, numeric within tolerance 5, multiple choice as a set);
        // the text answer waits for rubric scoring and "I don't know" scores 0.
        expect(state.summary).toEqual({ answered: 5, chartsRead: 3 });

        const rows = await database.db.selectFrom('responses').selectAll().orderBy('position').execute();
        expect(
          rows.map((r) => [r.item_id, r.answer_kind, r.score === null ? null : Number(r.score)]),
        ).toEqual([
          ['isle-ferry-busiest-day', 'answer', 1],
          ['isle-ferry-quiet-days', 'answer', 1],
          ['isle-ferry-why-tuesday', 'answer', null],
          ['town-ferry-quietest-day', 'dont-know', 0],
          ['isle-ferry-monday-count', 'answer', 1],
        ]);
        for (const row of rows) {
          expect(Number(row.client_ms)).toBe(4200);
          expect(row.server_ms).not.toBeNull();
          expect(Number(row.server_ms)).toBeGreaterThanOrEqual(0);
          expect(Number(row.item_version)).toBe(1);
        }
        const attempt = await database.db.selectFrom('attempts').selectAll().executeTakeFirstOrThrow();
        expect(attempt.status).toBe('finished');
        expect(JSON.parse(attempt.background)).toEqual({ 'age-band': 'prefer-not-to-say' });

        // Reload at the end screen shows the end screen.
        const end = await request(app.server).get('/api/attempt').set(bearer(token));
        expect(end.body.step).toBe('finished');
      });

      it('scores wrong answers 0: a wrong option, a number outside the tolerance, a partial multiple choice', async () => {
        const token = await joinAndConsent(app, study.joinCode);
        const answers: Record<string, object> = {
          'isle-ferry-busiest-day': { kind: 'choice', optionIds: ['c'] },
          'isle-ferry-monday-count': { kind: 'number', value: 126 }, // key 120, tolerance 5
          'isle-ferry-quiet-days': { kind: 'choice', optionIds: ['mon'] },
          'isle-ferry-why-tuesday': { kind: 'dont-know' },
          'town-ferry-quietest-day': { kind: 'choice', optionIds: ['a'] },
        };
        let state = (await request(app.server).get('/api/attempt').set(bearer(token))).body;
        while (state.step === 'item') {
          const reply = await request(app.server)
            .post('/api/attempt/responses')
            .set(bearer(token))
            .send({ itemId: state.item.itemId, answer: answers[state.item.itemId] });
          expect(reply.status).toBe(201);
          state = reply.body.attempt;
        }
        const attempt = await database.db
          .selectFrom('attempts')
          .select('id')
          .where('token_hash', '=', hashAttemptToken(token))
          .executeTakeFirstOrThrow();
        const scores = await database.db
          .selectFrom('responses')
          .select(['score', 'client_ms'])
          .where('attempt_id', '=', attempt.id)
          .execute();
        expect(scores.map((s) => Number(s.score))).toEqual([0, 0, 0, 0, 0]);
        expect(scores.every((s) => s.client_ms === null)).toBe(true);
      });

      it('idempotency: the same answer again returns the first result (200); a different one 409', async () => {
        const token = await joinAndConsent(app, study.joinCode);
        const first = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send({
            itemId: 'isle-ferry-busiest-day',
            answer: { kind: 'choice', optionIds: ['b'] },
            clientMs: 900,
          });
        expect(first.status).toBe(201);
        const before = await storedState(database);
        const again = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send({
            itemId: 'isle-ferry-busiest-day',
            answer: { kind: 'choice', optionIds: ['b'] },
            clientMs: 1500,
          });
        expect(again.status).toBe(200);
        expect(again.body.status).toBe('already-stored');
        expect(again.body.attempt.item.itemId).toBe('isle-ferry-quiet-days');
        const changed = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send({ itemId: 'isle-ferry-busiest-day', answer: { kind: 'choice', optionIds: ['a'] } });
        expect(changed.status).toBe(409);
        expect(changed.body.error.code).toBe('ANSWER_ALREADY_STORED');
        expect(changed.body.error.message).toMatch(/first answer stands/);
        expect(await storedState(database)).toEqual(before);
      });

      it('concurrent copies of one answer store exactly one row', async () => {
        const token = await joinAndConsent(app, study.joinCode);
        const send = () =>
          request(app.server)
            .post('/api/attempt/responses')
            .set(bearer(token))
            .send({ itemId: 'isle-ferry-busiest-day', answer: { kind: 'choice', optionIds: ['b'] } });
        const replies = await Promise.all([send(), send(), send()]);
        expect(replies.map((r) => r.status).sort()).toEqual([200, 200, 201]);
        const attempt = await database.db
          .selectFrom('attempts')
          .select('id')
          .where('token_hash', '=', hashAttemptToken(token))
          .executeTakeFirstOrThrow();
        const rows = await database.db
          .selectFrom('responses')
          .select('id')
          .where('attempt_id', '=', attempt.id)
          .execute();
        expect(rows).toHaveLength(1);
      });

      it('declining consent ends the attempt; its token then opens nothing', async () => {
        const joined = await request(app.server).post('/api/join').send({ code: study.joinCode });
        const token = joined.body.token;
        const declined = await request(app.server)
          .post('/api/attempt/consent')
          .set(bearer(token))
          .send({ agree: false });
        expect(declined.status).toBe(200);
        expect(declined.body.step).toBe('declined');
        expect((await request(app.server).get('/api/attempt').set(bearer(token))).status).toBe(401);
      });

      it('leave marks the attempt abandoned (kiosk start-over); an item never shown has no row', async () => {
        const token = await joinAndConsent(app, study.joinCode);
        await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send({ itemId: 'isle-ferry-busiest-day', answer: { kind: 'choice', optionIds: ['b'] } });
        const left = await request(app.server).post('/api/attempt/leave').set(bearer(token)).send({});
        expect(left.status).toBe(200);
        expect(left.body.step).toBe('left');
        const attempt = await database.db
          .selectFrom('attempts')
          .select(['id', 'status'])
          .where('token_hash', '=', hashAttemptToken(token))
          .executeTakeFirstOrThrow();
        expect(attempt.status).toBe('abandoned');
        const rows = await database.db
          .selectFrom('responses')
          .select('item_id')
          .where('attempt_id', '=', attempt.id)
          .execute();
        expect(rows.map((r) => r.item_id)).toEqual(['isle-ferry-busiest-day']);
        // Leaving again is harmless; anything else with the old token is refused.
        expect((await request(app.server).post('/api/attempt/leave').set(bearer(token))).status).toBe(200);
        expect((await request(app.server).get('/api/attempt').set(bearer(token))).status).toBe(401);
      });

      it('the export lists what was stored', async () => {
        const csv = await request(app.server)
          .get(`/api/admin/studies/${study.studyId}/export?format=long`)
          .set(admin);
        expect(csv.status).toBe(200);
        expect(csv.headers['content-type']).toMatch(/^text\/csv/);
        expect(csv.text.split('\r\n')[0]).toBe(
          'attempt_id,cohort_id,cohort_label,item_id,item_version,position,answer_kind,answer,score,server_ms,client_ms,received_at,bg_age-band',
        );
      });
    },
  );
}
