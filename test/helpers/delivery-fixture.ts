import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import type { ItemBank } from '../../server/bank/load-bank.js';
import type { StudySettingsInput } from '../../server/delivery/study-settings.js';
import { buildTestApp } from './build-test-app.js';
import { loadTestBank } from './test-bank.js';
import type { TestDatabase } from './test-databases.js';

export const adminToken = 'test-admin-token-0123456789';
export const admin = { Authorization: `Bearer ${adminToken}` };
export const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

/** An app with the small test bank (or the one given) and the admin token configured. */
export async function deliveryApp(database: TestDatabase, bank?: ItemBank): Promise<FastifyInstance> {
  return buildTestApp(database, {
    bank: bank ?? (await loadTestBank()),
    env: { ADMIN_TOKEN: adminToken, PUBLIC_URL: 'https://gauge.example.test' },
  });
}

/** A background question for tests. */
export const ageBand = {
  id: 'age-band',
  prompt: 'How old are you?',
  options: [
    { id: 'under-12', text: 'Under 12' },
    { id: '12-17', text: '12 to 17' },
    { id: '18-plus', text: '18 or older' },
  ],
};

/** Creates a study and one cohort through the admin API; returns their ids and the join code. */
export async function studyWithCohort(
  app: FastifyInstance,
  settings: Partial<StudySettingsInput> = {},
): Promise<{ studyId: string; cohortId: string; joinCode: string }> {
  const study = await request(app.server)
    .post('/api/admin/studies')
    .set(admin)
    .send({ title: 'Ferry charts', ...settings });
  if (study.status !== 201) throw new Error(`create study: ${study.status} ${JSON.stringify(study.body)}`);
  const cohort = await request(app.server)
    .post(`/api/admin/studies/${study.body.id}/cohorts`)
    .set(admin)
    .send({ label: 'Saturday walk-ups' });
  if (cohort.status !== 201) throw new Error(`add cohort: ${cohort.status} ${JSON.stringify(cohort.body)}`);
  return { studyId: study.body.id, cohortId: cohort.body.id, joinCode: cohort.body.joinCode };
}

/** Joins and agrees; answers background questions when asked (first option each). */
export async function joinAndConsent(app: FastifyInstance, joinCode: string): Promise<string> {
  const joined = await request(app.server).post('/api/join').send({ code: joinCode });
  if (joined.status !== 201) throw new Error(`join: ${joined.status} ${JSON.stringify(joined.body)}`);
  const token = joined.body.token as string;
  const consent = await request(app.server)
    .post('/api/attempt/consent')
    .set(bearer(token))
    .send({ agree: true });
  if (consent.body.step === 'background') {
    const answers = Object.fromEntries(
      (consent.body.background as { id: string; options: { id: string }[] }[]).map((q) => [
        q.id,
        q.options[0]!.id,
      ]),
    );
    await request(app.server).post('/api/attempt/background').set(bearer(token)).send({ answers });
  }
  return token;
}

/** Correct answers of the test bank's items (from the items' data and keys). */
export const correctAnswers: Record<string, unknown> = {
  'isle-ferry-busiest-day': { kind: 'choice', optionIds: ['b'] },
  'isle-ferry-monday-count': { kind: 'number', value: 122 },
  'isle-ferry-quiet-days': { kind: 'choice', optionIds: ['thu', 'mon'] },
  'isle-ferry-why-tuesday': { kind: 'text', text: 'Whether Tuesday is market day on the island.' },
  'town-ferry-quietest-day': { kind: 'choice', optionIds: ['d'] },
};

/** Every row of the tables respondents can change, to compare before and after a refused request. */
export async function storedState(database: TestDatabase): Promise<unknown> {
  const db = database.db;
  return {
    studies: await db.selectFrom('studies').selectAll().orderBy('id').execute(),
    cohorts: await db.selectFrom('cohorts').selectAll().orderBy('id').execute(),
    attempts: await db.selectFrom('attempts').selectAll().orderBy('id').execute(),
    responses: await db.selectFrom('responses').selectAll().orderBy('id').execute(),
    audit: await db.selectFrom('audit_log').selectAll().orderBy('id').execute(),
  };
}
