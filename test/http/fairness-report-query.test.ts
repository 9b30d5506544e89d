import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import type { Report } from '../../server/reports/report-types.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';
import { insertSimulatedStudy, normalDraws } from '../reports/simulated-study.js';

const token = 'fairness-admin-token-0123456789';
const admin = { Authorization: `Bearer ${token}` };

describe('report routes: ?fairness= adds the Fairness section to JSON, CSV and HTML', () => {
  const sqlite = testEngines()[0]!;
  let database: TestDatabase;
  let app: FastifyInstance;
  let studyId: string;
  let cohortIds: string[];

  beforeAll(async () => {
    database = await sqlite.open();
    const bank = await loadBank('items');
    app = await buildTestApp(database, { bank, env: { ADMIN_TOKEN: token } });
    // invented difficulties for 16 bank items; two cohorts from one distribution (no DIF)
    const items = bank.items
      .slice(0, 16)
      .map((item, k) => ({ id: item.id, difficulty: -1.5 + (3 * k) / 15 }));
    ({ studyId, cohortIds } = await insertSimulatedStudy(database.db, {
      items,
      seed: 5,
      cohorts: [
        { label: 'Morning', abilities: normalDraws(11, 80, 0, 1) },
        { label: 'Evening', abilities: normalDraws(12, 80, 0, 1) },
      ],
    }));
  }, 120_000);
  afterAll(async () => {
    await app.close();
    await database.cleanup();
  });

  it('answers with the same fairness numbers in JSON, CSV and the page', async () => {
    const query = `?fairness=cohorts:${cohortIds[0]},${cohortIds[1]}`;
    const json = await request(app.server).get(`/api/admin/studies/${studyId}/report${query}`).set(admin);
    expect(json.status).toBe(200);
    const fairness = (json.body as Report).fairness!;
    expect(fairness.referenceLabel).toBe('Morning');
    expect(fairness.referencePersons).toBe(80);
    expect(fairness.items).toHaveLength(16);
    const first = fairness.items[0]!;
    const csv = await request(app.server).get(`/api/admin/studies/${studyId}/report.csv${query}`).set(admin);
    expect(csv.text).toContain(`fairness,,all-items,difference,${fairness.comparison.allItems.difference}`);
    expect(csv.text).toContain(`fairness,,${first.itemId},strata_used,${first.strataUsed}`);
    const page = await request(app.server).get(`/studies/${studyId}/report${query}`).set(admin);
    expect(page.status).toBe(200);
    expect(page.text).toContain('Fairness: do the items work the same for Evening and Morning?');
    expect(page.text).toContain(`value="${fairness.comparison.allItems.difference}"`);
  }, 60_000);

  it('refuses a malformed fairness query and a study without such a background question', async () => {
    const bad = await request(app.server)
      .get(`/api/admin/studies/${studyId}/report?fairness=yes,no`)
      .set(admin);
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('VALIDATION_FAILED');
    const unknown = await request(app.server)
      .get(`/api/admin/studies/${studyId}/report?fairness=works-with-data:yes,no`)
      .set(admin);
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toContain('no background question "works-with-data"');
  });
});
