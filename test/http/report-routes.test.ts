import { parse } from 'csv-parse/sync';
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import type { Report } from '../../server/reports/report-types.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';
import { insertSimulatedStudy, normalDraws } from '../reports/simulated-study.js';

const token = 'report-admin-token-0123456789';
const admin = { Authorization: `Bearer ${token}` };

describe('report routes: JSON, HTML and CSV from one report; refusals', () => {
  const sqlite = testEngines()[0]!;
  let database: TestDatabase;
  let app: FastifyInstance;
  let studyId: string;
  let cohortIds: string[];
  let otherCohort: string;

  beforeAll(async () => {
    database = await sqlite.open();
    const bank = await loadBank('items');
    app = await buildTestApp(database, { bank, env: { ADMIN_TOKEN: token } });
    // Invented difficulties for 24 real bank items (their chart types and levels come from the bank).
    const items = bank.items
      .slice(0, 24)
      .map((item, k) => ({ id: item.id, difficulty: -1.5 + (3 * k) / 23 }));
    ({ studyId, cohortIds } = await insertSimulatedStudy(database.db, {
      items,
      seed: 21,
      itemsPerPerson: 12,
      cohorts: [
        { label: 'Before', abilities: normalDraws(1, 60, 0, 1) },
        { label: 'After', abilities: normalDraws(2, 60, 0.6, 1) },
      ],
    }));
    otherCohort = (
      await insertSimulatedStudy(database.db, {
        items,
        seed: 2,
        cohorts: [{ label: 'Elsewhere', abilities: [0] }],
      })
    ).cohortIds[0]!;
  }, 120_000);
  afterAll(async () => {
    await app.close();
    await database.cleanup();
  });

  it('prints the same numbers as JSON, as HTML <data> values and as CSV rows', async () => {
    const query = `?compare=${cohortIds[0]},${cohortIds[1]}`;
    const json = await request(app.server).get(`/api/admin/studies/${studyId}/report${query}`).set(admin);
    expect(json.status).toBe(200);
    const report = json.body as Report;
    const csv = await request(app.server).get(`/api/admin/studies/${studyId}/report.csv${query}`).set(admin);
    expect(csv.status).toBe(200);
    const page = await request(app.server).get(`/studies/${studyId}/report${query}`).set(admin);
    expect(page.status).toBe(200);
    expect(page.headers['content-security-policy']).toContain("default-src 'none'");

    // Numbers from the JSON, walked here independently of the code that writes the CSV and HTML.
    const expected = new Map<string, number>();
    for (const a of report.audiences) {
      expected.set(`audience|${a.key}||ability_mean`, a.ability.mean);
      expected.set(`audience|${a.key}||ability_mean#lower`, a.ability.meanInterval!.lower);
      expected.set(`audience|${a.key}||ability_sd#upper`, a.ability.sdInterval!.upper);
      for (const cell of a.profile) {
        const key = `profile|${a.key}|${cell.chartType}/${cell.level}`;
        expected.set(`${key}|share_at_rp`, cell.shareAtRp);
        expected.set(`${key}|share_at_rp#lower`, cell.shareAtRpInterval!.lower);
        expected.set(`${key}|expected_share_correct`, cell.expectedShareCorrect);
      }
    }
    const cmp = report.comparison!;
    expected.set(`comparison|${cmp.from.id}->${cmp.to.id}||mean_difference`, cmp.meanDifference);
    expected.set(`comparison|${cmp.from.id}->${cmp.to.id}||effect_size`, cmp.effectSize);
    for (const item of report.items) expected.set(`item||${item.itemId}|difficulty`, item.difficulty);
    expect(expected.size).toBeGreaterThan(50);

    const fromHtml = new Map(
      [...page.text.matchAll(/<data value="([^"]*)" data-key="([^"]*)">/g)].map((m) => [
        m[2]!.replace(/&gt;/g, '>'),
        Number(m[1]),
      ]),
    );
    const records = parse(csv.text, { columns: true }) as Record<string, string>[];
    const fromCsv = new Map<string, number>();
    for (const r of records) {
      const key = `${r.section}|${r.audience}|${r.subject}|${r.measure}`;
      fromCsv.set(key, Number(r.value));
      if (r.lower !== '') fromCsv.set(`${key}#lower`, Number(r.lower));
      if (r.upper !== '') fromCsv.set(`${key}#upper`, Number(r.upper));
    }
    for (const [key, value] of expected) {
      expect(fromCsv.get(key), key).toBe(value);
      if (
        !key.startsWith('profile') ||
        key.endsWith('share_at_rp') ||
        key.endsWith('#lower') ||
        key.endsWith('expected_share_correct')
      )
        expect(fromHtml.get(key), key).toBe(value);
    }
    // The page shows readable text too: a share as whole percent, the foot's caution.
    expect(page.text).toContain('not for high-stakes decisions');
    expect(page.text).toContain('<title>');
  }, 120_000);

  it('sends a browser without the cookie to sign in; the sign-in sets an HttpOnly SameSite=Strict cookie', async () => {
    const anonymous = await request(app.server).get(`/studies/${studyId}/report`);
    expect(anonymous.status).toBe(303);
    expect(anonymous.headers.location).toBe(
      `/sign-in?next=${encodeURIComponent(`/studies/${studyId}/report`)}`,
    );
    const wrong = await request(app.server)
      .post('/sign-in')
      .type('form')
      .send({ token: 'not-the-token-at-all', next: '/x' });
    expect(wrong.status).toBe(401);
    const right = await request(app.server)
      .post('/sign-in')
      .type('form')
      .send({ token, next: `/studies/${studyId}/report` });
    expect(right.status).toBe(303);
    expect(right.headers.location).toBe(`/studies/${studyId}/report`);
    const cookie = String(right.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Strict/);
    expect(cookie).toMatch(/Path=\//);
    expect(cookie).not.toContain(token);
    const withCookie = await request(app.server)
      .get(`/api/admin/studies/${studyId}/report`)
      .set('Cookie', cookie.split(';')[0]!);
    expect(withCookie.status).toBe(200);
    const offsite = await request(app.server)
      .post('/sign-in')
      .type('form')
      .send({ token, next: '//elsewhere.test/' });
    expect(offsite.headers.location).toBe('/');
  }, 60_000);

  it("refuses a cohort of another study with 404 naming the study's cohorts", async () => {
    const res = await request(app.server)
      .get(`/api/admin/studies/${studyId}/report?cohort=${otherCohort}`)
      .set(admin);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('COHORT_NOT_FOUND');
    expect(res.body.error.message).toContain('Before');
  });

  it('refuses a study with no responses, and one with too few, saying how many are needed', async () => {
    const empty = await insertSimulatedStudy(database.db, {
      items: [],
      seed: 1,
      cohorts: [{ label: 'Nobody', abilities: [] }],
    });
    const none = await request(app.server).get(`/api/admin/studies/${empty.studyId}/report`).set(admin);
    expect(none.status).toBe(409);
    expect(none.body.error.code).toBe('TOO_FEW_RESPONSES');
    expect(none.body.error.message).toContain('no scored responses yet');
    expect(none.body.error.message).toContain('at least 30 respondents');
    const bank = await loadBank('items');
    const few = await insertSimulatedStudy(database.db, {
      items: bank.items.slice(0, 5).map((i) => ({ id: i.id, difficulty: 0 })),
      seed: 4,
      cohorts: [{ label: 'Five', abilities: normalDraws(3, 5, 0, 1) }],
    });
    const tooFew = await request(app.server).get(`/api/admin/studies/${few.studyId}/report.csv`).set(admin);
    expect(tooFew.status).toBe(409);
    expect(tooFew.body.error.message).toContain('5 respondents who finished; 25 more are needed');
    const page = await request(app.server).get(`/studies/${few.studyId}/report`).set(admin);
    expect(page.status).toBe(409);
    const missing = await request(app.server).get('/api/admin/studies/no-such-study/report').set(admin);
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('STUDY_NOT_FOUND');
  }, 60_000);

  it('refuses a calibration that did not converge', async () => {
    const res = await request(app.server).post(`/api/admin/studies/${studyId}/calibrations`).set(admin);
    expect(res.status).toBe(201);
    const { calibrateStudy } = await import('../../server/reports/calibrate-study.js');
    await calibrateStudy(database.db, studyId, { maxIterations: 1, replicates: 0 });
    const report = await request(app.server).get(`/api/admin/studies/${studyId}/report`).set(admin);
    expect(report.status).toBe(409);
    expect(report.body.error.code).toBe('CALIBRATION_NOT_CONVERGED');
  }, 60_000);
});
