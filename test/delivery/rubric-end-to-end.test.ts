import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { agreementTable } from '../../server/scoring/agreement/agreement-table.js';
import { weightedKappa } from '../../server/scoring/agreement/weighted-kappa.js';
import { estimateAbilityPcm } from '../../server/scoring/rasch/estimate-ability-pcm.js';
import { pcmCategoryProbabilities } from '../../server/scoring/rasch/pcm-category-probabilities.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';
import { createAccessToken } from '../../server/storage/token-repository.js';
import { admin, bearer, deliveryApp, joinAndConsent, studyWithCohort } from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/**
 * A study with the test bank's short-text item (isle-ferry-why-tuesday) and four right/wrong items:
 * 60 invented respondents answer over the HTTP API, two raters score every text answer over the
 * admin API, and the item is calibrated under the partial credit model. Invented data (seed 8).
 */
const rubricItem = 'isle-ferry-why-tuesday';
const generating: Record<string, number> = {
  'isle-ferry-busiest-day': -0.6,
  'isle-ferry-monday-count': 0.1,
  'isle-ferry-quiet-days': 0.7,
  'town-ferry-quietest-day': -0.3,
};
const rubricSteps = [-0.6, 0.6];
const rightAnswer: Record<string, object> = {
  'isle-ferry-busiest-day': { kind: 'choice', optionIds: ['b'] },
  'isle-ferry-monday-count': { kind: 'number', value: 122 },
  'isle-ferry-quiet-days': { kind: 'choice', optionIds: ['thu', 'mon'] },
  'town-ferry-quietest-day': { kind: 'choice', optionIds: ['d'] },
};
const wrongAnswer: Record<string, object> = {
  'isle-ferry-busiest-day': { kind: 'choice', optionIds: ['a'] },
  'isle-ferry-monday-count': { kind: 'number', value: 300 },
  'isle-ferry-quiet-days': { kind: 'choice', optionIds: ['thu'] },
  'town-ferry-quietest-day': { kind: 'choice', optionIds: ['a'] },
};
const respondents = 60;

