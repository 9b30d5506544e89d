import { randomUUID } from 'node:crypto';
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ItemInput } from '../../server/bank/item-schema.js';
import { advance, nextStep, startAdaptiveState } from '../../server/delivery/adaptive/adaptive-state.js';
import {
  adaptiveSeedOf,
  advanceAdaptiveForm,
  loadAdaptiveDelivery,
  startAdaptiveForm,
} from '../../server/delivery/adaptive-delivery.js';
import { type AttemptForm, attemptFormSchema } from '../../server/delivery/attempt-form.js';
import { hashAttemptToken } from '../../server/delivery/attempt-token.js';
import { deliveryBankFrom } from '../../server/delivery/bank-adapter.js';
import { studySettingsSchema } from '../../server/delivery/study-settings.js';
import { insertCalibration } from '../../server/storage/calibration-repository.js';
import { validItem } from '../bank/valid-item.js';
import { admin, bearer, deliveryApp, studyWithCohort } from '../helpers/delivery-fixture.js';
import { loadTestBank } from '../helpers/test-bank.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/**
 * 24 invented single-choice items: 16 at level `read`, 8 at `interpret`, with invented calibrated
 * difficulties spread evenly over [−2.3, 2.3]. Option b is right on every item.
 */
const itemCount = 24;
function adaptiveItems(): ItemInput[] {
  const base = validItem();
  return Array.from({ length: itemCount }, (_, i) => ({
    ...base,
    id: `isle-ferry-step-${String(i + 1).padStart(2, '0')}`,
    level: i % 3 === 2 ? ('interpret' as const) : ('read' as const),
    features: {},
  }));
}
const difficultyOf = (id: string): number => {
  const i = Number(id.slice(-2)) - 1;
  return -2.3 + (4.6 * i) / (itemCount - 1);
};

/** The invented respondent: right exactly on the items easier than `ability`. */
const answerFor = (itemId: string, ability: number) => ({
  itemId,
  answer: { kind: 'choice', optionIds: [difficultyOf(itemId) < ability ? 'b' : 'a'] },
});

/**
 * EAP by brute force on a fine grid (posterior mean and SD of θ under a normal prior and the
 * Rasch likelihood): the definition, independent of the engine's Gauss–Hermite rule.
 * @see Bock, R. D., & Mislevy, R. J. (1982). Adaptive EAP estimation of ability in a
 *   microcomputer environment. Applied Psychological Measurement 6, 431–444 (eq. 1–2).
 */
function bruteForceEap(b: number[], x: number[], mean: number, sd: number): { ability: number; se: number } {
  let w0 = 0;
  let w1 = 0;
  let w2 = 0;
  for (let k = 0; k <= 16000; k++) {
    const t = -10 + (20 * k) / 16000;
    let logL = -0.5 * ((t - mean) / sd) ** 2;
    for (let j = 0; j < b.length; j++) {
      const p = 1 / (1 + Math.exp(-(t - b[j]!)));
      logL += Math.log(x[j] === 1 ? p : 1 - p);
    }
    const w = Math.exp(logL);
    w0 += w;
    w1 += w * t;
    w2 += w * t * t;
  }
  const ability = w1 / w0;
  return { ability, se: Math.sqrt(w2 / w0 - ability * ability) };
}

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: adaptive delivery`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;

    /** A study created fixed, calibrated (invented difficulties, cohort N(0.3, 0.9²)), switched to adaptive. */
    async function adaptiveStudy(settings: Record<string, unknown>) {
      const study = await studyWithCohort(app, { maxItems: 10 });
      const calibrationId = randomUUID();
      await insertCalibration(
        database.db,
        {
          id: calibrationId,
          studyId: study.studyId,
          method: 'mml',
          settings: {
            groups: [{ cohortId: study.cohortId, label: 'x', mean: 0.3, sd: 0.9, meanStandardError: 0.1 }],
          },
          converged: true,
          iterations: 12,
          logLikelihood: -100,
          responseCount: 500,
          responsesUntil: null,
          createdAt: new Date().toISOString(),
        },
        adaptiveItems().map((item) => ({
          itemId: item.id,
          itemVersion: 1,
          difficulty: difficultyOf(item.id),
          standardError: 0.2,
          infit: 1,
          outfit: 1,
          anchored: false,
        })),
      );
      const changed = await request(app.server)
        .patch(`/api/admin/studies/${study.studyId}`)
        .set(admin)
        .send({ settings: { title: 'Ferry steps', design: 'adaptive', ...settings } });
      if (changed.status !== 200)
        throw new Error(`switch: ${changed.status} ${JSON.stringify(changed.body)}`);
      return { ...study, calibrationId };
    }

    /** Joins, agrees, and answers as a respondent of `ability` until the attempt finishes. */
    async function runAttempt(
      joinCode: string,
      ability: number,
      beforeAnswer?: (n: number) => Promise<void>,
    ) {
      const joined = await request(app.server).post('/api/join').send({ code: joinCode });
      expect(joined.status).toBe(201);
      const token: string = joined.body.token;
      let state = (
        await request(app.server).post('/api/attempt/consent').set(bearer(token)).send({ agree: true })
      ).body;
      const shown: string[] = [];
      while (state.step === 'item') {
        shown.push(state.item.itemId);
        await beforeAnswer?.(shown.length);
        const reply = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send(answerFor(state.item.itemId, ability));
        expect(reply.status).toBe(201);
        state = reply.body.attempt;
        if (shown.length > 60) throw new Error('runaway attempt');
      }
      return { token, state, shown };
    }

    async function storedForm(token: string): Promise<{ id: string; form: AttemptForm; status: string }> {
      const row = await database.db
        .selectFrom('attempts')
        .selectAll()
        .where('token_hash', '=', hashAttemptToken(token))
        .executeTakeFirstOrThrow();
      const form = typeof row.form === 'string' ? JSON.parse(row.form) : row.form;
      return { id: row.id, form: attemptFormSchema.parse(form), status: row.status };
    }

    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database, await loadTestBank(adaptiveItems()));
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
        shown.map(difficultyOf),
        responses.map((r) => Number(r.score)),
        0.3,
        0.9,
      );
      expect(adaptiveState.ability).toBeCloseTo(reference.ability, 5);
      expect(adaptiveState.standardError).toBeCloseTo(reference.se, 5);
      expect(adaptiveState.standardError).toBeLessThanOrEqual(0.7);
      // One item earlier the SE was still above target (else it would have stopped then).
      const before = bruteForceEap(
        shown.slice(0, -1).map(difficultyOf),
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
      expect(shown).toHaveLength(itemCount);
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
        .send(answerFor(first, 0));
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
        .send(answerFor(second, 0));
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
        deliveryBankFrom(await loadTestBank(adaptiveItems()), () => {
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
        state = advance(state, step, difficultyOf(step.itemId) < 0.8 ? 1 : 0);
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
          advanceAdaptiveForm(delivery, f, difficultyOf(f.adaptive.pending.itemId) < 0 ? 1 : 0, 0);
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
