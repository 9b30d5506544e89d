/**
 * Load benchmark of answer submission (`POST /api/attempt/responses`), loopback only, bounded by
 * count and time. The server runs as its own process (`scripts/bench/load-server.ts`: the real app,
 * real item bank, SQLITE_SYNC=full, answers acknowledged only after their commit), and autocannon
 * drives it from this process at 1, 16 and 64 concurrent clients; at each level a no-op route of the
 * same server (`GET /bench/noop`, every hook of the app, no work) is measured in the same run as the
 * baseline, and so is a bare durable write (`POST /bench/bare-write`: one small row through the same
 * group commit, acknowledged after its commit): what any acknowledged write costs here, whatever
 * the answer route does besides. Every request is a new answer (no idempotent replays): choice items get their first
 * option, numeric items the keyed number, text items a short text, taken from a queue of attempts in
 * rounds so an attempt's next answer is sent only after its previous one was acknowledged.
 *
 *   npx tsx scripts/bench/load.ts                 # SQLite (temporary file)
 *   BENCH_DATABASE_URL=postgres://postgres@127.0.0.1:5432/test npx tsx scripts/bench/load.ts
 *       # also PostgreSQL: a fresh database is created beside that one and dropped afterwards
 *   BENCH_CPU_PROFILE=<folder> …                  # the server writes a V8 CPU profile there (--cpu-prof)
 *   BENCH_ANSWERS=8000 BENCH_SECONDS=10 …         # answers per run (bound) and seconds per run (bound)
 *   BENCH_CLIENTS=64 …                            # other concurrency levels (comma-separated)
 *
 * Prints answers/s, p50 and p99 latency (ms), the mean group-commit batch, the no-op route's
 * requests/s, and the ratio answers ÷ no-op; then checks that the stored answers equal the
 * acknowledged ones.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { sql } from 'kysely';
import { type BankItem, loadBank } from '../../server/bank/load-bank.js';
import { hashAttemptToken } from '../../server/delivery/attempt-token.js';
import { createDatabase } from '../../server/storage/create-database.js';

const repo = fileURLToPath(new URL('../..', import.meta.url));
const adminToken = 'bench-admin-token-0123456789';
const concurrencies = (process.env.BENCH_CLIENTS ?? '1,16,64').split(',').map(Number);
const answersPerRun = Number(process.env.BENCH_ANSWERS ?? 8000);
const secondsPerRun = Number(process.env.BENCH_SECONDS ?? 15);
const noopSeconds = 6;
/** Answer and no-op runs alternate in this many slices per level. */
const slices = 3;
const warmUpAnswers = 1000;
const itemsPerAttempt = 20;
const profileFolder = process.env.BENCH_CPU_PROFILE;

interface Row {
  engine: string;
  clients: number;
  perSecond: number;
  p50: number;
  p99: number;
  non2xx: number;
  acknowledged: number;
  meanBatch: number;
  cpuPerAnswer: number;
  noopPerSecond: number;
  noopP99: number;
  cpuPerNoop: number;
  barePerSecond: number;
}

/** What one load slice measured. */
interface Slice {
  ok: number;
  other: number;
  seconds: number;
  latencies: number[];
  /** Responses by status code other than 2xx. */
  refused: Record<string, number>;
}

/**
 * Runs autocannon and records every response's latency (ms); with `amount` it also stops after
 * `maxSeconds` (autocannon otherwise lets an amount win over a duration).
 */
function runAutocannon(options: autocannon.Options, maxSeconds?: number): Promise<Slice> {
  return new Promise((resolve, reject) => {
    let timer: NodeJS.Timeout | undefined;
    // Our own clock: with `amount`, autocannon stops at its next one-second tick, so its `duration`
    // rounds a 1.01 s slice up to 2 s (and halves the rate). The slice is first request to last reply.
    const started = performance.now();
    let lastReply = started;
    const latencies: number[] = [];
    const refused: Record<string, number> = {};
    const instance = autocannon(options, (error, result) => {
      clearTimeout(timer);
      if (error) reject(error);
      else
        resolve({
          ok: result['2xx'],
          other: result.non2xx + result.errors + result.timeouts,
          seconds: (lastReply - started) / 1000,
          latencies,
          refused,
        });
    });
    instance.on('response', (_client, status, _bytes, responseTime) => {
      lastReply = performance.now();
      latencies.push(responseTime);
      if (status < 200 || status > 299) refused[status] = (refused[status] ?? 0) + 1;
    });
    if (maxSeconds !== undefined) timer = setTimeout(() => instance.stop(), maxSeconds * 1000);
  });
}

