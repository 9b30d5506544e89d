/**
 * A third read: with two raters, an answer scored 0 and 2 goes back to the queue for a third person,
 * whose score decides (the median of the three; server/delivery/final-rubric-score.ts). Over the HTTP
 * API on both engines, with the test bank's short-text item. Invented answers.
 */
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createAccessToken } from '../../server/storage/token-repository.js';
import { signInToConsole } from '../helpers/console-session.js';
import { admin, bearer, deliveryApp, joinAndConsent, studyWithCohort } from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const rubricItem = 'isle-ferry-why-tuesday';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: third read of a rubric answer`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let second: { Authorization: string };
    let third: { Authorization: string };
    let thirdToken: string;
    let fourth: { Authorization: string };
    let studyId: string;
    /** Response id of each text answer, by its text. */
    let entryOf: Map<string, string>;

    /** A two-rater study whose respondents wrote `texts` (one each); its answers' entry ids by text. */
    async function studyWithTextAnswers(texts: readonly string[]) {
      const study = await studyWithCohort(app, { title: 'Ferry notes', rubricRaters: 2, maxItems: 5 });
      for (const text of texts) {
        const token = await joinAndConsent(app, study.joinCode);
        let state = (await request(app.server).get('/api/attempt').set(bearer(token))).body;
        while (state.step === 'item') {
          const itemId = state.item.itemId as string;
          const answer = itemId === rubricItem ? { kind: 'text', text } : { kind: 'dont-know' };
          const reply = await request(app.server)
            .post('/api/attempt/responses')
            .set(bearer(token))
            .send({ itemId, answer });
          expect(reply.status, JSON.stringify(reply.body)).toBe(201);
          state = reply.body.attempt;
        }
      }
      const queue = await request(app.server)
        .get(`/api/admin/studies/${study.studyId}/scoring-queue`)
        .set(admin);
      const entries = new Map<string, string>(
        queue.body.entries.map((entry: { text: string; entryId: string }) => [entry.text, entry.entryId]),
      );
      expect(entries.size).toBe(texts.length);
      return { studyId: study.studyId, entryOf: entries };
    }

    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database);
      second = bearer((await createAccessToken(database.db, 'admin', 'second reader')).token);
      thirdToken = (await createAccessToken(database.db, 'admin', 'third reader')).token;
      third = bearer(thirdToken);
      fourth = bearer((await createAccessToken(database.db, 'admin', 'fourth reader')).token);
      ({ studyId, entryOf } = await studyWithTextAnswers([
        'Market day on the island.',
        'Because of the tide table.',
      ]));
    }, 60_000);

    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    const score = (who: { Authorization: string }, entryId: string, value: number) =>
      request(app.server).post(`/api/admin/scoring-queue/${entryId}/scores`).set(who).send({ score: value });
    const storedScore = async (entryId: string) =>
      (
        await database.db
          .selectFrom('responses')
          .select('score')
          .where('id', '=', entryId)
          .executeTakeFirstOrThrow()
      ).score;
    const queueOf = async (who: { Authorization: string }) =>
      (await request(app.server).get(`/api/admin/studies/${studyId}/scoring-queue`).set(who)).body as {
        remaining: number;
        entries: { entryId: string; scoresGiven: number; scoresNeeded: number }[];
      };

    it('0 and 2 ask for a third read; 0 and 1 resolve at once', async () => {
      const apart = entryOf.get('Market day on the island.')!;
      const close = entryOf.get('Because of the tide table.')!;
      expect((await score(admin, apart, 0)).status).toBe(201);
      expect((await score(admin, close, 0)).status).toBe(201);

      const apartSecond = await score(second, apart, 2);
      expect(apartSecond.status, JSON.stringify(apartSecond.body)).toBe(201);
      expect(apartSecond.body).toMatchObject({ scoresGiven: 2, scoresNeeded: 3, finalScore: null });
      expect(await storedScore(apart)).toBeNull();

      const closeSecond = await score(second, close, 1);
      expect(closeSecond.body).toMatchObject({ scoresGiven: 2, scoresNeeded: 2, finalScore: 0 });
      expect(Number(await storedScore(close))).toBe(0);

      // Only a third person sees it: not the two who scored it.
      expect((await queueOf(admin)).remaining).toBe(0);
      expect((await queueOf(second)).remaining).toBe(0);
      const thirdQueue = await queueOf(third);
      expect(thirdQueue.remaining).toBe(1);
      expect(thirdQueue.entries[0]).toMatchObject({ entryId: apart, scoresGiven: 2, scoresNeeded: 3 });
      const cookie = await signInToConsole(app, thirdToken);
      const page = await request(app.server).get(`/console/scoring?study=${studyId}`).set('cookie', cookie);
      expect(page.status).toBe(200);
      expect(page.text).toContain('Third read: two people scored this answer 0 and 2.');
      expect(page.text).toContain('Market day on the island.');

      // The third score decides: the median of 0, 2 and 2 is 2 (the old rule would have stored 1).
      const decided = await score(third, apart, 2);
      expect(decided.body).toMatchObject({ scoresGiven: 3, scoresNeeded: 3, finalScore: 2 });
      expect(Number(await storedScore(apart))).toBe(2);
      expect((await queueOf(fourth)).remaining).toBe(0);

      const late = await score(fourth, apart, 1);
      expect(late.status).toBe(409);
      expect(late.body.error.code).toBe('RUBRIC_SCORES_COMPLETE');
      expect(late.body.error.details.scoresNeeded).toBe(3);
      // The resolved pair gets no third score either.
      const lateClose = await score(third, close, 2);
      expect(lateClose.status).toBe(409);
      expect(lateClose.body.error.details.scoresNeeded).toBe(2);
    });

    it('lowering the study to one rater settles the answers waiting for a second or third score', async () => {
      const texts = ['Ferries rest on Tuesdays.', 'Nobody travels then.', 'The pier is repaired.'];
      const lowered = await studyWithTextAnswers(texts);
      const [once, apart, open] = texts.map((text) => lowered.entryOf.get(text)!);
      expect((await score(admin, once!, 2)).status).toBe(201);
      expect((await score(admin, apart!, 0)).status).toBe(201);
      expect((await score(second, apart!, 2)).body).toMatchObject({ scoresNeeded: 3, finalScore: null });

      const study = await request(app.server).get(`/api/admin/studies/${lowered.studyId}`).set(admin);
      const changed = await request(app.server)
        .patch(`/api/admin/studies/${lowered.studyId}`)
        .set(admin)
        .send({ settings: { ...study.body.settings, rubricRaters: 1 } });
      expect(changed.status, JSON.stringify(changed.body)).toBe(200);
      // One score each is what the study asks for now: the first score stands.
      expect(Number(await storedScore(once!))).toBe(2);
      expect(Number(await storedScore(apart!))).toBe(0);
      // The unscored answer still waits, for one score, in everyone's queue.
      expect(await storedScore(open!)).toBeNull();
      const queue = await request(app.server)
        .get(`/api/admin/studies/${lowered.studyId}/scoring-queue`)
        .set(third);
      expect(queue.body.entries.map((e: { entryId: string }) => e.entryId)).toEqual([open]);
      expect(queue.body.scoresNeeded).toBe(1);
      const audit = await database.db
        .selectFrom('audit_log')
        .select('details')
        .where('action', '=', 'study.update')
        .where('subject', '=', lowered.studyId)
        .execute();
      expect(audit.map((a) => JSON.parse(a.details).rubricAnswersResolved)).toEqual([2]);
    });
  });
}
