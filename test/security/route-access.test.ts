import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { FastifyInstance, RouteOptions } from 'fastify';
import Fastify from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appPlugin, serverOptions } from '../../server/app.js';
import { loadConfig } from '../../server/config.js';
import { accessOf, consolePages } from '../../server/http/access-policy.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { createAccessToken, revokeAccessToken } from '../../server/storage/token-repository.js';
import { loadTestBank } from '../helpers/test-bank.js';

/**
 * The route table, enumerated: every route that is not on the public or respondent allow-list below
 * refuses a missing, malformed, unknown and revoked token, and every admin route refuses an analyst
 * token. A route added later without an access level is admin-only, so it passes this test closed;
 * opening it means changing the allow-list here on purpose.
 */
const publicRoutes = [
  'GET /',
  'GET /api/openapi.json',
  'GET /assets/:name',
  'GET /bank/gallery.css',
  'GET /console-assets/:name',
  'GET /health',
  'GET /join',
  'GET /join/:code',
  'GET /ready',
  'GET /report-assets/:name',
  'GET /sign-in',
  'POST /api/join',
  'POST /sign-in',
  'POST /sign-out',
];
const respondentRoutes = [
  'GET /api/attempt',
  'GET /api/attempt/pilots/:pilotId/image',
  'POST /api/attempt/background',
  'POST /api/attempt/consent',
  'POST /api/attempt/leave',
  'POST /api/attempt/responses',
];

const adminToken = 'route-table-admin-token-0123';
const key = (route: RouteOptions, method: string) => `${method} ${route.url}`;
const methodsOf = (route: RouteOptions): string[] =>
  (Array.isArray(route.method) ? route.method : [route.method]).map(String);
const concrete = (url: string) => url.replace(/:[A-Za-z]+/g, 'probe-1').replace(/\*/g, 'probe');

describe('every route in the route table is closed unless listed open', () => {
  const routes: RouteOptions[] = [];
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-routes-'));
  const url = `sqlite:${path.join(folder, 'routes.db')}`;
  const db = createDatabase(url);
  let app: FastifyInstance;
  let analyst: string;
  let revoked: string;
  let admin: string;
  beforeAll(async () => {
    await migrateToLatest(db);
    app = Fastify(serverOptions());
    app.addHook('onRoute', (route) => void routes.push(route));
    const config = loadConfig({ ADMIN_TOKEN: adminToken }, { databaseUrl: url });
    await app.register(appPlugin, { config, db, bank: await loadTestBank() });
    await app.ready();
    analyst = (await createAccessToken(db, 'analyst', 'reader')).token;
    admin = (await createAccessToken(db, 'admin', 'editor')).token;
    const gone = await createAccessToken(db, 'admin', 'former editor');
    revoked = gone.token;
    await revokeAccessToken(db, gone.summary.id);
  });
  afterAll(async () => {
    await app.close();
    await db.destroy();
    rmSync(folder, { recursive: true, force: true });
  });

  const entries = () =>
    routes.flatMap((route) =>
      methodsOf(route)
        .filter((method) => method !== 'HEAD')
        .map((method) => ({
          method,
          url: String(route.url),
          name: key(route, method),
          access: accessOf(method, String(route.url), route.config?.access),
        })),
    );

  it('opens exactly the allow-listed routes to anyone or to respondents', () => {
    const all = entries();
    expect(all.length).toBeGreaterThan(publicRoutes.length + respondentRoutes.length);
    expect(
      all
        .filter((r) => r.access === 'public')
        .map((r) => r.name)
        .sort(),
    ).toEqual(publicRoutes);
    expect(
      all
        .filter((r) => r.access === 'respondent')
        .map((r) => r.name)
        .sort(),
    ).toEqual(respondentRoutes);
  });

  it('refuses a missing, malformed, unknown and revoked token on every team route', async () => {
    const refusals: string[] = [];
    const team = entries().filter((r) => r.access === 'analyst' || r.access === 'admin');
    expect(team.length).toBeGreaterThan(5);
    const attempts: [string, Record<string, string>][] = [
      ['missing', {}],
      ['malformed', { authorization: 'Bearer' }],
      ['not bearer', { authorization: `Basic ${Buffer.from(`x:${adminToken}`).toString('base64')}` }],
      ['unknown', { authorization: `Bearer pgt_${'x'.repeat(43)}` }],
      ['near miss', { authorization: `Bearer ${adminToken.slice(0, -1)}` }],
      ['revoked', { authorization: `Bearer ${revoked}` }],
      ['junk cookie', { cookie: 'plotgauge_console=bootstrap.AAAA' }],
    ];
    for (const route of team) {
      for (const [what, headers] of attempts) {
        const reply = await app.inject({
          method: route.method as 'GET',
          url: concrete(route.url),
          headers: { ...headers, 'content-type': 'application/json' },
          payload: route.method === 'GET' || route.method === 'DELETE' ? undefined : '{}',
        });
        const page = consolePages.has(route.name);
        const ok = page
          ? reply.statusCode === 303 && String(reply.headers.location).startsWith('/sign-in')
          : reply.statusCode === 401 && reply.json().error.code === 'UNAUTHORIZED';
        if (!ok) refusals.push(`${route.name} with ${what} token: ${reply.statusCode}`);
      }
    }
    expect(refusals).toEqual([]);
  });

  it('refuses an analyst token on every admin route, and lets analysts and admins past the check', async () => {
    const wrong: string[] = [];
    for (const route of entries().filter((r) => r.access === 'analyst' || r.access === 'admin')) {
      const send = (token: string) =>
        app.inject({
          method: route.method as 'GET',
          url: concrete(route.url),
          headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
          payload: route.method === 'GET' ? undefined : '{}',
        });
      const asAnalyst = await send(analyst);
      const asAdmin = await send(admin);
      const passed = (status: number) => status !== 401 && status !== 403;
      if (route.access === 'admin' && asAnalyst.statusCode !== 403)
        wrong.push(`${route.name}: analyst got ${asAnalyst.statusCode}`);
      if (route.access === 'analyst' && !passed(asAnalyst.statusCode))
        wrong.push(`${route.name}: analyst refused with ${asAnalyst.statusCode}`);
      if (!passed(asAdmin.statusCode)) wrong.push(`${route.name}: admin refused with ${asAdmin.statusCode}`);
    }
    expect(wrong).toEqual([]);
  });

  it('never answers a respondent route with success without an attempt token', async () => {
    const leaks: string[] = [];
    for (const route of entries().filter((r) => r.access === 'respondent')) {
      for (const authorization of [undefined, 'Bearer', `Bearer ${admin}`, `Bearer ${adminToken}`]) {
        const reply = await app.inject({
          method: route.method as 'GET',
          url: concrete(route.url),
          headers: { 'content-type': 'application/json', ...(authorization ? { authorization } : {}) },
          payload: route.method === 'GET' ? undefined : '{}',
        });
        if (reply.statusCode < 400)
          leaks.push(`${route.name} (${authorization ?? 'none'}): ${reply.statusCode}`);
      }
    }
    expect(leaks).toEqual([]);
  });

  it('stored nothing for any refused request', async () => {
    expect(await db.selectFrom('studies').selectAll().execute()).toEqual([]);
    expect(await db.selectFrom('audit_log').selectAll().execute()).toEqual([]);
  });
});