/** The q-quantile of a list (nearest rank), in ms rounded to 0.1. */
function quantile(values: number[], q: number): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return Math.round((sorted[rank] as number) * 10) / 10;
}

function combine(slices: Slice[]): Slice {
  return {
    ok: slices.reduce((sum, s) => sum + s.ok, 0),
    other: slices.reduce((sum, s) => sum + s.other, 0),
    seconds: slices.reduce((sum, s) => sum + s.seconds, 0),
    latencies: slices.flatMap((s) => s.latencies),
    refused: slices.reduce<Record<string, number>>((all, s) => {
      for (const [status, n] of Object.entries(s.refused)) all[status] = (all[status] ?? 0) + n;
      return all;
    }, {}),
  };
}

/** Starts the benchmark server on a database; resolves with its process and port. */
async function startServer(databaseUrl: string): Promise<{ child: ChildProcess; port: number }> {
  const node = ['--import', 'tsx'];
  if (profileFolder) node.push('--cpu-prof', `--cpu-prof-dir=${path.resolve(profileFolder)}`);
  const child = spawn(process.execPath, [...node, 'scripts/bench/load-server.ts'], {
    cwd: repo,
    env: {
      ...process.env,
      DATABASE_URL: databaseUrl,
      ADMIN_TOKEN: adminToken,
      SQLITE_SYNC: 'full',
      ITEMS_DIR: 'items',
      LOG_LEVEL: 'warn',
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const lines = createInterface({ input: child.stdout as NodeJS.ReadableStream });
  const port = await new Promise<number>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('bench server did not start in 60 s')), 60_000);
    child.once('exit', (code) => reject(new Error(`bench server exited with ${code}`)));
    lines.on('line', (line) => {
      try {
        const parsed = JSON.parse(line) as { port?: number };
        if (typeof parsed.port === 'number') {
          clearTimeout(timer);
          resolve(parsed.port);
        }
      } catch {
        // not the ready line
      }
    });
  });
  return { child, port };
}

async function stopServer(child: ChildProcess): Promise<void> {
  const exited = new Promise((resolve) => child.once('exit', resolve));
  child.kill('SIGTERM');
  await exited;
}

/** A valid answer to an item (right or wrong does not matter for the load). */
function answerTo(item: BankItem | undefined): unknown {
  const response = item?.response;
  if (response === undefined) return { kind: 'dont-know' };
  if (response.kind === 'single-choice' || response.kind === 'multiple-choice')
    return { kind: 'choice', optionIds: [response.options[0]?.id] };
  if (response.kind === 'numeric') return { kind: 'number', value: item?.resolvedKey.value ?? 0 };
  return { kind: 'text', text: 'the ferry leaves at noon' };
}

