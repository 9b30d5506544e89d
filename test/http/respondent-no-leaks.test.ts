import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ItemBank } from '../../server/bank/load-bank.js';
import { admin, ageBand, bearer, deliveryApp, studyWithCohort } from '../helpers/delivery-fixture.js';
import { loadTestBank } from '../helpers/test-bank.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** Every property name a respondent reply may carry (AttemptState, join reply, response reply, errors). */
const allowedKeys = new Set([
  'token',
  'attempt',
  'status',
  'step',
  'study',
  'title',
  'consentText',
  'kiosk',
  'idleSeconds',
  'endSummary',
  'progress',
  'answered',
  'total',
  'background',
  'id',
  'prompt',
  'options',
  'text',
  'item',
  'itemId',
  'version',
  'chartSvg',
  'responseKind',
  'unit',
  'min',
  'max',
  'maxLength',
  'position',
  'error',
  'code',
  'message',
  'details',
  'field',
  'problems',
  'problem',
]);

function propertyNames(value: unknown, into = new Set<string>()): Set<string> {
  if (Array.isArray(value)) for (const v of value) propertyNames(v, into);
  else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      into.add(k);
      propertyNames(v, into);
    }
  }
  return into;
}

/**
 * Walks every respondent route for two attempts (success and refusal answers alike) and checks that
 * no reply carries a key, score, rationale, rubric, feature, option value, or the other attempt's data.
 */
