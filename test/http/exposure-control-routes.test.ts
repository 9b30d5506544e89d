import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AdaptiveSettings } from '../../server/delivery/adaptive/adaptive-settings.js';
import { advance, nextStep, startAdaptiveState } from '../../server/delivery/adaptive/adaptive-state.js';
import {
  type AdaptiveDelivery,
  adaptiveSeedOf,
  loadAdaptiveDelivery,
} from '../../server/delivery/adaptive-delivery.js';
import { deliveryBankFrom } from '../../server/delivery/bank-adapter.js';
import { saveExposureControl } from '../../server/delivery/exposure-control-service.js';
import {
  alignExposureControl,
  exposureControlSettingsOf,
} from '../../server/delivery/stored-exposure-control.js';
import { type StudySettingsInput, studySettingsSchema } from '../../server/delivery/study-settings.js';
import {
  answerStepsToEnd,
  calibratedAdaptiveStudy,
  stepCohort,
  stepDifficultyOf,
  stepItemCount,
  stepItems,
} from '../helpers/adaptive-study.js';
import { signInToConsole } from '../helpers/console-session.js';
import { admin, adminToken, deliveryApp, storedState, studyWithCohort } from '../helpers/delivery-fixture.js';
import { storedAttempt } from '../helpers/stored-attempt.js';
import { loadTestBank } from '../helpers/test-bank.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** Cohort mean of the invented calibration: the prior mean of every attempt. */
const cohortMean = stepCohort.mean;
/** The items nearest the prior mean (difficulties 0.1 and 0.5): randomesque k = 2 picks one of them first. */
const blocked = ['isle-ferry-step-13', 'isle-ferry-step-14'];

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: exposure control`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    const adaptiveBlock = { seTarget: 0.1, randomesque: 2, contentBalance: 'none' as const };
    const studySettings = (maxItems: number): StudySettingsInput => ({
      title: 'Ferry steps',
      design: 'adaptive',
      maxItems,
      adaptive: adaptiveBlock,
    });

    /** A study created fixed, given an invented converged calibration, switched to adaptive. */
    const adaptiveStudy = (maxItems: number) =>
      calibratedAdaptiveStudy(app, database, maxItems, studySettings(maxItems));

    const deliveryOf = async (studyId: string, maxItems: number, calibrationId?: string) =>
      loadAdaptiveDelivery(
        database.db,
        deliveryBankFrom(await loadTestBank(stepItems()), () => {
          throw new Error('not rendered in this test');
        }),
        studyId,
        studySettingsSchema.parse(studySettings(maxItems)),
        calibrationId,
      );

    /** Joins, agrees and answers as a respondent of `ability` to the end; `midway` runs after the first answer. */
    async function runAttempt(joinCode: string, ability: number, midway?: () => Promise<void>) {
      const { token, shown } = await answerStepsToEnd(app, joinCode, ability, midway);
      return { token, shown, form: (await storedAttempt(database, token)).form };
    }

    /** The pure engine replayed from the stored seed with the given rules and the same answers. */
    function replay(delivery: AdaptiveDelivery, rules: AdaptiveSettings, seed: string, ability: number) {
      let state = startAdaptiveState({ mean: cohortMean, sd: 0.9, source: 'cohort' }, adaptiveSeedOf(seed));
      const items: string[] = [];
      for (;;) {
        const step = nextStep(state, delivery.bank, rules, 0);
        if (step.kind === 'stop') return items;
        items.push(step.itemId);
        state = advance(state, step, stepDifficultyOf(step.itemId) < ability ? 1 : 0);
      }
    }

    /** Stores a control through the service, K given per item id (others absent → K = 1). */
    async function storeControl(
      studyId: string,
      calibrationId: string,
      values: Record<string, number>,
      maxItems: number,
    ) {
      const delivery = await deliveryOf(studyId, maxItems);
      return database.db.transaction().execute((trx) =>
        saveExposureControl(
          trx,
          {
            studyId,
            calibrationId,
            settings: exposureControlSettingsOf(delivery.adaptive, delivery.rules),
            tuned: {
              outcome: 'tuned',
              itemParameters: values,
              targetMaxExposure: 0.3,
              achievedMaxExposure: 0.25,
              simulation: {
                seed: 1,
                personsPerAudience: 10,
                audienceMeans: [-1, 0, 1],
                rounds: 1,
                randomesqueMaxExposure: 0.9,
                meanItems: 6,
                bankSize: stepItemCount,
                maxExposureByRound: [0.9],
                tunedFor: 0.25,
                bestRound: 1,
              },
            },
          },
          'test-admin',
        ),
      );
    }

    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database, await loadTestBank(stepItems()));
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    it('without a stored control: randomesque only, as before (first item always one of the two nearest the prior)', async () => {
      const study = await adaptiveStudy(6);
      const delivery = await deliveryOf(study.studyId, 6);
      expect(delivery.exposureControlId).toBeNull();
      for (const ability of [-1, 0.3, 1.5]) {
        const { shown, form } = await runAttempt(study.joinCode, ability);
        expect(form.adaptive?.exposureControlId).toBeUndefined();
        expect(blocked).toContain(shown[0]);
        expect(replay(delivery, delivery.rules, form.seed, ability)).toEqual(shown);
      }
      const listed = await request(app.server)
        .get(`/api/admin/studies/${study.studyId}/exposure-control`)
        .set(admin);
      expect(listed.status).toBe(200);
      expect(listed.body).toEqual({ inUse: null, controls: [] });
    });

    it('a stored control reaches the selector: an item with K = 0 is never given in live attempts, and the attempt replays exactly', async () => {
      const study = await adaptiveStudy(6);
      const values = Object.fromEntries(stepItems().map((item) => [item.id, 1]));
      for (const id of blocked) values[id] = 0;
      values['isle-ferry-step-12'] = 0.5;
      values['an-item-no-longer-in-the-bank'] = 0; // ignored
      const stored = await storeControl(study.studyId, study.calibrationId, values, 6);
      const delivery = await deliveryOf(study.studyId, 6);
      expect(delivery.exposureControlId).toBe(stored.id);
      const control = delivery.exposureControls.get(stored.id)!;
      expect(control[delivery.bank.indexOf.get('isle-ferry-step-13')!]).toBe(0);
      expect(control[delivery.bank.indexOf.get('isle-ferry-step-12')!]).toBe(0.5);

      const abilities = [-2, -1, 0, 0.3, 0.6, 1, 2];
      for (const ability of abilities) {
        const { shown, form } = await runAttempt(study.joinCode, ability);
        expect(shown).toHaveLength(6);
        for (const id of blocked) expect(shown).not.toContain(id);
        expect(form.adaptive?.exposureControlId).toBe(stored.id);
        // Passed-over items are recorded in the state: they are never offered again in the attempt.
        expect(form.adaptive?.state.passedOver.some((id) => blocked.includes(id))).toBe(true);
        // Replays exactly with the stored K; without them the same seed starts on a blocked item.
        expect(replay(delivery, { ...delivery.rules, exposureControl: control }, form.seed, ability)).toEqual(
          shown,
        );
        expect(blocked).toContain(replay(delivery, delivery.rules, form.seed, ability)[0]);
      }

      const listed = await request(app.server)
        .get(`/api/admin/studies/${study.studyId}/exposure-control`)
        .set(admin);
      expect(listed.body.inUse).toBe(stored.id);
      expect(listed.body.controls.map((c: { id: string }) => c.id)).toEqual([stored.id]);
      expect(listed.body.controls[0].itemParameters['isle-ferry-step-13']).toBe(0);
    });

    it('a running attempt keeps the control it started with when a newer one is stored', async () => {
      const study = await adaptiveStudy(6);
      const first = await storeControl(
        study.studyId,
        study.calibrationId,
        { [blocked[0]!]: 0, [blocked[1]!]: 0 },
        6,
      );
      let second = '';
      const { shown, form } = await runAttempt(study.joinCode, 0.3, async () => {
        // The newer control blocks every item except the blocked pair: had the attempt switched, it
        // would get them (the lottery passes over all others, the fallback gives the nearest).
        const values = Object.fromEntries(stepItems().map((item) => [item.id, 0]));
        for (const id of blocked) values[id] = 1;
        second = (await storeControl(study.studyId, study.calibrationId, values, 6)).id;
      });
      expect(form.adaptive?.exposureControlId).toBe(first.id);
      for (const id of blocked) expect(shown).not.toContain(id);
      const delivery = await deliveryOf(study.studyId, 6, study.calibrationId);
      expect(delivery.exposureControlId).toBe(second);
      expect(
        replay(
          delivery,
          { ...delivery.rules, exposureControl: delivery.exposureControls.get(first.id)! },
          form.seed,
          0.3,
        ),
      ).toEqual(shown);
      // A new attempt starts with the newer control.
      const next = await runAttempt(study.joinCode, 0.3);
      expect(next.form.adaptive?.exposureControlId).toBe(second);
      expect(blocked).toContain(next.shown[0]);
    });

    it('a control holds only for the settings it was tuned for: other settings → randomesque only', async () => {
      const study = await adaptiveStudy(6);
      await storeControl(study.studyId, study.calibrationId, { [blocked[0]!]: 0, [blocked[1]!]: 0 }, 6);
      const changed = await request(app.server)
        .patch(`/api/admin/studies/${study.studyId}`)
        .set(admin)
        .send({ settings: studySettings(7) });
      expect(changed.status).toBe(200);
      const { form, shown } = await runAttempt(study.joinCode, 0.3);
      expect(form.adaptive?.exposureControlId).toBeUndefined();
      expect(blocked).toContain(shown[0]);
      const listed = await request(app.server)
        .get(`/api/admin/studies/${study.studyId}/exposure-control`)
        .set(admin);
      expect(listed.body.inUse).toBeNull();
      expect(listed.body.controls).toHaveLength(1);
    });

    it('POST tunes on the latest calibration, stores, audits, and new attempts use it', async () => {
      // 24 items, attempts of 4: randomesque k = 2 alone gives the items near the prior to most persons.
      const study = await adaptiveStudy(4);
      const tuned = await request(app.server)
        .post(`/api/admin/studies/${study.studyId}/exposure-control`)
        .set(admin)
        .send({ seed: 5, target: 0.3 });
      expect(tuned.status).toBe(201);
      const body = tuned.body;
      expect(body.outcome).toBe('tuned');
      expect(body.calibrationId).toBe(study.calibrationId);
      expect(body.createdBy).toBe('admin-token');
      expect(body.settings).toEqual({
        seTarget: 0.1,
        minItems: 4,
        maxItems: 4,
        randomesque: 2,
        contentBalance: 'none',
        areaTargets: null,
      });
      expect(Object.keys(body.itemParameters).sort()).toEqual(
        stepItems()
          .map((i) => i.id)
          .sort(),
      );
      const ks = Object.values(body.itemParameters) as number[];
      for (const k of ks) expect(k >= 0 && k <= 1).toBe(true);
      expect(ks.filter((k) => k < 1).length).toBeGreaterThan(0);
      expect(body.simulation.randomesqueMaxExposure).toBeGreaterThan(0.3);
      // The tuned K bring the largest exposure down from randomesque alone toward the target.
      expect(body.achievedMaxExposure).toBeLessThan(body.simulation.randomesqueMaxExposure);
      expect(body.simulation).toMatchObject({
        personsPerAudience: 100,
        rounds: 8,
        audienceMeans: [-1, 0, 1],
      });

      const rows = await database.db
        .selectFrom('exposure_controls')
        .selectAll()
        .where('study_id', '=', study.studyId)
        .execute();
      expect(rows).toHaveLength(1);
      const audit = await database.db
        .selectFrom('audit_log')
        .selectAll()
        .where('action', '=', 'exposure-control.save')
        .where('subject', '=', study.studyId)
        .execute();
      expect(audit).toHaveLength(1);
      expect(JSON.parse(audit[0]!.details)).toMatchObject({ exposureControlId: body.id, outcome: 'tuned' });

      // Same seed → same K (the tuning is deterministic).
      const again = await request(app.server)
        .post(`/api/admin/studies/${study.studyId}/exposure-control`)
        .set(admin)
        .send({ seed: 5, target: 0.3 });
      expect(again.body.itemParameters).toEqual(body.itemParameters);
      const { form } = await runAttempt(study.joinCode, 0);
      expect(form.adaptive?.exposureControlId).toBe(again.body.id);
      const delivery = await deliveryOf(study.studyId, 4);
      expect(Array.from(delivery.exposureControls.get(again.body.id)!)).toEqual(
        Array.from(alignExposureControl(body.itemParameters, delivery.bank.ids)),
      );
    });

    it('a target the simulation meets with randomesque alone stores K = 1 everywhere (not-needed)', async () => {
      const study = await adaptiveStudy(4);
      const reply = await request(app.server)
        .post(`/api/admin/studies/${study.studyId}/exposure-control`)
        .set(admin)
        .send({ target: 1 });
      expect(reply.status).toBe(201);
      expect(reply.body.outcome).toBe('not-needed');
      expect(new Set(Object.values(reply.body.itemParameters))).toEqual(new Set([1]));
      expect(reply.body.achievedMaxExposure).toBe(reply.body.simulation.randomesqueMaxExposure);
      // The console's progress page now warns against this control's target, not the default 0.3.
      const cookie = await signInToConsole(app, adminToken);
      const progress = await request(app.server)
        .get(`/console/studies/${study.studyId}/progress.json`)
        .set('cookie', cookie);
      expect(progress.status).toBe(200);
      expect(progress.body.progress.exposure).toMatchObject({ limit: 1, limitFrom: 'exposure-control' });
    });

    it('refuses bad input with the field named and stores nothing', async () => {
      const study = await adaptiveStudy(4);
      const noCalibration = await studyWithCohort(app, { maxItems: 4 });
      const before = await storedState(database);
      const controlsBefore = await database.db.selectFrom('exposure_controls').selectAll().execute();
      const post = (studyId: string, body?: unknown) => {
        const r = request(app.server).post(`/api/admin/studies/${studyId}/exposure-control`).set(admin);
        return body === undefined ? r : r.send(body as object);
      };

      const unknown = await post('no-such-study', { target: 0.3 });
      expect(unknown.status).toBe(404);
      expect(unknown.body.error.code).toBe('STUDY_NOT_FOUND');

      const uncalibrated = await post(noCalibration.studyId);
      expect(uncalibrated.status, JSON.stringify(uncalibrated.body)).toBe(409);
      expect(uncalibrated.body.error.code).toBe('CALIBRATION_NEEDED');
      expect(uncalibrated.body.error.message).toContain('plotgauge calibrate --study');

      for (const target of [0, -0.1, 1.01, 'high']) {
        const bad = await post(study.studyId, { target });
        expect(bad.status).toBe(400);
        expect(bad.body.error.code).toBe('VALIDATION_FAILED');
        expect(JSON.stringify(bad.body.error.details)).toContain('body.target');
      }
      const badSeed = await post(study.studyId, { seed: 1.5 });
      expect(badSeed.status).toBe(400);
      expect(JSON.stringify(badSeed.body.error.details)).toContain('body.seed');
      const extra = await post(study.studyId, { target: 0.3, persons: 100000 });
      expect(extra.status).toBe(400);

      const unknownGet = await request(app.server)
        .get('/api/admin/studies/no-such-study/exposure-control')
        .set(admin);
      expect(unknownGet.status).toBe(404);

      expect(await storedState(database)).toEqual(before);
      expect(await database.db.selectFrom('exposure_controls').selectAll().execute()).toEqual(controlsBefore);
    });
  });
}
