/**
 * Load benchmark of answer submission (`POST /api/attempt/responses`), loopback only, bounded:
 * autocannon at 1, 16 and 64 concurrent clients against the real app (real item bank, durable
 * commits: SQLITE_SYNC=full, one transaction per answer, acknowledged only after commit), beside a
 * no-op fastify route on the same server in the same run. Every request is a new answer (none is an
 * idempotent replay), taken from a queue of at least 200 attempts in rounds.
 *
 *   npx tsx scripts/bench/load.ts                 # SQLite (temp file)
 *   BENCH_DATABASE_URL=postgres://… npx tsx scripts/bench/load.ts   # also PostgreSQL (fresh database)
 *
 * Prints throughput (requests/s), p50 and p99 latency (ms), and the ratio to the no-op route.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import Fastify from 'fastify';
import { sql } from 'kysely';
import { appPlugin, serverOptions } from '../../server/app.js';
import { loadBank } from '../../server/bank/load-bank.js';
import { loadConfig } from '../../server/config.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { migrateToLatest } from '../../server/storage/migrate.js';

const adminToken = 'bench-admin-token-0123456789';
const concurrencies = [1, 16, 64];
const answersPerRun = 4000;
const secondsPerRun = 10;
const itemsPerAttempt = 20;

interface Row {
  engine: string;
  clients: number;
  route: string;
  perSecond: number;
  p50: number;
  p99: number;
  non2xx: number;
}

async function runAutocannon(options: autocannon.Options): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon(options, (error, result) => (error ? reject(error) : resolve(result)));
  });
}

async function benchEngine(engine: string, databaseUrl: string): Promise<Row[]> {
  const db = createDatabase(databaseUrl, { sqliteSync: 'full' });
  await migrateToLatest(db);
  const config = loadConfig({ ADMIN_TOKEN: adminToken, SQLITE_SYNC: 'full' }, { databaseUrl });
  const bank = await loadBank('items');
  const app = Fastify(serverOptions());
  await app.register(appPlugin, { config, db, bank });
  app.get('/bench/noop', { config: { access: 'public' } }, async () => ({ ok: true }));
  await app.listen({ port: 0, host: '127.0.0.1' });
  const address = app.server.address();
  const port = typeof address === 'object' && address !== null ? address.port : 0;
  const admin = { authorization: `Bearer ${adminToken}`, 'content-type': 'application/json' };
  const study = (
    await app.inject({
      method: 'POST',
      url: '/api/admin/studies',
      headers: admin,
      payload: { title: 'Bench', maxItems: itemsPerAttempt },
    })
  ).json();
  const cohort = (
    await app.inject({
      method: 'POST',
      url: `/api/admin/studies/${study.id}/cohorts`,
      headers: admin,
      payload: { label: 'Bench' },
    })
  ).json();

  /** Joins and consents `count` attempts; returns each one's ordered answer bodies. */
  async function attempts(count: number): Promise<{ token: string; bodies: string[] }[]> {
    const made: { token: string; bodies: string[] }[] = [];
    for (let i = 0; i < count; i++) {
      const joined = (
        await app.inject({ method: 'POST', url: '/api/join', payload: { code: cohort.joinCode } })
      ).json();
      const headers = { authorization: `Bearer ${joined.token}` };
      await app.inject({ method: 'POST', url: '/api/attempt/consent', headers, payload: { agree: true } });
      const row = await db
        .selectFrom('attempts')
        .select('form')
        .orderBy('started_at', 'desc')
        .executeTakeFirstOrThrow();
      const form = JSON.parse(row.form) as { items: { itemId: string }[] };
      made.push({
        token: joined.token,
        bodies: form.items.map((item) =>
          JSON.stringify({ itemId: item.itemId, answer: { kind: 'dont-know' } }),
        ),
      });
    }
    return made;
  }

  const rows: Row[] = [];
  for (const clients of concurrencies) {
    const pool = await attempts(Math.max(200, Math.ceil(answersPerRun / itemsPerAttempt) + clients));
    // One queue in rounds (every attempt's 1st answer, then every 2nd, …): an attempt's next answer
    // is a whole round behind its previous one, so it is never sent before that one is stored.
    const queue: { token: string; body: string }[] = [];
    for (let position = 0; position < itemsPerAttempt; position++) {
      for (const attempt of pool) {
        const body = attempt.bodies[position];
        if (body !== undefined) queue.push({ token: attempt.token, body });
      }
    }
    const answers = await runAutocannon({
      url: `http://127.0.0.1:${port}`,
      connections: clients,
      amount: answersPerRun,
      duration: secondsPerRun,
      requests: [
        {
          method: 'POST',
          path: '/api/attempt/responses',
          setupRequest: (request) => {
            const next = queue.shift();
            if (next === undefined) return request;
            return {
              ...request,
              headers: { authorization: `Bearer ${next.token}`, 'content-type': 'application/json' },
              body: next.body,
            };
          },
        },
      ],
    });
    const noop = await runAutocannon({
      url: `http://127.0.0.1:${port}/bench/noop`,
      connections: clients,
      duration: 5,
    });
    for (const [route, result] of [
      ['answer', answers],
      ['no-op', noop],
    ] as const) {
      rows.push({
        engine,
        clients,
        route,
        perSecond: result.requests.average,
        p50: result.latency.p50,
        p99: result.latency.p99,
        non2xx: result.non2xx + result.errors,
      });
    }
  }
  const stored = await sql<{ n: number }>`select count(*) as n from responses`.execute(db);
  console.log(`${engine}: ${stored.rows[0]?.n ?? 0} answers stored`);
  await app.close();
  await db.destroy();
  return rows;
}

const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-bench-'));
try {
  const rows = await benchEngine('sqlite', `sqlite:${path.join(folder, 'bench.db')}`);
  const postgres = process.env.BENCH_DATABASE_URL;
  if (postgres) {
    const adminDb = createDatabase(postgres);
    const name = `plotgauge_bench_${Date.now().toString(36)}`;
    await sql`create database ${sql.id(name)}`.execute(adminDb);
    const url = new URL(postgres);
    url.pathname = `/${name}`;
    try {
      rows.push(...(await benchEngine('postgres', url.toString())));
    } finally {
      await sql`drop database if exists ${sql.id(name)} with (force)`.execute(adminDb);
      await adminDb.destroy();
    }
  }
  console.log('| engine | clients | answers/s | p50 ms | p99 ms | non-2xx | no-op/s | answers ÷ no-op |');
  console.log('|---|---|---|---|---|---|---|---|');
  for (const row of rows.filter((r) => r.route === 'answer')) {
    const noop = rows.find(
      (r) => r.route === 'no-op' && r.engine === row.engine && r.clients === row.clients,
    );
    const ratio = noop && noop.perSecond > 0 ? (row.perSecond / noop.perSecond).toFixed(3) : '-';
    console.log(
      `| ${row.engine} | ${row.clients} | ${row.perSecond.toFixed(0)} | ${row.p50} | ${row.p99} | ${row.non2xx} | ${noop?.perSecond.toFixed(0) ?? '-'} | ${ratio} |`,
    );
  }
} finally {
  rmSync(folder, { recursive: true, force: true });
}