interface Person {
  ability: number;
  raw: number;
  rubric: number;
}

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: rubric-scored item end to end`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let secondRater: { Authorization: string };
    let thirdRater: { Authorization: string };
    let studyId: string;
    /** The score each text was written to deserve (the first rater gives it; the second differs at times). */
    const deserved = new Map<string, number>();

    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database);
      secondRater = bearer((await createAccessToken(database.db, 'admin', 'second reader')).token);
      thirdRater = bearer((await createAccessToken(database.db, 'admin', 'third reader')).token);
      const study = await studyWithCohort(app, { title: 'Ferry notes', rubricRaters: 2, maxItems: 5 });
      studyId = study.studyId;
      const random = seededRandom(8);
      for (let p = 0; p < respondents; p++) {
        const theta = random.normal();
        const token = await joinAndConsent(app, study.joinCode);
        let state = (await request(app.server).get('/api/attempt').set(bearer(token))).body;
        while (state.step === 'item') {
          const itemId = state.item.itemId as string;
          let answer: object;
          if (itemId === rubricItem) {
            const probabilities = pcmCategoryProbabilities(theta, rubricSteps);
            const u = random.uniform();
            const score = u < probabilities[0]! ? 0 : u < probabilities[0]! + probabilities[1]! ? 1 : 2;
            const text = `Maybe Tuesday is market day, note ${p}.`;
            deserved.set(text, score);
            answer = { kind: 'text', text };
          } else {
            const right = random.uniform() < 1 / (1 + Math.exp(generating[itemId]! - theta));
            answer = right ? rightAnswer[itemId]! : wrongAnswer[itemId]!;
          }
          const reply = await request(app.server)
            .post('/api/attempt/responses')
            .set(bearer(token))
            .send({ itemId, answer });
          expect(reply.status, JSON.stringify(reply.body)).toBe(201);
          state = reply.body.attempt;
        }
        expect(state.step).toBe('finished');
      }
    }, 120_000);

    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    const persons = async (): Promise<Map<string, Person>> => {
      const reply = await request(app.server)
        .get(`/api/admin/studies/${studyId}/estimates/persons.json`)
        .set(admin);
      expect(reply.status, JSON.stringify(reply.body)).toBe(200);
      return new Map(
        (reply.body as { attempt_id: string; ability: number; raw_score: number }[]).map((row) => [
          row.attempt_id,
          { ability: row.ability, raw: row.raw_score, rubric: 0 },
        ]),
      );
    };
    const calibrate = async () => {
      const reply = await request(app.server).post(`/api/admin/studies/${studyId}/calibrations`).set(admin);
      expect(reply.status, JSON.stringify(reply.body)).toBe(201);
      return reply.body as { itemsCalibrated: number };
    };
    const scoreCount = async () =>
      Number(
        (
          await database.db
            .selectFrom('rubric_scores')
            .select((eb) => eb.fn.countAll().as('n'))
            .executeTakeFirstOrThrow()
        ).n,
      );

    let before: Map<string, Person>;
    const firstScores: number[] = [];
    const secondScores: number[] = [];

    it('leaves unscored text answers out of the calibration (missing, not wrong)', async () => {
      expect((await calibrate()).itemsCalibrated).toBe(4);
      before = await persons();
      expect(before.size).toBe(respondents);
      // Rasch: the raw score is sufficient, so equal raw scores on the same four items give equal estimates.
      const byRaw = new Map<number, number>();
      for (const person of before.values()) {
        const seen = byRaw.get(person.raw);
        if (seen !== undefined) expect(person.ability).toBeCloseTo(seen, 9);
        byRaw.set(person.raw, person.ability);
      }
    });

    it('shows the queue blind: prompt, rubric and text, no attempt, cohort or background', async () => {
      const reply = await request(app.server)
        .get(`/api/admin/studies/${studyId}/scoring-queue?limit=3`)
        .set(admin);
      expect(reply.status, JSON.stringify(reply.body)).toBe(200);
      expect(reply.body.remaining).toBe(respondents);
      expect(reply.body.scoresNeeded).toBe(2);
      expect(reply.body.entries).toHaveLength(3);
      const entry = reply.body.entries[0];
      expect(Object.keys(entry).sort()).toEqual([
        'entryId',
        'itemId',
        'prompt',
        'rubric',
        'scoresGiven',
        'scoresNeeded',
        'text',
      ]);
      expect(entry.itemId).toBe(rubricItem);
      expect(entry.rubric.map((level: { score: number }) => level.score)).toEqual([0, 1, 2]);
      expect(deserved.has(entry.text)).toBe(true);
      const attemptIds = [...before.keys()];
      expect(attemptIds.some((id) => JSON.stringify(reply.body).includes(id))).toBe(false);
    });

    it('refuses a score outside the rubric with 400 naming body.score, storing nothing', async () => {
      const queue = await request(app.server).get(`/api/admin/studies/${studyId}/scoring-queue`).set(admin);
      const entryId = queue.body.entries[0].entryId;
      const storedBefore = await scoreCount();
      for (const score of [3, -1, 1.5, '2']) {
        const reply = await request(app.server)
          .post(`/api/admin/scoring-queue/${entryId}/scores`)
          .set(admin)
          .send({ score });
        expect(reply.status).toBe(400);
        expect(reply.body.error.code).toBe('VALIDATION_FAILED');
        expect(JSON.stringify(reply.body.error)).toContain('body.score');
      }
      const unknown = await request(app.server)
        .post('/api/admin/scoring-queue/no-such-entry/scores')
        .set(admin)
        .send({ score: 1 });
      expect(unknown.status).toBe(404);
      expect(unknown.body.error.code).toBe('SCORING_ENTRY_NOT_FOUND');
      expect(await scoreCount()).toBe(storedBefore);
    });

    it('takes two raters per answer, refuses a second score by the same rater and a third rater (409)', async () => {
      // First rater (ADMIN_TOKEN, label admin-token): the deserved score, oldest answer first.
      for (let round = 0; round < 20; round++) {
        const queue = await request(app.server)
          .get(`/api/admin/studies/${studyId}/scoring-queue?limit=50`)
          .set(admin);
        if (queue.body.entries.length === 0) break;
        for (const entry of queue.body.entries) {
          const score = deserved.get(entry.text)!;
          const reply = await request(app.server)
            .post(`/api/admin/scoring-queue/${entry.entryId}/scores`)
            .set(admin)
            .send({ score });
          expect(reply.status, JSON.stringify(reply.body)).toBe(201);
          expect(reply.body).toMatchObject({ scoresGiven: 1, scoresNeeded: 2, finalScore: null });
        }
      }
      expect(await scoreCount()).toBe(respondents);
      // The first rater's queue is now empty; the second rater still sees every answer.
      const emptied = await request(app.server).get(`/api/admin/studies/${studyId}/scoring-queue`).set(admin);
      expect(emptied.body).toMatchObject({ remaining: 0, entries: [] });

      const again = await request(app.server)
        .get(`/api/admin/studies/${studyId}/scoring-queue?limit=50`)
        .set(secondRater);
      expect(again.body.remaining).toBe(respondents);
      const twice = await request(app.server)
        .post(`/api/admin/scoring-queue/${again.body.entries[0].entryId}/scores`)
        .set(admin)
        .send({ score: 1 });
      expect(twice.status).toBe(409);
      expect(twice.body.error.code).toBe('RUBRIC_ALREADY_SCORED');
      expect(twice.body.error.details.field).toBe('params.entryId');
      expect(await scoreCount()).toBe(respondents);

      // Second rater: one step off on every fourth answer (down from 2, else up), so kappa is below 1.
      let k = 0;
      for (let round = 0; round < 20; round++) {
        const queue = await request(app.server)
          .get(`/api/admin/studies/${studyId}/scoring-queue?limit=50`)
          .set(secondRater);
        if (queue.body.entries.length === 0) break;
        for (const entry of queue.body.entries) {
          const first = deserved.get(entry.text)!;
          const score = k++ % 4 === 3 ? (first === 2 ? 1 : first + 1) : first;
          const reply = await request(app.server)
            .post(`/api/admin/scoring-queue/${entry.entryId}/scores`)
            .set(secondRater)
            .send({ score });
          expect(reply.status, JSON.stringify(reply.body)).toBe(201);
          // final = the mean rounded down (server/delivery/final-rubric-score.ts)
          expect(reply.body).toMatchObject({ scoresGiven: 2, finalScore: Math.floor((first + score) / 2) });
          firstScores.push(first);
          secondScores.push(score);
          if (k === 1) {
            const third = await request(app.server)
              .post(`/api/admin/scoring-queue/${entry.entryId}/scores`)
              .set(thirdRater)
              .send({ score: 0 });
            expect(third.status).toBe(409);
            expect(third.body.error.code).toBe('RUBRIC_SCORES_COMPLETE');
          }
        }
      }
      expect(secondScores).toHaveLength(respondents);
      expect(await scoreCount()).toBe(2 * respondents);
      const audit = await database.db
        .selectFrom('audit_log')
        .selectAll()
        .where('action', '=', 'rubric.score')
        .execute();
      expect(audit).toHaveLength(2 * respondents);
      expect(new Set(audit.map((a) => a.actor))).toEqual(new Set(['admin-token', 'second reader']));
      expect(audit.some((a) => a.details.includes('market'))).toBe(false);
    }, 120_000);

    it('calibrates the item with partial credit steps, and scored answers move person estimates', async () => {
      expect((await calibrate()).itemsCalibrated).toBe(5);
      const report = await request(app.server).get(`/api/admin/studies/${studyId}/report`).set(admin);
      expect(report.status, JSON.stringify(report.body)).toBe(200);
      expect(report.body.calibration.identification).toBe('mean-item-location');
      const rubric = report.body.rubric.items.find((i: { itemId: string }) => i.itemId === rubricItem);
      expect(rubric.steps).toHaveLength(2);
      const item = report.body.items.find((i: { itemId: string }) => i.itemId === rubricItem);
      // The item's difficulty is its location, the mean of its two steps (Masters 1982).
      expect(item.difficulty).toBeCloseTo((rubric.steps[0] + rubric.steps[1]) / 2, 2);
      // Data generated by the partial credit model fit it: partial credit mean-squares near 1.
      expect(item.infit).toBeGreaterThan(0.6);
      expect(item.infit).toBeLessThan(1.4);

      const after = await persons();
      let pairs = 0;
      for (const [id, person] of after) {
        const earlier = before.get(id)!;
        person.rubric = person.raw - earlier.raw;
        expect(person.rubric).toBeGreaterThanOrEqual(0);
        expect(person.rubric).toBeLessThanOrEqual(2);
      }
      // Same answers to the right/wrong items (same raw score, so the same estimate before scoring):
      // a higher rubric score now gives a strictly higher estimate.
      for (const [idA, a] of after)
        for (const [idB, b] of after) {
          if (before.get(idA)!.raw !== before.get(idB)!.raw || a.rubric <= b.rubric) continue;
          expect(before.get(idA)!.ability).toBeCloseTo(before.get(idB)!.ability, 9);
          expect(a.ability).toBeGreaterThan(b.ability);
          pairs++;
        }
      expect(pairs).toBeGreaterThan(20);
      // Each estimate is the partial credit WLE on the reported parameters (Warm 1989; the total score
      // is sufficient, so any split of it between items gives the same estimate).
      const dichotomous = (report.body.items as { itemId: string; difficulty: number }[])
        .filter((i) => i.itemId !== rubricItem)
        .map((i) => [i.difficulty]);
      expect(dichotomous).toHaveLength(4);
      for (const person of after.values()) {
        const dichotomousRaw = person.raw - person.rubric;
        const scores = [...dichotomous.map((_, k) => (k < dichotomousRaw ? 1 : 0)), person.rubric];
        const expected = estimateAbilityPcm([...dichotomous, rubric.steps], scores);
        if (expected.kind !== 'estimate') throw new Error('the WLE is finite for every score');
        expect(person.ability).toBeCloseTo(expected.estimate, 2);
      }
    }, 120_000);

    it('reports quadratic-weighted kappa equal to weightedKappa on the same table', async () => {
      const report = await request(app.server).get(`/api/admin/studies/${studyId}/report`).set(admin);
      const rubric = report.body.rubric.items.find((i: { itemId: string }) => i.itemId === rubricItem);
      const table = agreementTable(firstScores, secondScores, 3);
      const expected = weightedKappa(table, 'quadratic');
      expect(rubric.doubleScored).toBe(respondents);
      expect(rubric.table).toEqual(Array.from(table));
      expect(rubric.kappa).toBeCloseTo(expected.kappa, 3);
      expect(rubric.kappaInterval.lower).toBeCloseTo(expected.confidenceInterval[0], 3);
      expect(rubric.kappaInterval.upper).toBeCloseTo(expected.confidenceInterval[1], 3);
      // A quarter of the answers one step apart: agreement is high but not perfect, and the quadratic
      // weights credit near-misses, so the weighted kappa exceeds the unweighted one.
      expect(rubric.kappa).toBeLessThan(1);
      expect(rubric.kappa).toBeGreaterThan(weightedKappa(table, 'none').kappa);
      expect(rubric.exactAgreement).toBeCloseTo(45 / 60, 3);

      const csv = await request(app.server).get(`/api/admin/studies/${studyId}/report.csv`).set(admin);
      expect(csv.text).toContain(`rubric,,${rubricItem},weighted_kappa,${rubric.kappa},`);
      const page = await request(app.server).get(`/studies/${studyId}/report`).set(admin);
      expect(page.status).toBe(200);
      expect(page.text).toContain(`data-key="rubric||${rubricItem}|weighted_kappa"`);
    });
  });
}
