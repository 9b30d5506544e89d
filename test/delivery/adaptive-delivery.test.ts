import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { advance, nextStep, startAdaptiveState } from '../../server/delivery/adaptive/adaptive-state.js';
import {
  adaptiveSeedOf,
  advanceAdaptiveForm,
  loadAdaptiveDelivery,
  startAdaptiveForm,
} from '../../server/delivery/adaptive-delivery.js';
import type { AttemptForm } from '../../server/delivery/attempt-form.js';
import { hashAttemptToken } from '../../server/delivery/attempt-token.js';
import { deliveryBankFrom } from '../../server/delivery/bank-adapter.js';
import { studySettingsSchema } from '../../server/delivery/study-settings.js';
import {
  answerStepsToEnd,
  calibratedAdaptiveStudy,
  stepAnswerFor,
  stepDifficultyOf,
  stepItemCount,
  stepItems,
} from '../helpers/adaptive-study.js';
import { bruteForceEap } from '../helpers/brute-force-eap.js';
import { admin, bearer, deliveryApp, studyWithCohort } from '../helpers/delivery-fixture.js';
import { storedAttempt } from '../helpers/stored-attempt.js';
import { loadTestBank } from '../helpers/test-bank.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: adaptive delivery`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;

    /** A study created fixed, calibrated (invented difficulties, cohort N(0.3, 0.9²)), switched to adaptive. */
    const adaptiveStudy = (settings: Record<string, unknown>) =>
      calibratedAdaptiveStudy(app, database, 10, { title: 'Ferry steps', design: 'adaptive', ...settings });

    /** Joins, agrees, and answers as a respondent of `ability` until the attempt finishes. */
    const runAttempt = (joinCode: string, ability: number) => answerStepsToEnd(app, joinCode, ability);

    const storedForm = (token: string) => storedAttempt(database, token);

    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database, await loadTestBank(stepItems()));
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    it('refuses an adaptive study without a calibration: at creation and when switched (409)', async () => {
      const created = await request(app.server)
        .post('/api/admin/studies')
        .set(admin)
        .send({ title: 'Too early', design: 'adaptive' });
      expect(created.status).toBe(409);
      expect(created.body.error.code).toBe('ADAPTIVE_NEEDS_CALIBRATION');
      const study = await studyWithCohort(app);
      const switched = await request(app.server)
        .patch(`/api/admin/studies/${study.studyId}`)
        .set(admin)
        .send({ settings: { title: 'Too early', design: 'adaptive' } });
      expect(switched.status).toBe(409);
      expect(switched.body.error.code).toBe('ADAPTIVE_NEEDS_CALIBRATION');
      expect(switched.body.error.message).toMatch(/calibrat/);
    });

    it('join → consent → items → finished on the SE target; the stored estimate is the EAP of the answers', async () => {
      const study = await adaptiveStudy({ maxItems: 20, adaptive: { seTarget: 0.7, minItems: 3 } });
      const { token, shown, state } = await runAttempt(study.joinCode, 0.4);
      expect(state.step).toBe('finished');
      const { id, form, status } = await storedForm(token);
      expect(status).toBe('finished');
      expect(form.adaptive?.stop).toBe('se-target');
      expect(form.adaptive?.pending).toBeNull();
      expect(form.items.map((i) => i.itemId)).toEqual(shown);
      expect(new Set(shown).size).toBe(shown.length);
      expect(shown.length).toBeGreaterThanOrEqual(3);
      expect(shown.length).toBeLessThan(20);
      const responses = await database.db
        .selectFrom('responses')
        .select(['item_id', 'score', 'position'])
        .where('attempt_id', '=', id)
        .orderBy('position')
        .execute();
      expect(responses.map((r) => r.item_id)).toEqual(shown);
      const adaptiveState = form.adaptive!.state;
      // The prior is the cohort's estimate in the calibration.
      expect(adaptiveState.prior).toEqual({ mean: 0.3, sd: 0.9, source: 'cohort' });
      const reference = bruteForceEap(
        shown.map(stepDifficultyOf),
        responses.map((r) => Number(r.score)),
        0.3,
        0.9,
      );
      expect(adaptiveState.ability).toBeCloseTo(reference.ability, 5);
      expect(adaptiveState.standardError).toBeCloseTo(reference.se, 5);
      expect(adaptiveState.standardError).toBeLessThanOrEqual(0.7);
      // One item earlier the SE was still above target (else it would have stopped then).
      const before = bruteForceEap(
        shown.slice(0, -1).map(stepDifficultyOf),
        responses.slice(0, -1).map((r) => Number(r.score)),
        0.3,
        0.9,
      );
      expect(shown.length === 3 || before.se > 0.7).toBe(true);
    });

    it('stops at the maximum number of items', async () => {
      const study = await adaptiveStudy({ maxItems: 4, adaptive: { seTarget: 0.1, minItems: 2 } });
      const { token, shown } = await runAttempt(study.joinCode, -0.5);
      expect(shown).toHaveLength(4);
      expect((await storedForm(token)).form.adaptive?.stop).toBe('max-items');
    });

    it('a bank smaller than the maximum ends with pool-exhausted after every item (documented, not an error)', async () => {
      const study = await adaptiveStudy({
        maxItems: 40,
        adaptive: { seTarget: 0.1, contentBalance: 'none' },
      });
      const { token, shown } = await runAttempt(study.joinCode, 0.1);
      expect(shown).toHaveLength(stepItemCount);
      expect((await storedForm(token)).form.adaptive?.stop).toBe('pool-exhausted');
    });

    it('stops on the time limit, counted from when the first item was shown', async () => {
      const study = await adaptiveStudy({
        maxItems: 20,
        timeLimitSeconds: 60,
        adaptive: { seTarget: 0.1, minItems: 2 },
      });
      let token = '';
      const joined = await request(app.server).post('/api/join').send({ code: study.joinCode });
      token = joined.body.token;
      const consent = await request(app.server)
        .post('/api/attempt/consent')
        .set(bearer(token))
        .send({ agree: true });
      const first = consent.body.item.itemId as string;
      const firstReply = await request(app.server)
        .post('/api/attempt/responses')
        .set(bearer(token))
        .send(stepAnswerFor(first, 0));
      expect(firstReply.status).toBe(201);
      // Move the first item's shown time 61 s into the past (consent stays recent).
      const { form } = await storedForm(token);
      form.presentedAt[0] = new Date(Date.now() - 61_000).toISOString();
      await database.db
        .updateTable('attempts')
        .set({ form: JSON.stringify(form) })
        .where('token_hash', '=', hashAttemptToken(token))
        .execute();
      const second = form.items[1]!.itemId;
      const reply = await request(app.server)
        .post('/api/attempt/responses')
        .set(bearer(token))
        .send(stepAnswerFor(second, 0));
      expect(reply.status).toBe(201);
      expect(reply.body.attempt.step).toBe('finished');
      const after = await storedForm(token);
      expect(after.form.adaptive?.stop).toBe('time-limit');
      expect(after.form.items).toHaveLength(2);
      expect(after.status).toBe('finished');
    });

    it('keeps each level within one item of its target share at every length', async () => {
      // Targets read : interpret = 1 : 1 (the pool is 2 : 1, so balancing must act).
      const study = await adaptiveStudy({
        maxItems: 14,
        adaptive: { seTarget: 0.1, areaTargets: { read: 1, interpret: 1 } },
      });
      for (const ability of [-1.5, 0, 1.5]) {
        const { shown } = await runAttempt(study.joinCode, ability);
        expect(shown).toHaveLength(14);
        let read = 0;
        for (let n = 1; n <= shown.length; n++) {
          if (Number(shown[n - 1]!.slice(-2)) % 3 !== 0) read++;
          expect(Math.abs(read - 0.5 * n)).toBeLessThanOrEqual(1);
          expect(Math.abs(n - read - 0.5 * n)).toBeLessThanOrEqual(1);
        }
      }
    });

    it('is deterministic under a seed: the stored attempt replays exactly from its seed, and same seed → same items', async () => {
      const study = await adaptiveStudy({ maxItems: 12, adaptive: { seTarget: 0.1 } });
      const { token, shown } = await runAttempt(study.joinCode, 0.8);
      const { form } = await storedForm(token);
      // Replay with the pure engine from the stored seed and the same answers.
      const delivery = await loadAdaptiveDelivery(
        database.db,
        deliveryBankFrom(await loadTestBank(stepItems()), () => {
          throw new Error('not rendered in this test');
        }),
        study.studyId,
        studySettingsSchema.parse({
          title: 'x',
          design: 'adaptive',
          maxItems: 12,
          adaptive: { seTarget: 0.1 },
        }),
      );
      let state = startAdaptiveState({ mean: 0.3, sd: 0.9, source: 'cohort' }, adaptiveSeedOf(form.seed));
      const replay: string[] = [];
      for (;;) {
        const step = nextStep(state, delivery.bank, delivery.rules, 0);
        if (step.kind === 'stop') break;
        replay.push(step.itemId);
        state = advance(state, step, stepDifficultyOf(step.itemId) < 0.8 ? 1 : 0);
      }
      expect(replay).toEqual(shown);
      // Same seed twice through the delivery functions → the same sequence; another seed differs somewhere.
      const run = (seed: string) => {
        const started = startAdaptiveForm(delivery, study.cohortId, seed);
        const f: AttemptForm = {
          design: 'adaptive',
          booklet: 0,
          items: started.items,
          presentedAt: started.items.map(() => null),
          backgroundDone: true,
          ended: null,
          seed,
          adaptive: started.adaptive,
        };
        while (f.adaptive?.pending) {
          advanceAdaptiveForm(delivery, f, stepDifficultyOf(f.adaptive.pending.itemId) < 0 ? 1 : 0, 0);
        }
        return f.items.map((i) => i.itemId).join(',');
      };
      expect(run('00000007abcdef01')).toBe(run('00000007abcdef01'));
      const others = ['0000000100000000', '0000000200000000', '0000000300000000', '0000000400000000'].map(
        run,
      );
      expect(others.some((s) => s !== run('00000007abcdef01'))).toBe(true);
    });
  });
}
