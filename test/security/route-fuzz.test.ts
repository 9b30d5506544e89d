import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import type { FastifyInstance, RouteOptions } from 'fastify';
import Fastify from 'fastify';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appPlugin, serverOptions } from '../../server/app.js';
import { loadConfig } from '../../server/config.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { createAccessToken } from '../../server/storage/token-repository.js';
import { studyWithCohort } from '../helpers/delivery-fixture.js';
import { loadTestBank } from '../helpers/test-bank.js';

/**
 * Property-based fuzzing of every route in the route table: malformed, oversized, wrong-typed,
 * deeply nested and unusual-Unicode bodies, path parameters, query strings and headers, with and
 * without valid tokens. No answer is a 5xx, and a refused request (4xx) leaves every table as it was.
 * Bounded: 30 runs per route, a fixed seed per route so a failure replays.
 */
const adminToken = 'test-admin-token-0123456789';
const runsPerRoute = 30;

const oddText = fc.oneof(
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.constantFrom(
    '\u0000',
    '\u202e\u0041',
    '\ud800',
    '𝔘𝔫𝔦',
    'e\u0301',
    '../../etc/passwd',
    "' or 1=1 --",
    '%00',
    '🏳️‍🌈',
  ),
);
const deep = fc.integer({ min: 50, max: 2000 }).map((depth) => {
  let value: unknown = 'x';
  for (let i = 0; i < depth; i++) value = i % 2 === 0 ? { a: value } : [value];
  return value;
});
const body = fc.oneof(
  fc.jsonValue({ maxDepth: 4 }).map((v) => JSON.stringify(v)),
  deep.map((v) => JSON.stringify(v)),
  oddText,
  fc.constant('{"title":'),
  fc.integer({ min: 65_000, max: 300_000 }).map((n) => JSON.stringify({ title: 'x'.repeat(n) })),
  fc
    .record({
      title: oddText,
      label: oddText,
      code: oddText,
      itemId: oddText,
      answer: fc.jsonValue({ maxDepth: 3 }),
    })
    .map((v) => JSON.stringify(v)),
);
const contentType = fc.constantFrom(
  'application/json',
  'application/json; charset=utf-16',
  'text/plain',
  'application/x-www-form-urlencoded',
  'multipart/form-data; boundary=x',
  '',
);
const authorization = fc.constantFrom('none', 'admin', 'team', 'junk');
/** Percent-encodes any text; a lone surrogate becomes U+FFFD first (UTF-8 cannot carry it). */
const encode = (text: string) => encodeURIComponent(Buffer.from(text, 'utf8').toString('utf8'));

function dumpTables(db: ReturnType<typeof createDatabase>, tables: readonly string[]) {
  return Promise.all(
    tables.map(async (table) => {
      const rows = await sql<Record<string, unknown>>`select * from ${sql.table(table)}`.execute(db);
      // A token's last use is bookkeeping of the access check, not a change a request made.
      const cleaned = rows.rows.map(({ last_used_at: _ignored, ...rest }) => JSON.stringify(rest)).sort();
      return [table, cleaned] as const;
    }),
  );
}

describe('fuzzing every route', () => {
  const routes: RouteOptions[] = [];
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-fuzz-'));
  const url = `sqlite:${path.join(folder, 'fuzz.db')}`;
  const db = createDatabase(url);
  let app: FastifyInstance;
  let team: string;
  let tables: string[];
  beforeAll(async () => {
    await migrateToLatest(db);
    app = Fastify(serverOptions());
    app.addHook('onRoute', (route) => void routes.push(route));
    const config = loadConfig({ ADMIN_TOKEN: adminToken }, { databaseUrl: url });
    await app.register(appPlugin, { config, db, bank: await loadTestBank() });
    await app.ready();
    team = (await createAccessToken(db, 'analyst', 'fuzzer')).token;
    await studyWithCohort(app);
    const listed = await sql<{ name: string }>`select name from sqlite_master where type = 'table'`.execute(
      db,
    );
    tables = listed.rows.map((r) => r.name).filter((name) => !name.startsWith('sqlite_'));
  });
  afterAll(async () => {
    await app.close();
    await db.destroy();
    rmSync(folder, { recursive: true, force: true });
  });

  it('answers every route without a 5xx, and changes nothing when it refuses', {
    timeout: 120_000,
  }, async () => {
    const endpoints = routes.flatMap((route) =>
      (Array.isArray(route.method) ? route.method : [route.method])
        .map(String)
        .filter((method) => method !== 'HEAD')
        .map((method) => ({ method, url: String(route.url) })),
    );
    expect(endpoints.length).toBeGreaterThan(10);
    const faults: string[] = [];
    for (const [index, endpoint] of endpoints.entries()) {
      await fc
        .assert(
          fc.asyncProperty(
            fc.array(oddText, { minLength: 3, maxLength: 3 }),
            fc.dictionary(oddText, oddText, { maxKeys: 4 }),
            body,
            contentType,
            authorization,
            oddText,
            async (params, query, payload, type, who, extraHeader) => {
              let n = 0;
              const concrete = endpoint.url.replace(/:[A-Za-z]+/g, () => encode(params[n++ % 3] ?? ''));
              const search = new URLSearchParams(query).toString();
              const headers: Record<string, string> = { 'x-odd': encode(extraHeader) };
              if (type !== '') headers['content-type'] = type;
              if (who === 'admin') headers.authorization = `Bearer ${adminToken}`;
              if (who === 'team') headers.authorization = `Bearer ${team}`;
              if (who === 'junk') headers.authorization = `Bearer ${encode(extraHeader)}`;
              const before = await dumpTables(db, tables);
              const reply = await app.inject({
                method: endpoint.method as 'GET',
                url: search === '' ? concrete : `${concrete}?${search}`,
                headers,
                ...(endpoint.method === 'GET' || endpoint.method === 'DELETE' ? {} : { payload }),
              });
              if (reply.statusCode >= 500) {
                faults.push(
                  `${endpoint.method} ${endpoint.url}: ${reply.statusCode} ${reply.body.slice(0, 200)}`,
                );
                return false;
              }
              if (reply.statusCode >= 400) {
                const after = await dumpTables(db, tables);
                if (JSON.stringify(after) !== JSON.stringify(before)) {
                  faults.push(`${endpoint.method} ${endpoint.url}: ${reply.statusCode} changed the database`);
                  return false;
                }
              }
              return true;
            },
          ),
          { numRuns: runsPerRoute, seed: 9000 + index, endOnFailure: true },
        )
        .catch((error: unknown) => {
          // A counterexample is already in `faults`; anything else (a thrown request) is a fault too.
          const message = error instanceof Error ? error.message.slice(0, 600) : String(error);
          if (!faults.some((f) => f.startsWith(`${endpoint.method} ${endpoint.url}`)))
            faults.push(`${endpoint.method} ${endpoint.url}: ${message}`);
        });
    }
    expect(faults).toEqual([]);
  });
});
