import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { advance, nextStep, startAdaptiveState } from '../../server/delivery/adaptive/adaptive-state.js';
import { adaptiveSeedOf, loadAdaptiveDelivery } from '../../server/delivery/adaptive-delivery.js';
import { deliveryBankFrom } from '../../server/delivery/bank-adapter.js';
import { studySettingsSchema } from '../../server/delivery/study-settings.js';
import { calibratedAdaptiveStudy, stepDifficultyOf, stepItems } from '../helpers/adaptive-study.js';
import { bruteForceEap } from '../helpers/brute-force-eap.js';
import { admin, bearer, deliveryApp, storedState, studyWithCohort } from '../helpers/delivery-fixture.js';
import { pierPilotBody } from '../helpers/pilot-chart-body.js';
import { storedAttempt } from '../helpers/stored-attempt.js';
import { loadTestBank } from '../helpers/test-bank.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: pilots inside live attempts`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;

    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database, await loadTestBank(stepItems()));
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    async function addPilot(studyId: string, prompt?: string): Promise<string> {
      const added = await request(app.server)
        .post(`/api/admin/studies/${studyId}/pilots`)
        .set(admin)
        .send(pierPilotBody(prompt));
      expect(added.status).toBe(201);
      return added.body.id as string;
    }

    /**
     * Joins, agrees and answers every screen: bank items right exactly when easier than `ability`,
     * pilots with `pilotOption`. Returns the screens in order and the token.
     */
    async function runAttempt(joinCode: string, ability: number, pilotOption: string) {
      const joined = await request(app.server).post('/api/join').send({ code: joinCode });
      expect(joined.status).toBe(201);
      const token: string = joined.body.token;
      let state = (
        await request(app.server).post('/api/attempt/consent').set(bearer(token)).send({ agree: true })
      ).body;
      const screens: { itemId: string; pilot: boolean; progress: { answered: number; total: number } }[] = [];
      while (state.step === 'item') {
        const pilot = state.item.chartImage !== undefined;
        screens.push({ itemId: state.item.itemId, pilot, progress: state.progress });
        const optionId = pilot ? pilotOption : stepDifficultyOf(state.item.itemId) < ability ? 'b' : 'a';
        const reply = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send({ itemId: state.item.itemId, answer: { kind: 'choice', optionIds: [optionId] } });
        expect(reply.status, JSON.stringify(reply.body)).toBe(201);
        state = reply.body.attempt;
        if (screens.length > 60) throw new Error('runaway attempt');
      }
      return { token, screens, state };
    }

    /** A study calibrated with the invented difficulties (cohort N(0.3, 0.9²)), then made adaptive. */
    const adaptiveStudy = (settings: Record<string, unknown>) =>
      calibratedAdaptiveStudy(app, database, 10, { title: 'Ferry steps', design: 'adaptive', ...settings });

    it('a retired pilot is given to no new attempt; one that joined before still shows it, and its answers stay', async () => {
      const study = await studyWithCohort(app, { maxItems: 4 });
      const pilotId = await addPilot(study.studyId);
      // Joined before the retirement: the pilot is in its form.
      const early = await request(app.server).post('/api/join').send({ code: study.joinCode });
      expect(early.status).toBe(201);
      expect((await storedAttempt(database, early.body.token)).form.pilots).toHaveLength(1);
      const finished = await runAttempt(study.joinCode, 0.2, 'north');
      expect(finished.screens.filter((s) => s.pilot)).toHaveLength(1);

      const retired = await request(app.server)
        .post(`/api/admin/studies/${study.studyId}/pilots/${pilotId}/retire`)
        .set(admin);
      expect(retired.status, JSON.stringify(retired.body)).toBe(200);
      expect(retired.body).toMatchObject({ id: pilotId, status: 'retired' });
      // Again: the same answer, one audit entry only.
      const again = await request(app.server)
        .post(`/api/admin/studies/${study.studyId}/pilots/${pilotId}/retire`)
        .set(admin);
      expect(again.status).toBe(200);
      const audits = await database.db
        .selectFrom('audit_log')
        .selectAll()
        .where('action', '=', 'pilot.retire')
        .where('subject', '=', study.studyId)
        .execute();
      expect(audits).toHaveLength(1);

      for (let i = 0; i < 5; i++) {
        const { screens, state } = await runAttempt(study.joinCode, 0.2, 'north');
        expect(state.step).toBe('finished');
        expect(screens.some((s) => s.pilot)).toBe(false);
      }
      // The attempt that joined before finishes with the pilot in its place.
      let state = (
        await request(app.server)
          .post('/api/attempt/consent')
          .set(bearer(early.body.token))
          .send({ agree: true })
      ).body;
      let sawPilot = false;
      while (state.step === 'item') {
        const pilot = state.item.chartImage !== undefined;
        sawPilot ||= pilot;
        const reply = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(early.body.token))
          .send({
            itemId: state.item.itemId,
            answer: { kind: 'choice', optionIds: [pilot ? 'south' : 'a'] },
          });
        expect(reply.status, JSON.stringify(reply.body)).toBe(201);
        state = reply.body.attempt;
      }
      expect(sawPilot).toBe(true);
      const answers = await database.db
        .selectFrom('pilot_responses')
        .select('id')
        .where('pilot_id', '=', pilotId)
        .execute();
      expect(answers).toHaveLength(2);

      const unknown = await request(app.server)
        .post(`/api/admin/studies/${study.studyId}/pilots/no-such-pilot/retire`)
        .set(admin);
      expect(unknown.status).toBe(404);
      expect(unknown.body.error.code).toBe('PILOT_NOT_FOUND');
      const other = await studyWithCohort(app, { maxItems: 4 });
      const elsewhere = await request(app.server)
        .post(`/api/admin/studies/${other.studyId}/pilots/${pilotId}/retire`)
        .set(admin);
      expect(elsewhere.status).toBe(404);
    });

    it('fixed form: the pilot is shown at its drawn place, looks like any chart, and is stored apart', async () => {
      const study = await studyWithCohort(app, { maxItems: 6 });
      const pilotId = await addPilot(study.studyId);
      const { token, screens, state } = await runAttempt(study.joinCode, 0.2, 'north');
      expect(state.step).toBe('finished');
      const { id, form, status } = await storedAttempt(database, token);
      expect(status).toBe('finished');
      expect(form.pilots).toHaveLength(1);
      const at = form.pilots![0]!.at;
      expect(at).toBeGreaterThanOrEqual(0);
      expect(at).toBeLessThan(6);
      expect(form.pilots![0]).toMatchObject({ pilotId, answered: true });
      expect(form.pilots![0]!.presentedAt).not.toBeNull();
      // Screen `at` is the pilot; the bank items keep their order around it.
      expect(screens).toHaveLength(7);
      expect(screens.findIndex((s) => s.pilot)).toBe(at);
      expect(screens[at]!.itemId).toBe(pilotId);
      expect(screens.filter((s) => !s.pilot).map((s) => s.itemId)).toEqual(form.items.map((i) => i.itemId));
      // The respondent's count runs 0..6 of 7 without a gap, pilot included.
      expect(screens.map((s) => s.progress)).toEqual(
        Array.from({ length: 7 }, (_, n) => ({ answered: n, total: 7 })),
      );
      const bankRows = await database.db
        .selectFrom('responses')
        .select(['item_id', 'position'])
        .where('attempt_id', '=', id)
        .orderBy('position')
        .execute();
      expect(bankRows.map((r) => r.item_id)).toEqual(form.items.map((i) => i.itemId));
      expect(bankRows.map((r) => Number(r.position))).toEqual([0, 1, 2, 3, 4, 5]);
      const pilotRows = await database.db
        .selectFrom('pilot_responses')
        .selectAll()
        .where('attempt_id', '=', id)
        .execute();
      expect(pilotRows).toHaveLength(1);
      expect(pilotRows[0]).toMatchObject({ pilot_id: pilotId, answer_kind: 'answer' });
      expect(Number(pilotRows[0]!.score)).toBe(1);
      expect(Number(pilotRows[0]!.position)).toBe(at);
      // The bank export never lists the pilot.
      const csv = await request(app.server).get(`/api/admin/studies/${study.studyId}/export`).set(admin);
      expect(csv.status).toBe(200);
      expect(csv.text).not.toContain(pilotId);
      expect(csv.text.trim().split('\n')).toHaveLength(1 + 6);
    });

    it('shows the pilot like an item: image with alt text, prompt, options, never the key or the word pilot', async () => {
      const study = await studyWithCohort(app, { maxItems: 3 });
      const pilotId = await addPilot(study.studyId);
      const joined = await request(app.server).post('/api/join').send({ code: study.joinCode });
      const token: string = joined.body.token;
      let state = (
        await request(app.server).post('/api/attempt/consent').set(bearer(token)).send({ agree: true })
      ).body;
      while (state.item.itemId !== pilotId) {
        state = (
          await request(app.server)
            .post('/api/attempt/responses')
            .set(bearer(token))
            .send({ itemId: state.item.itemId, answer: { kind: 'dont-know' } })
        ).body.attempt;
      }
      expect(state.item).toMatchObject({
        itemId: pilotId,
        chartSvg: '',
        chartImage: {
          src: `/api/attempt/pilots/${pilotId}/image`,
          alt: 'Bar chart of crates unloaded at two invented piers of Velmora Isle.',
        },
        prompt: 'Which pier unloaded the most crates?',
        responseKind: 'single-choice',
      });
      expect(state.item.options.map((o: { id: string }) => o.id).sort()).toEqual(['north', 'south']);
      const text = JSON.stringify(state);
      expect(text).not.toMatch(/"key"|minResponses|pilot(?!s\/)/i);
      const image = await request(app.server).get(state.item.chartImage.src).set(bearer(token));
      expect(image.status).toBe(200);
      // The same screen again after a reload.
      const again = await request(app.server).get('/api/attempt').set(bearer(token));
      expect(again.body.item.itemId).toBe(pilotId);
      expect(again.body.item.options).toEqual(state.item.options);
    });

    it('refuses out-of-turn and ill-fitting pilot answers (409/400, nothing stored) and keeps the first answer', async () => {
      const study = await studyWithCohort(app, { maxItems: 4 });
      const pilotId = await addPilot(study.studyId);
      const joined = await request(app.server).post('/api/join').send({ code: study.joinCode });
      const token: string = joined.body.token;
      let state = (
        await request(app.server).post('/api/attempt/consent').set(bearer(token)).send({ agree: true })
      ).body;
      const { form } = await storedAttempt(database, token);
      const at = form.pilots![0]!.at;
      const send = (itemId: string, answer: unknown) =>
        request(app.server).post('/api/attempt/responses').set(bearer(token)).send({ itemId, answer });
      if (at > 0) {
        const early = await send(pilotId, { kind: 'choice', optionIds: ['north'] });
        expect(early.status).toBe(409);
        expect(early.body.error.code).toBe('ITEM_NOT_CURRENT');
      }
      while (state.item.itemId !== pilotId) {
        state = (await send(state.item.itemId, { kind: 'choice', optionIds: ['b'] })).body.attempt;
      }
      // While the pilot is due, the next bank item is not current.
      const nextBank = form.items[at]!.itemId;
      const before = await storedState(database);
      const jumped = await send(nextBank, { kind: 'choice', optionIds: ['b'] });
      expect(jumped.status).toBe(409);
      expect(jumped.body.error.code).toBe('ITEM_NOT_CURRENT');
      const unknown = await send(pilotId, { kind: 'choice', optionIds: ['east'] });
      expect(unknown.status).toBe(400);
      expect(unknown.body.error.details.problems[0].field).toBe('body.answer.optionIds');
      const two = await send(pilotId, { kind: 'choice', optionIds: ['north', 'south'] });
      expect(two.status).toBe(400);
      expect(two.body.error.message).toMatch(/exactly one/);
      const numeric = await send(pilotId, { kind: 'number', value: 3 });
      expect(numeric.status).toBe(400);
      expect(numeric.body.error.details.problems[0].field).toBe('body.answer.kind');
      expect(await storedState(database)).toEqual(before);
      const pilotRows = () =>
        database.db.selectFrom('pilot_responses').selectAll().where('pilot_id', '=', pilotId).execute();
      expect(await pilotRows()).toHaveLength(0);

      const first = await send(pilotId, { kind: 'choice', optionIds: ['south'] });
      expect(first.status).toBe(201);
      const same = await send(pilotId, { kind: 'choice', optionIds: ['south'] });
      expect(same.status).toBe(200);
      expect(same.body.status).toBe('already-stored');
      expect(same.body.attempt).toEqual(first.body.attempt);
      const changed = await send(pilotId, { kind: 'choice', optionIds: ['north'] });
      expect(changed.status).toBe(409);
      expect(changed.body.error.code).toBe('ANSWER_ALREADY_STORED');
      const rows = await pilotRows();
      expect(rows).toHaveLength(1);
      expect(Number(rows[0]!.score)).toBe(0);
      expect(JSON.parse(rows[0]!.answer!)).toEqual({ kind: 'choice', optionIds: ['south'] });

      // Erasing the attempt erases its pilot answer too.
      const { id } = await storedAttempt(database, token);
      const erased = await request(app.server).delete(`/api/admin/attempts/${id}`).set(admin);
      expect(erased.status).toBe(200);
      expect(await pilotRows()).toHaveLength(0);
    });

    it('gives each new attempt the pilot with the fewest answers; pilotsPerAttempt 0 shows none', async () => {
      const study = await studyWithCohort(app, { maxItems: 2 });
      const first = await addPilot(study.studyId, 'Which pier unloaded fewer crates?');
      const second = await addPilot(study.studyId, 'Which pier had the longer queue?');
      const seen: string[] = [];
      for (let n = 0; n < 4; n++) {
        const { screens } = await runAttempt(study.joinCode, 0, 'north');
        const pilots = screens.filter((s) => s.pilot).map((s) => s.itemId);
        expect(pilots).toHaveLength(1);
        seen.push(pilots[0]!);
      }
      // Answers so far decide: after each pair, both have the same count.
      expect(new Set(seen.slice(0, 2))).toEqual(new Set([first, second]));
      expect(new Set(seen.slice(2, 4))).toEqual(new Set([first, second]));
      const none = await studyWithCohort(app, { maxItems: 2, pilotsPerAttempt: 0 });
      await addPilot(none.studyId);
      const { screens, token } = await runAttempt(none.joinCode, 0, 'north');
      expect(screens.some((s) => s.pilot)).toBe(false);
      expect((await storedAttempt(database, token)).form.pilots).toBeUndefined();
    });

    it('adaptive: a pilot never changes the estimate (right or wrong), sits in the first minItems places, and the stop rule ignores it', async () => {
      const settings = { maxItems: 6, adaptive: { seTarget: 0.1, minItems: 4 } };
      const study = await adaptiveStudy(settings);
      const pilotId = await addPilot(study.studyId);
      const delivery = await loadAdaptiveDelivery(
        database.db,
        deliveryBankFrom(await loadTestBank(stepItems()), () => {
          throw new Error('not rendered in this test');
        }),
        study.studyId,
        studySettingsSchema.parse({ title: 'x', design: 'adaptive', ...settings }),
      );
      for (const [ability, pilotOption] of [
        [0.4, 'north'],
        [0.4, 'south'],
        [-1, 'north'],
        [1.2, 'south'],
      ] as const) {
        const { token, screens } = await runAttempt(study.joinCode, ability, pilotOption);
        const { form } = await storedAttempt(database, token);
        const bankShown = screens.filter((s) => !s.pilot).map((s) => s.itemId);
        // max-items counts bank items only: 6 of them, plus the pilot.
        expect(bankShown).toHaveLength(6);
        expect(form.adaptive?.stop).toBe('max-items');
        expect(screens.filter((s) => s.pilot).map((s) => s.itemId)).toEqual([pilotId]);
        const at = form.pilots![0]!.at;
        expect(at).toBeLessThan(4);
        expect(screens[at]!.itemId).toBe(pilotId);
        // Replaying the engine on the bank answers alone (no pilot) gives the same items and the
        // identical stored state: the pilot answer did not enter it.
        let state = startAdaptiveState({ mean: 0.3, sd: 0.9, source: 'cohort' }, adaptiveSeedOf(form.seed));
        const replay: string[] = [];
        for (;;) {
          const step = nextStep(state, delivery.bank, delivery.rules, 0);
          if (step.kind === 'stop') break;
          replay.push(step.itemId);
          state = advance(state, step, stepDifficultyOf(step.itemId) < ability ? 1 : 0);
        }
        expect(replay).toEqual(bankShown);
        expect(form.adaptive!.state).toEqual(state);
        // And it is the EAP of the bank answers by the definition (brute force, see above).
        const reference = bruteForceEap(
          bankShown.map(stepDifficultyOf),
          bankShown.map((id) => (stepDifficultyOf(id) < ability ? 1 : 0)),
          0.3,
          0.9,
        ).ability;
        expect(form.adaptive!.state.ability).toBeCloseTo(reference, 5);
      }
    });
  });
}