async function benchEngine(engine: string, databaseUrl: string): Promise<Row[]> {
  const bank = await loadBank('items');
  const { child, port } = await startServer(databaseUrl);
  const base = `http://127.0.0.1:${port}`;
  // Reads the attempts' forms (which items, in which order); the server owns every write.
  const reader = createDatabase(databaseUrl);
  try {
    const admin = { authorization: `Bearer ${adminToken}`, 'content-type': 'application/json' };
    const post = async (url: string, body: unknown, headers: Record<string, string> = admin) => {
      const reply = await fetch(`${base}${url}`, { method: 'POST', headers, body: JSON.stringify(body) });
      if (!reply.ok) throw new Error(`${url}: ${reply.status} ${await reply.text()}`);
      return (await reply.json()) as Record<string, unknown>;
    };
    const study = await post('/api/admin/studies', {
      title: 'Orbelle Bikes load',
      maxItems: itemsPerAttempt,
    });
    const cohort = await post(`/api/admin/studies/${study.id}/cohorts`, { label: 'Load group' });
    const json = { 'content-type': 'application/json' };

    /** Joins and consents `count` attempts (8 at a time); returns each one's ordered answer bodies. */
    async function attempts(count: number): Promise<{ token: string; bodies: string[] }[]> {
      const tokens: string[] = [];
      for (let start = 0; start < count; start += 8) {
        const batch = await Promise.all(
          Array.from({ length: Math.min(8, count - start) }, async () => {
            const joined = await post('/api/join', { code: cohort.joinCode }, json);
            const token = joined.token as string;
            await post(
              '/api/attempt/consent',
              { agree: true },
              { ...json, authorization: `Bearer ${token}` },
            );
            return token;
          }),
        );
        tokens.push(...batch);
      }
      const rows = await reader
        .selectFrom('attempts')
        .select(['token_hash', 'form'])
        .where(
          'token_hash',
          'in',
          tokens.map((token) => hashAttemptToken(token)),
        )
        .execute();
      const forms = new Map(
        rows.map((row) => [row.token_hash, JSON.parse(row.form) as { items: { itemId: string }[] }]),
      );
      return tokens.map((token) => ({
        token,
        bodies: (forms.get(hashAttemptToken(token))?.items ?? []).map((item) =>
          JSON.stringify({ itemId: item.itemId, answer: answerTo(bank.byId.get(item.itemId)) }),
        ),
      }));
    }

    /**
     * Sends `amount` new answers at `clients` concurrent connections, for at most `seconds`. Each
     * connection takes the next attempt that has no answer in flight and sends its next answer, and
     * hands the attempt back when the reply arrives: like respondents, who answer one chart at a time.
     */
    async function answerRun(clients: number, amount: number, seconds: number): Promise<Slice> {
      const pool = await attempts(Math.ceil(amount / itemsPerAttempt) + clients + 1);
      const ready = pool.map((attempt) => ({ ...attempt, next: 0 }));
      type Respondent = (typeof ready)[number];
      return runAutocannon(
        {
          url: base,
          connections: clients,
          amount,
          requests: [
            {
              method: 'POST',
              path: '/api/attempt/responses',
              setupRequest: (request, context) => {
                const respondent = ready.shift();
                (context as { respondent?: Respondent }).respondent = respondent;
                if (respondent === undefined) return request;
                return {
                  ...request,
                  headers: {
                    authorization: `Bearer ${respondent.token}`,
                    'content-type': 'application/json',
                  },
                  body: respondent.bodies[respondent.next] as string,
                };
              },
              onResponse: (_status, _body, context) => {
                const respondent = (context as { respondent?: Respondent }).respondent;
                if (respondent === undefined) return;
                respondent.next += 1;
                if (respondent.next < respondent.bodies.length) ready.push(respondent);
              },
            },
          ],
        },
        seconds,
      );
    }
    const noopRun = (clients: number, seconds: number) =>
      runAutocannon({ url: `${base}/bench/noop`, connections: clients, duration: seconds });

    const bareRun = (clients: number, seconds: number) =>
      runAutocannon({
        url: `${base}/bench/bare-write`,
        method: 'POST',
        connections: clients,
        duration: seconds,
      });

    const counters = async () =>
      (await (await fetch(`${base}/bench/counters`)).json()) as {
        commits: number;
        units: number;
        cpuMicroseconds: number;
      };

    await answerRun(16, warmUpAnswers, secondsPerRun);
    await noopRun(16, 2);
    const stored0 = await sql<{ n: number }>`select count(*) as n from responses`.execute(reader);
    const rows: Row[] = [];
    let acknowledgedTotal = 0;
    for (const clients of concurrencies) {
      // Answers and no-op alternate in slices, so a change in the machine's other load during the
      // run hits both sides of the ratio alike.
      const answerSlices: Slice[] = [];
      const noopSlices: Slice[] = [];
      const bareSlices: Slice[] = [];
      let answerCpu = 0;
      let noopCpu = 0;
      let commits = 0;
      let units = 0;
      for (let slice = 0; slice < slices; slice++) {
        const before = await counters();
        answerSlices.push(
          await answerRun(clients, Math.ceil(answersPerRun / slices), secondsPerRun / slices),
        );
        const middle = await counters();
        noopSlices.push(await noopRun(clients, noopSeconds / slices));
        const after = await counters();
        bareSlices.push(await bareRun(clients, noopSeconds / slices));
        answerCpu += middle.cpuMicroseconds - before.cpuMicroseconds;
        noopCpu += after.cpuMicroseconds - middle.cpuMicroseconds;
        commits += middle.commits - before.commits;
        units += middle.units - before.units;
      }
      const answers = combine(answerSlices);
      const noop = combine(noopSlices);
      const bare = combine(bareSlices);
      acknowledgedTotal += answers.ok;
      if (answers.other > 0)
        console.log(
          `${engine} ${clients} clients: not acknowledged ${JSON.stringify(answers.refused)} (status: count; errors and timeouts besides)`,
        );
      rows.push({
        engine,
        clients,
        perSecond: answers.ok / (answers.seconds || 1),
        p50: quantile(answers.latencies, 0.5),
        p99: quantile(answers.latencies, 0.99),
        non2xx: answers.other,
        acknowledged: answers.ok,
        meanBatch: commits > 0 ? units / commits : 1,
        cpuPerAnswer: answerCpu / Math.max(1, answers.ok + answers.other),
        noopPerSecond: noop.ok / (noop.seconds || 1),
        noopP99: quantile(noop.latencies, 0.99),
        cpuPerNoop: noopCpu / Math.max(1, noop.ok + noop.other),
        barePerSecond: bare.ok / (bare.seconds || 1),
      });
    }
    const stored = await sql<{ n: number }>`select count(*) as n from responses`.execute(reader);
    const newRows = Number(stored.rows[0]?.n ?? 0) - Number(stored0.rows[0]?.n ?? 0);
    // A slice stopped by its time bound may leave answers in flight: stored, never acknowledged.
    const inFlightBound = concurrencies.reduce((sum, clients) => sum + clients * slices, 0);
    const verdict =
      newRows < acknowledgedTotal
        ? 'FEWER STORED THAN ACKNOWLEDGED'
        : `ok: every acknowledged answer stored; ${newRows - acknowledgedTotal} more were in flight when a slice stopped (at most ${inFlightBound})`;
    console.log(`${engine}: ${acknowledgedTotal} answers acknowledged, ${newRows} stored (${verdict})`);
    return rows;
  } finally {
    await reader.destroy();
    await stopServer(child);
  }
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
  console.log(
    `\nper level: ≤ ${answersPerRun} answers in ≤ ${secondsPerRun} s, ${noopSeconds} s of no-op and ${noopSeconds} s of bare writes, alternating in ${slices} slices; ` +
      'server: own process, LOG_LEVEL=warn, SQLITE_SYNC=full; CPU = server process user+system time per request',
  );
  console.log(
    '| engine | clients | answers/s | p50 ms | p99 ms | non-2xx | mean batch | CPU µs/answer | no-op/s | no-op p99 ms | CPU µs/no-op | answers/s ÷ no-op/s | CPU no-op ÷ answer | bare writes/s | bare ÷ no-op | answers ÷ bare |',
  );
  console.log('|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|');
  for (const row of rows) {
    const ratio = row.noopPerSecond > 0 ? (row.perSecond / row.noopPerSecond).toFixed(3) : '-';
    const cpuRatio = row.cpuPerAnswer > 0 ? (row.cpuPerNoop / row.cpuPerAnswer).toFixed(3) : '-';
    const bareRatio = row.noopPerSecond > 0 ? (row.barePerSecond / row.noopPerSecond).toFixed(3) : '-';
    const answersToBare = row.barePerSecond > 0 ? (row.perSecond / row.barePerSecond).toFixed(3) : '-';
    console.log(
      `| ${row.engine} | ${row.clients} | ${row.perSecond.toFixed(0)} | ${row.p50} | ${row.p99} | ${row.non2xx} | ${row.meanBatch.toFixed(1)} | ${row.cpuPerAnswer.toFixed(0)} | ${row.noopPerSecond.toFixed(0)} | ${row.noopP99} | ${row.cpuPerNoop.toFixed(0)} | ${ratio} | ${cpuRatio} | ${row.barePerSecond.toFixed(0)} | ${bareRatio} | ${answersToBare} |`,
    );
  }
} finally {
  rmSync(folder, { recursive: true, force: true });
}
