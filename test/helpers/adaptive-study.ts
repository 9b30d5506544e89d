import { randomUUID } from 'node:crypto';
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { expect } from 'vitest';
import type { ItemInput } from '../../server/bank/item-schema.js';
import { insertCalibration } from '../../server/storage/calibration-repository.js';
import { validItem } from '../bank/valid-item.js';
import { admin, bearer, studyWithCohort } from './delivery-fixture.js';
import type { TestDatabase } from './test-databases.js';

/** How many step items there are. */
export const stepItemCount = 24;

/**
 * 24 invented single-choice items `isle-ferry-step-01` … `-24`: every third at level `interpret`, the
 * rest `read`. Option b is right on every item.
 */
export function stepItems(): ItemInput[] {
  const base = validItem();
  return Array.from({ length: stepItemCount }, (_, i) => ({
    ...base,
    id: `isle-ferry-step-${String(i + 1).padStart(2, '0')}`,
    level: i % 3 === 2 ? ('interpret' as const) : ('read' as const),
    features: {},
  }));
}

/** The invented calibrated difficulty of a step item: evenly spread over [−2.3, 2.3] logits by number. */
export const stepDifficultyOf = (id: string): number =>
  -2.3 + (4.6 * (Number(id.slice(-2)) - 1)) / (stepItemCount - 1);

/** The answer of an invented respondent who is right exactly on the step items easier than `ability`. */
export const stepAnswerFor = (itemId: string, ability: number) => ({
  itemId,
  answer: { kind: 'choice', optionIds: [stepDifficultyOf(itemId) < ability ? 'b' : 'a'] },
});

/** Where the invented calibration puts the cohort: the prior of every adaptive attempt. */
export const stepCohort = { mean: 0.3, sd: 0.9 };

/**
 * A study created fixed (`maxItems`), given an invented converged MML calibration of the step items
 * (cohort N(0.3, 0.9²), every item SE 0.2), then switched through the admin API to `settings`
 * (which must make it adaptive). The app must serve a bank holding `stepItems()`.
 */
export async function calibratedAdaptiveStudy(
  app: FastifyInstance,
  database: TestDatabase,
  maxItems: number,
  settings: Record<string, unknown>,
): Promise<{ studyId: string; cohortId: string; joinCode: string; calibrationId: string }> {
  const study = await studyWithCohort(app, { maxItems });
  const calibrationId = randomUUID();
  await insertCalibration(
    database.db,
    {
      id: calibrationId,
      studyId: study.studyId,
      method: 'mml',
      settings: {
        groups: [{ cohortId: study.cohortId, label: 'x', ...stepCohort, meanStandardError: 0.1 }],
      },
      converged: true,
      iterations: 12,
      logLikelihood: -100,
      responseCount: 500,
      responsesUntil: null,
      createdAt: new Date().toISOString(),
    },
    stepItems().map((item) => ({
      itemId: item.id,
      itemVersion: 1,
      difficulty: stepDifficultyOf(item.id),
      standardError: 0.2,
      infit: 1,
      outfit: 1,
      anchored: false,
    })),
  );
  const changed = await request(app.server)
    .patch(`/api/admin/studies/${study.studyId}`)
    .set(admin)
    .send({ settings });
  if (changed.status !== 200) throw new Error(`switch: ${changed.status} ${JSON.stringify(changed.body)}`);
  return { ...study, calibrationId };
}

/**
 * Joins with `joinCode`, agrees, and answers every step item as the invented respondent of `ability`
 * (stepAnswerFor) until the attempt ends; `afterFirstAnswer` runs once, right after the first answer.
 * Returns the respondent token, the final attempt state and the item ids in the order shown.
 */
export async function answerStepsToEnd(
  app: FastifyInstance,
  joinCode: string,
  ability: number,
  afterFirstAnswer?: () => Promise<void>,
  // biome-ignore lint/suspicious/noExplicitAny: the attempt state is the route's JSON reply
): Promise<{ token: string; state: any; shown: string[] }> {
  const joined = await request(app.server).post('/api/join').send({ code: joinCode });
  expect(joined.status).toBe(201);
  const token: string = joined.body.token;
  let state = (
    await request(app.server).post('/api/attempt/consent').set(bearer(token)).send({ agree: true })
  ).body;
  const shown: string[] = [];
  while (state.step === 'item') {
    shown.push(state.item.itemId);
    const reply = await request(app.server)
      .post('/api/attempt/responses')
      .set(bearer(token))
      .send(stepAnswerFor(state.item.itemId, ability));
    expect(reply.status).toBe(201);
    state = reply.body.attempt;
    if (shown.length === 1) await afterFirstAnswer?.();
    if (shown.length > 60) throw new Error('runaway attempt');
  }
  return { token, state, shown };
}
