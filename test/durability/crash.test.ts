import type { ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Sqlite from 'better-sqlite3';
import { sql } from 'kysely';
import { afterAll, describe, expect, it } from 'vitest';
import { createDatabase } from '../../server/storage/create-database.js';
import { freePort, sleep, startServer } from './server-process.js';

/**
 * Crash durability: the real server as a child process, a bounded load of concurrent respondents on
 * loopback, SIGKILL in the middle, a restart, clients retrying every unacknowledged answer with the
 * same body. Every acknowledged answer must be stored exactly once, unchanged. On SQLite one instance
 * and `PRAGMA integrity_check` must say ok; on PostgreSQL (TEST_DATABASE_URL) two instances share
 * one fresh database and one of them is killed while clients fail over to the other.
 */
const adminToken = 'durability-admin-token-0123';
/**
 * The size: 200 respondents at once, 20 answers each (about 15 s on SQLite and 35 s on two
 * PostgreSQL instances on a 2-core machine; CRASH_RESPONDENTS and CRASH_ANSWERS change it).
 */
const respondents = Number(process.env.CRASH_RESPONDENTS ?? 200);
const answersEach = Number(process.env.CRASH_ANSWERS ?? 20);
/** How long the load may take: generous, as a loaded CI machine is slow (30 ms per answer on top). */
const loadMs = 90_000 + respondents * answersEach * 30;

interface Ack {
  token: string;
  itemId: string;
  answer: unknown;
}

const hashOf = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

/** The server of these tests: the real `plotgauge serve`, durable commits, this file's admin token. */
const serverEnv = { ADMIN_TOKEN: adminToken, LOG_LEVEL: process.env.CRASH_LOG ? 'error' : 'warn' };

/**
 * Starts `instances` servers on one database, drives the load, SIGKILLs instance 0 after a third of
 * the answers and restarts it; returns every acknowledged answer and the kill point.
 */
async function crashRun(databaseUrl: string, instances: number, running: ChildProcess[]) {
  const ports: number[] = [];
  for (let i = 0; i < instances; i++) ports.push(await freePort());
  // One at a time: the first migrates, the next finds the schema current.
  for (const port of ports) running.push(await startServer(port, databaseUrl, serverEnv));
  const bases = ports.map((port) => `http://127.0.0.1:${port}`);
  const adminHeaders = { authorization: `Bearer ${adminToken}`, 'content-type': 'application/json' };
  const post = async (url: string, body: unknown) => {
    const reply = await fetch(`${bases[0]}${url}`, {
      method: 'POST',
      headers: adminHeaders,
      body: JSON.stringify(body),
    });
    if (reply.status !== 201) throw new Error(`${url}: ${reply.status} ${await reply.text()}`);
    return (await reply.json()) as Record<string, string>;
  };
  const study = await post('/api/admin/studies', { title: 'Harbour durability', maxItems: answersEach });
  const cohort = await post(`/api/admin/studies/${study.id}/cohorts`, { label: 'Crash group' });

  const acks: Ack[] = [];
  let acksAtKill = 0;
  /** 5xx answers seen (a restarting instance answers 503), retried like network errors. */
  let serverErrors = 0;
  const deadline = Date.now() + loadMs;

  /** Sends until a definite answer arrives; on a network error or 5xx it retries, on the next instance. */
  async function send(
    first: number,
    url: string,
    init: RequestInit,
  ): Promise<{ status: number; body: Record<string, unknown> }> {
    let at = first;
    while (Date.now() < deadline) {
      try {
        const reply = await fetch(`${bases[at % bases.length]}${url}`, init);
        // Like the respondent page (sendReliably): a 5xx acknowledged nothing, so send it again.
        if (reply.status >= 500) {
          serverErrors += 1;
          throw new Error(`status ${reply.status}`);
        }
        return { status: reply.status, body: (await reply.json()) as Record<string, unknown> };
      } catch {
        at++;
        await sleep(50);
      }
    }
    throw new Error(`no answer from ${url} before the deadline`);
  }

  async function respondent(index: number): Promise<void> {
    const joined = await send(index, '/api/join', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ code: cohort.joinCode }),
    });
    if (joined.status !== 201) throw new Error(`join: ${joined.status}`);
    const token = joined.body.token as string;
    const headers = { authorization: `Bearer ${token}`, 'content-type': 'application/json' };
    await send(index, '/api/attempt/consent', {
      method: 'POST',
      headers,
      body: JSON.stringify({ agree: true }),
    });
    for (let i = 0; i < answersEach * 2; i++) {
      const state = await send(index, '/api/attempt', { headers });
      if (state.body.step !== 'item') return;
      const item = state.body.item as { itemId: string; responseKind: string; options?: { id: string }[] };
      const answer =
        item.responseKind === 'single-choice' || item.responseKind === 'multiple-choice'
          ? { kind: 'choice', optionIds: [item.options?.[0]?.id ?? 'a'] }
          : item.responseKind === 'numeric'
            ? { kind: 'number', value: 7 }
            : { kind: 'text', text: 'the ferry' };
      const body = JSON.stringify({ itemId: item.itemId, answer });
      const reply = await send(index, '/api/attempt/responses', { method: 'POST', headers, body });
      if (reply.status === 200 || reply.status === 201) acks.push({ token, itemId: item.itemId, answer });
      else throw new Error(`answer: ${reply.status} ${JSON.stringify(reply.body)}`);
    }
  }

  const killer = (async () => {
    while (acks.length < (respondents * answersEach) / 3 && Date.now() < deadline) await sleep(5);
    acksAtKill = acks.length;
    running[0]?.kill('SIGKILL');
    await sleep(200);
    running[0] = await startServer(ports[0] as number, databaseUrl, serverEnv);
  })();
  await Promise.all([...Array.from({ length: respondents }, (_, i) => respondent(i)), killer]);
  for (const proc of running) {
    proc.kill('SIGTERM');
    await new Promise((resolve) => proc.once('exit', resolve));
  }
  running.length = 0;
  return { acks, acksAtKill, serverErrors };
}

