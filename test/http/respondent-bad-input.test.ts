import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newAttemptToken } from '../../server/delivery/attempt-token.js';
import {
  admin,
  ageBand,
  bearer,
  deliveryApp,
  joinAndConsent,
  storedState,
  studyWithCohort,
} from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/**
 * The issue's bad-input list, route by route: each answer is a specific 4xx with a message a person
 * understands, and the stored tables are exactly as before.
 */
for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(
    `${engine.engine}: respondent API refuses bad input`,
    () => {
      let database: TestDatabase;
      let app: FastifyInstance;
      let open: { studyId: string; joinCode: string };
      let closed: { studyId: string; joinCode: string };
      /** At item 0 (busiest day, single choice). */
      let token: string;
      /** Not yet consented. */
      let fresh: string;
      /** Finished. */
      let finished: string;
      /** Left (kiosk reset). */
      let left: string;

      beforeAll(async () => {
        database = await engine.open();
        app = await deliveryApp(database);
        open = await studyWithCohort(app, { background: [ageBand] });
        closed = await studyWithCohort(app, { title: 'Old study' });
        await request(app.server)
          .patch(`/api/admin/studies/${closed.studyId}`)
          .set(admin)
          .send({ status: 'closed' });
        token = await joinAndConsent(app, open.joinCode);
        fresh = (await request(app.server).post('/api/join').send({ code: open.joinCode })).body.token;
        left = await joinAndConsent(app, open.joinCode);
        await request(app.server).post('/api/attempt/leave').set(bearer(left));
        // A study with one item, answered: a finished attempt.
        const one = await studyWithCohort(app, {
          title: 'One item',
          pool: { itemIds: ['isle-ferry-busiest-day'] },
        });
        finished = await joinAndConsent(app, one.joinCode);
        const last = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(finished))
          .send({ itemId: 'isle-ferry-busiest-day', answer: { kind: 'choice', optionIds: ['b'] } });
        expect(last.body.attempt.step).toBe('finished');
        // Show item 0 of `token` so later GETs change nothing.
        await request(app.server).get('/api/attempt').set(bearer(token));
      });
      afterAll(async () => {
        await app?.close();
        await database?.cleanup();
      });

      type Case = [name: string, send: () => request.Test, status: number, code: string, message?: RegExp];
      const post = (url: string, who: () => string | undefined, body: unknown) => () => {
        const test = request(app.server).post(url);
        const t = who();
        if (t !== undefined) test.set(bearer(t));
        return test.send(body as object);
      };
      const answer = (who: () => string, body: unknown) => post('/api/attempt/responses', who, body);
      const choice = (itemId: string, optionIds: string[]) => ({
        itemId,
        answer: { kind: 'choice', optionIds },
      });

      const cases: Case[] = [
        // POST /api/join
        [
          'unknown join code',
          post('/api/join', () => undefined, { code: 'ZZZZ-99' }),
          404,
          'JOIN_CODE_NOT_FOUND',
          /not found/,
        ],
        [
          'malformed join code',
          post('/api/join', () => undefined, { code: '<script>' }),
          404,
          'JOIN_CODE_NOT_FOUND',
        ],
        [
          'empty join code',
          post('/api/join', () => undefined, { code: '' }),
          400,
          'VALIDATION_FAILED',
          /body\.code/,
        ],
        [
          'join without a code',
          post('/api/join', () => undefined, {}),
          400,
          'VALIDATION_FAILED',
          /body\.code/,
        ],
        // GET /api/attempt and token problems
        ['no token', () => request(app.server).get('/api/attempt'), 401, 'UNAUTHORIZED', /Join with a code/],
        [
          'forged token',
          () => request(app.server).get('/api/attempt').set(bearer(newAttemptToken())),
          401,
          'UNAUTHORIZED',
        ],
        [
          'malformed token',
          () => request(app.server).get('/api/attempt').set(bearer('x')),
          401,
          'UNAUTHORIZED',
        ],
        [
          'replayed token of a left attempt',
          () => request(app.server).get('/api/attempt').set(bearer(left)),
          401,
          'UNAUTHORIZED',
          /ended/,
        ],
        [
          'replayed token answers',
          answer(() => left, choice('isle-ferry-busiest-day', ['b'])),
          401,
          'UNAUTHORIZED',
        ],
        // consent
        [
          'consent not a boolean',
          post('/api/attempt/consent', () => fresh, { agree: 'yes' }),
          400,
          'VALIDATION_FAILED',
          /body\.agree/,
        ],
        [
          'consent without token',
          post('/api/attempt/consent', () => undefined, { agree: true }),
          401,
          'UNAUTHORIZED',
        ],
        [
          'decline after agreeing',
          post('/api/attempt/consent', () => token, { agree: false }),
          409,
          'STEP_NOT_CURRENT',
        ],
        // background
        [
          'background before consent',
          post('/api/attempt/background', () => fresh, { answers: { 'age-band': 'under-12' } }),
          409,
          'STEP_NOT_CURRENT',
        ],
        [
          'background question not in the study',
          post('/api/attempt/background', () => fresh, {
            answers: { 'age-band': 'under-12', income: 'high' },
          }),
          400,
          'VALIDATION_FAILED',
          /body\.answers\.income/,
        ],
        [
          'background option not in the question',
          post('/api/attempt/background', () => fresh, { answers: { 'age-band': '99' } }),
          400,
          'VALIDATION_FAILED',
          /body\.answers\.age-band/,
        ],
        [
          'background question left out',
          post('/api/attempt/background', () => fresh, { answers: {} }),
          400,
          'VALIDATION_FAILED',
          /prefer-not-to-say/,
        ],
        [
          'background answered twice, differently',
          post('/api/attempt/background', () => token, { answers: { 'age-band': '18-plus' } }),
          409,
          'STEP_NOT_CURRENT',
        ],
        // responses
        [
          'answer before consent',
          answer(() => fresh, choice('isle-ferry-busiest-day', ['b'])),
          409,
          'STEP_NOT_CURRENT',
        ],
        [
          'item not in the attempt',
          answer(() => token, choice('no-such-item', ['a'])),
          409,
          'ITEM_NOT_IN_ATTEMPT',
        ],
        [
          'item not shown yet',
          answer(() => token, choice('isle-ferry-quiet-days', ['mon'])),
          409,
          'ITEM_NOT_CURRENT',
        ],
        [
          'answer of the wrong kind',
          answer(() => token, { itemId: 'isle-ferry-busiest-day', answer: { kind: 'number', value: 3 } }),
          400,
          'VALIDATION_FAILED',
          /needs a choice answer/,
        ],
        [
          'option not in the item',
          answer(() => token, choice('isle-ferry-busiest-day', ['z'])),
          400,
          'VALIDATION_FAILED',
          /not one of this question's options/,
        ],
        [
          'two options for a single choice',
          answer(() => token, choice('isle-ferry-busiest-day', ['a', 'b'])),
          400,
          'VALIDATION_FAILED',
          /exactly one/,
        ],
        [
          'unknown answer kind',
          answer(() => token, { itemId: 'isle-ferry-busiest-day', answer: { kind: 'guess' } }),
          400,
          'VALIDATION_FAILED',
        ],
        [
          'extra field in the body',
          answer(() => token, { ...choice('isle-ferry-busiest-day', ['b']), score: 1 }),
          400,
          'VALIDATION_FAILED',
        ],
        [
          'negative client time',
          answer(() => token, { ...choice('isle-ferry-busiest-day', ['b']), clientMs: -5 }),
          400,
          'VALIDATION_FAILED',
          /clientMs/,
        ],
        [
          'answer to a finished attempt',
          answer(() => finished, {
            itemId: 'isle-ferry-busiest-day',
            answer: { kind: 'choice', optionIds: ['a'] },
          }),
          409,
          'ANSWER_ALREADY_STORED',
        ],
        [
          'body too large',
          answer(() => token, {
            itemId: 'isle-ferry-busiest-day',
            answer: { kind: 'text', text: 'x'.repeat(20_000) },
          }),
          413,
          'BODY_TOO_LARGE',
        ],
        [
          'not JSON',
          () =>
            request(app.server)
              .post('/api/attempt/responses')
              .set(bearer(token))
              .set('content-type', 'application/json')
              .send('{"itemId":'),
          400,
          'INVALID_JSON',
        ],
      ];

      it.each(cases)('%s → %i %s, nothing stored changes', async (_name, send, status, code, message) => {
        const before = await storedState(database);
        const reply = await send();
        expect(reply.status).toBe(status);
        expect(reply.body.error.code).toBe(code);
        expect(reply.body.error.message.length).toBeGreaterThan(10);
        if (message) expect(reply.body.error.message).toMatch(message);
        expect(await storedState(database)).toEqual(before);
      });

      it('an expired join code (closed study) → 410 STUDY_CLOSED, nothing stored changes', async () => {
        const before = await storedState(database);
        const reply = await request(app.server).post('/api/join').send({ code: closed.joinCode });
        expect(reply.status).toBe(410);
        expect(reply.body.error.code).toBe('STUDY_CLOSED');
        expect(await storedState(database)).toEqual(before);
      });

      it('answers after the time limit → 409 ATTEMPT_FINISHED; consent to a finished attempt too', async () => {
        const timed = await studyWithCohort(app, { title: 'Timed', timeLimitSeconds: 60 });
        const t = await joinAndConsent(app, timed.joinCode);
        // Move the consent an hour into the past (test-only SQL): the limit has passed.
        const hourAgo = new Date(Date.now() - 3_600_000).toISOString();
        await database.db
          .updateTable('attempts')
          .set({ consented_at: hourAgo })
          .where('consented_at', 'is not', null)
          .where('cohort_id', '=', timed.cohortId)
          .execute();
        const before = await storedState(database);
        const reply = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(t))
          .send(choice('isle-ferry-busiest-day', ['b']));
        expect(reply.status).toBe(409);
        expect(reply.body.error.code).toBe('ATTEMPT_FINISHED');
        expect(await storedState(database)).toEqual(before);
        // Reading the attempt settles it: finished, with no responses (the items are missing, not wrong).
        const state = await request(app.server).get('/api/attempt').set(bearer(t));
        expect(state.body.step).toBe('finished');
        expect(state.body.progress).toEqual({ answered: 0, total: 5 });
        const again = await storedState(database);
        const consent = await request(app.server)
          .post('/api/attempt/consent')
          .set(bearer(t))
          .send({ agree: true });
        expect(consent.status).toBe(409);
        expect(consent.body.error.code).toBe('ATTEMPT_FINISHED');
        expect(await storedState(database)).toEqual(again);
      });

      it('numbers outside the item range and text over its limit → 400 naming the field', async () => {
        const numeric = await studyWithCohort(app, {
          title: 'Numbers',
          pool: { itemIds: ['isle-ferry-monday-count', 'isle-ferry-why-tuesday'] },
        });
        const t = await joinAndConsent(app, numeric.joinCode);
        const before = await storedState(database);
        const tooBig = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(t))
          .send({ itemId: 'isle-ferry-monday-count', answer: { kind: 'number', value: 401 } });
        expect(tooBig.status).toBe(400);
        expect(tooBig.body.error.message).toBe('body.answer.value: must be at most 400');
        const negative = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(t))
          .send({ itemId: 'isle-ferry-monday-count', answer: { kind: 'number', value: -1 } });
        expect(negative.status).toBe(400);
        expect(negative.body.error.message).toBe('body.answer.value: must be at least 0');
        const notFinite = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(t))
          .set('content-type', 'application/json')
          .send('{"itemId":"isle-ferry-monday-count","answer":{"kind":"number","value":"12"}}');
        expect(notFinite.status).toBe(400);
        await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(t))
          .send({ itemId: 'isle-ferry-monday-count', answer: { kind: 'number', value: 120 } });
        const after = await storedState(database);
        const long = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(t))
          .send({ itemId: 'isle-ferry-why-tuesday', answer: { kind: 'text', text: 'y'.repeat(201) } });
        expect(long.status).toBe(400);
        expect(long.body.error.message).toBe('body.answer.text: must be at most 200 characters');
        const blank = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(t))
          .send({ itemId: 'isle-ferry-why-tuesday', answer: { kind: 'text', text: '   ' } });
        expect(blank.status).toBe(400);
        expect(await storedState(database)).toEqual(after);
        expect((after as { responses: unknown[] }).responses.length).toBe(
          (before as { responses: unknown[] }).responses.length + 1,
        );
      });
    },
  );
}
