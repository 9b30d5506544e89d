import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const token = 'error-page-admin-token-0123456789';
const admin = { Authorization: `Bearer ${token}` };

describe('a team member’s browser gets a page, an API client JSON, for a page that cannot be shown', () => {
  const sqlite = testEngines()[0]!;
  let database: TestDatabase;
  let app: FastifyInstance;
  beforeAll(async () => {
    database = await sqlite.open();
    app = await buildTestApp(database, { bank: await loadBank('items'), env: { ADMIN_TOKEN: token } });
  });
  afterAll(async () => {
    await app?.close();
    await database?.cleanup();
  });

  it('an unknown study’s report: 404 page with the message and a way back for text/html', async () => {
    const page = await request(app.server)
      .get('/studies/no-such-study/report')
      .set(admin)
      .set('Accept', 'text/html,application/xhtml+xml');
    expect(page.status).toBe(404);
    expect(page.headers['content-type']).toMatch(/^text\/html/);
    expect(page.text).toContain('<h1>Not found</h1>');
    expect(page.text).toContain('There is no study no-such-study.');
    expect(page.text).toContain('href="/console"');
    // The strict CSP still applies (no inline script or style on the page).
    expect(page.headers['content-security-policy']).toContain("default-src 'none'");
    expect(page.text).not.toMatch(/<script|style=/);
  });

  it('a mistyped filter on the bank page: 400 page naming the field', async () => {
    const page = await request(app.server)
      .get('/console/bank?level=expert')
      .set(admin)
      .set('Accept', 'text/html');
    expect(page.status).toBe(400);
    expect(page.text).toContain('This page cannot be shown');
    expect(page.text).toContain('querystring.level');
  });

  it('the same requests without text/html keep the JSON error body', async () => {
    const json = await request(app.server).get('/studies/no-such-study/report').set(admin);
    expect(json.status).toBe(404);
    expect(json.body.error.code).toBe('STUDY_NOT_FOUND');
    const api = await request(app.server)
      .get('/api/admin/studies/no-such-study/report')
      .set(admin)
      .set('Accept', 'text/html');
    expect(api.status).toBe(404);
    expect(api.body.error.code).toBe('STUDY_NOT_FOUND');
  });
});