for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(
    `${engine.engine}: respondent replies leak nothing`,
    () => {
      let database: TestDatabase;
      let app: FastifyInstance;
      let bank: ItemBank;
      const bodies: { who: 'a' | 'b'; route: string; text: string; body: unknown }[] = [];

      beforeAll(async () => {
        database = await engine.open();
        bank = await loadTestBank();
        app = await deliveryApp(database, bank);
        const { joinCode } = await studyWithCohort(app, { background: [ageBand] });
        const record = (who: 'a' | 'b', route: string, reply: request.Response) =>
          bodies.push({ who, route, text: reply.text, body: reply.body });

        const tokens: Record<'a' | 'b', string> = { a: '', b: '' };
        for (const who of ['a', 'b'] as const) {
          const joined = await request(app.server).post('/api/join').send({ code: joinCode });
          record(who, 'join', joined);
          tokens[who] = joined.body.token;
          const t = bearer(tokens[who]);
          record(who, 'get', await request(app.server).get('/api/attempt').set(t));
          record(
            who,
            'background-early',
            await request(app.server).post('/api/attempt/background').set(t).send({ answers: {} }),
          );
          record(
            who,
            'consent',
            await request(app.server).post('/api/attempt/consent').set(t).send({ agree: true }),
          );
          const band = who === 'a' ? 'under-12' : '18-plus';
          record(
            who,
            'background',
            await request(app.server)
              .post('/api/attempt/background')
              .set(t)
              .send({ answers: { 'age-band': band } }),
          );
          let state = (await request(app.server).get('/api/attempt').set(t)).body;
          while (state.step === 'item') {
            const itemId = state.item.itemId;
            const entry = bank.byId.get(itemId)!;
            const answer =
              entry.response.kind === 'numeric'
                ? { kind: 'number', value: 120 }
                : entry.response.kind === 'short-text'
                  ? { kind: 'text', text: 'rain on Tuesday' }
                  : { kind: 'choice', optionIds: [...entry.resolvedKey.optionIds] };
            const stored = await request(app.server)
              .post('/api/attempt/responses')
              .set(t)
              .send({ itemId, answer });
            record(who, 'response', stored);
            record(
              who,
              'response-again',
              await request(app.server).post('/api/attempt/responses').set(t).send({ itemId, answer }),
            );
            record(
              who,
              'response-changed',
              await request(app.server)
                .post('/api/attempt/responses')
                .set(t)
                .send({ itemId, answer: { kind: 'dont-know' } }),
            );
            state = stored.body.attempt;
          }
          record(who, 'finished', await request(app.server).get('/api/attempt').set(t));
          record(who, 'leave', await request(app.server).post('/api/attempt/leave').set(t));
          record(who, 'after-leave', await request(app.server).get('/api/attempt').set(t));
        }
        // A visit to each refusal path with a bad token, too.
        record(
          'a',
          'forged',
          await request(app.server)
            .get('/api/attempt')
            .set(bearer('A'.repeat(22))),
        );
        record('a', 'unknown-code', await request(app.server).post('/api/join').send({ code: 'QQQQ-22' }));
        expect(tokens.a).not.toBe(tokens.b);
        expect((await request(app.server).get(`/api/admin/studies`).set(admin)).status).toBe(200);
      });
      afterAll(async () => {
        await app?.close();
        await database?.cleanup();
      });

      it('walked every respondent route', () => {
        expect(new Set(bodies.map((b) => b.route))).toEqual(
          new Set([
            'join',
            'get',
            'background-early',
            'consent',
            'background',
            'response',
            'response-again',
            'response-changed',
            'finished',
            'leave',
            'after-leave',
            'forged',
            'unknown-code',
          ]),
        );
      });

      it('carries only the documented properties (no key, score, rationale, features, values)', () => {
        const names = new Set<string>();
        for (const { body } of bodies) propertyNames(body, names);
        expect([...names].filter((n) => !allowedKeys.has(n))).toEqual([]);
      });

      it('contains no rationale, rubric text, option value or keyed value of any item', () => {
        const text = bodies.map((b) => b.text).join('\n');
        for (const item of bank.items) {
          expect(text).not.toContain(item.rationale);
          if (item.response.kind === 'short-text')
            for (const level of item.response.rubric) expect(text).not.toContain(level.description);
          if (item.response.kind === 'single-choice' || item.response.kind === 'multiple-choice') {
            for (const option of item.response.options)
              if (option.value !== undefined)
                expect(text).not.toContain(`"value":${JSON.stringify(option.value)}`);
            // The keyed option ids never appear as a stored or expected answer.
            expect(text).not.toContain(`"optionIds":${JSON.stringify(item.resolvedKey.optionIds)}`);
          }
          if (item.resolvedKey.value !== null)
            expect(text).not.toContain(`"value":${item.resolvedKey.value}`);
          for (const name of Object.keys(item.features)) expect(text).not.toContain(`"${name}"`);
        }
        for (const word of [
          '"score"',
          '"correct"',
          '"key"',
          '"resolvedKey"',
          '"rationale"',
          '"features"',
          '"tolerance"',
          '"rubric"',
        ])
          expect(text).not.toContain(word);
      });

      it("never shows one attempt another attempt's token, ids or background answers", async () => {
        const attempts = await database.db
          .selectFrom('attempts')
          .select(['id', 'token_hash', 'background'])
          .execute();
        const responseIds = (await database.db.selectFrom('responses').select('id').execute()).map(
          (r) => r.id,
        );
        const tokens = {
          a: (bodies.find((b) => b.who === 'a' && b.route === 'join')!.body as { token: string }).token,
          b: (bodies.find((b) => b.who === 'b' && b.route === 'join')!.body as { token: string }).token,
        };
        const textOf = (who: 'a' | 'b') =>
          bodies
            .filter((b) => b.who === who && b.route !== 'join')
            .map((b) => b.text)
            .join('\n');
        for (const who of ['a', 'b'] as const) {
          const other = who === 'a' ? 'b' : 'a';
          const text = textOf(who);
          expect(text).not.toContain(tokens[other]);
          expect(text).not.toContain(tokens[who]); // the token is only in the join reply
          for (const attempt of attempts) {
            expect(text).not.toContain(attempt.id);
            expect(text).not.toContain(attempt.token_hash);
          }
          for (const id of responseIds) expect(text).not.toContain(id);
        }
        // Background answers are never echoed back at all.
        const all = bodies.map((b) => b.text).join('\n');
        // (the questions list option ids; an answers map would be keyed by the question id)
        expect(all.includes('"age-band":')).toBe(false);
        expect(attempts.map((a) => JSON.parse(a.background)['age-band']).sort()).toEqual([
          '18-plus',
          'under-12',
        ]);
      });
    },
  );
}