describe('sqlite: SIGKILL under load', () => {
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-crash-'));
  const file = path.join(folder, 'crash.db');
  const running: ChildProcess[] = [];
  afterAll(() => {
    for (const proc of running) proc.kill('SIGKILL');
    rmSync(folder, { recursive: true, force: true });
  });

  it('keeps every acknowledged answer exactly once across a SIGKILL', {
    timeout: loadMs + 30_000,
  }, async () => {
    const { acks, acksAtKill, serverErrors } = await crashRun(`sqlite:${file}`, 1, running);
    // One instance: a kill shows as network errors, never as a 5xx.
    expect(serverErrors).toBe(0);
    expect(acksAtKill).toBeGreaterThan(0);
    expect(acks.length).toBeGreaterThan(acksAtKill);
    const db = new Sqlite(file, { readonly: true });
    try {
      // SQLite documentation, PRAGMA integrity_check: a sound database answers one row, 'ok'.
      expect(db.pragma('integrity_check')).toEqual([{ integrity_check: 'ok' }]);
      const stored = db.prepare(
        'select r.answer as answer from responses r join attempts a on a.id = r.attempt_id where a.token_hash = ? and r.item_id = ?',
      );
      const wrong: string[] = [];
      for (const ack of acks) {
        const rows = stored.all(hashOf(ack.token), ack.itemId) as { answer: string }[];
        if (rows.length !== 1 || JSON.stringify(JSON.parse(rows[0]!.answer)) !== JSON.stringify(ack.answer))
          wrong.push(`${ack.itemId}: ${rows.length} rows`);
      }
      expect(wrong).toEqual([]);
    } finally {
      db.close();
    }
  });
});

const postgresUrl = process.env.TEST_DATABASE_URL;

describe.skipIf(!postgresUrl)('postgres: two instances, one killed under load', () => {
  const running: ChildProcess[] = [];
  afterAll(() => {
    for (const proc of running) proc.kill('SIGKILL');
  });

  it('keeps every acknowledged answer exactly once', { timeout: loadMs + 60_000 }, async () => {
    const admin = createDatabase(postgresUrl as string);
    const name = `plotgauge_crash_${Date.now().toString(36)}`;
    await sql`create database ${sql.id(name)}`.execute(admin);
    const url = new URL(postgresUrl as string);
    url.pathname = `/${name}`;
    const db = createDatabase(url.toString());
    try {
      const { acks, acksAtKill, serverErrors } = await crashRun(url.toString(), 2, running);
      // Retried like the page does. Seen once, on an overloaded machine; cause not captured (a wait
      // for a pool connection past its 5 s timeout would answer 500).
      if (serverErrors > 0)
        console.warn(`[crash test] ${serverErrors} answers got a 5xx and were sent again`);
      expect(acksAtKill).toBeGreaterThan(0);
      expect(acks.length).toBeGreaterThan(acksAtKill);
      const wrong: string[] = [];
      for (const ack of acks) {
        const rows = await db
          .selectFrom('responses as r')
          .innerJoin('attempts as a', 'a.id', 'r.attempt_id')
          .select('r.answer')
          .where('a.token_hash', '=', hashOf(ack.token))
          .where('r.item_id', '=', ack.itemId)
          .execute();
        if (
          rows.length !== 1 ||
          JSON.stringify(JSON.parse(rows[0]!.answer ?? 'null')) !== JSON.stringify(ack.answer)
        )
          wrong.push(`${ack.itemId}: ${rows.length} rows`);
      }
      expect(wrong).toEqual([]);
    } finally {
      await db.destroy();
      await sql`drop database if exists ${sql.id(name)} with (force)`.execute(admin);
      await admin.destroy();
    }
  });
});
