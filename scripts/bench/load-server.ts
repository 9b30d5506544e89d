/**
 * The server side of `scripts/bench/load.ts`: started as its own process (as `plotgauge serve`
 * runs), so the load generator does not share its event loop. It opens the database and bank the
 * way `serve` does, builds the real app, and adds two routes for the benchmark only:
 * `GET /bench/noop` (the no-op baseline: every hook of the app, no handler work),
 * `POST /bench/bare-write` (the durable-write baseline: one row of one text column inserted through
 * the same write queue as answers, acknowledged after its commit, nothing else) and
 * `GET /bench/counters` (the group-commit counters, for the mean batch size, and the process's CPU
 * time, for the CPU cost of one request: steadier than throughput on a busy machine).
 *
 * Environment: DATABASE_URL, ADMIN_TOKEN, SQLITE_SYNC, LOG_LEVEL (default warn: no request lines).
 * Prints one JSON line `{"port": n}` on stdout when it listens; SIGTERM closes it.
 */
import { randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import { buildApp } from '../../server/app.js';
import { openBank, recordItemVersions } from '../../server/cli/open-bank.js';
import { openDatabase } from '../../server/cli/open-database.js';
import { loadConfig } from '../../server/config.js';
import { WriteBatch, writeQueueFor } from '../../server/storage/write-batch.js';

const config = loadConfig({ LOG_LEVEL: 'warn', ...process.env, PORT: '0', HOST: '127.0.0.1' });
const bank = await openBank(config.itemsDir);
const db = await openDatabase(config);
await recordItemVersions(db, bank);
const app = await buildApp({ config, db, bank, logger: { level: config.logLevel } });
app.get('/bench/noop', { config: { access: 'public' } }, async () => ({ ok: true }));
await sql`create table if not exists bench_writes (id varchar(36) primary key, at text not null)`.execute(db);
const writes = writeQueueFor(db);
app.post('/bench/bare-write', { config: { access: 'public' } }, async () => {
  await writes.run((trx) =>
    sql`insert into bench_writes (id, at) values (${randomUUID()}, ${new Date().toISOString()})`.execute(trx),
  );
  return { ok: true };
});
app.get('/bench/counters', { config: { access: 'public' } }, async () => {
  const queue = writes;
  const cpu = process.cpuUsage();
  return {
    ...(queue instanceof WriteBatch ? queue.stats : { commits: 0, units: 0 }),
    cpuMicroseconds: cpu.user + cpu.system,
  };
});
await app.listen({ port: 0, host: '127.0.0.1' });
const address = app.server.address();
console.log(JSON.stringify({ port: typeof address === 'object' && address !== null ? address.port : 0 }));
process.once('SIGTERM', () => {
  void (async () => {
    await app.close();
    await db.destroy();
    process.exit(0);
  })();
});
