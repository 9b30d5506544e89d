import type { ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Sqlite from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { type BankItem, loadBank } from '../../server/bank/load-bank.js';
import { buildReport } from '../../server/reports/build-report.js';
import type { Report } from '../../server/reports/report-types.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { freePort, repo, runCliProcess, startServer, stopServer } from './server-process.js';

/**
 * Backup under load: respondents answer through the real server (its own process, SQLITE_SYNC=full)
 * while `plotgauge backup` (the real command, its own process) copies the database; the copy is put
 * back with `plotgauge restore` into a new file, which must pass `PRAGMA integrity_check`, and the
 * report built from it (calibration + report, the real functions) must equal the report of the
 * source database as it stood at the moment of the snapshot.
 *
 * "As it stood at the snapshot" is rebuilt from the source after the load: answers are only ever
 * inserted, and the server commits them in order, so the snapshot must be a prefix of the source's
 * answers (checked: every copied row is identical in the source, and every answer the copy lacks was
 * received no earlier than the copy's last one). The source copy then keeps exactly those answers and
 * attempts; an attempt counts as finished when all its items are answered (no time limit here), which
 * is what the server records in the same commit as the last answer. Consent is the one field that
 * changes in place with no order visible in the source (a join before the snapshot, its consent after,
 * both in the same millisecond as other commits), so it is taken from the copy.
 */
const adminToken = 'backup-load-admin-token-0123';
/** Respondents at least; more start while the backup still runs (at most `maxRespondents`). */
const respondents = 160;
const maxRespondents = 1200;
const atOnce = 40;
const itemsEach = 8;
/** Finished attempts before the backup starts, so the copy has enough (30) to calibrate. */
const finishedBeforeBackup = 60;

/** A small deterministic generator (mulberry32), one per respondent. */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Right with probability 1/(1 + e^-(θ - b)); a wrong answer is another option, or "I don't know". */
function answerFor(item: BankItem | undefined, right: boolean): unknown {
  const response = item?.response;
  if (item === undefined || response === undefined) return { kind: 'dont-know' };
  if (response.kind === 'single-choice' || response.kind === 'multiple-choice') {
    const keyed = item.resolvedKey.optionIds;
    if (right) return { kind: 'choice', optionIds: [...keyed] };
    const other = response.options.find((o) => !keyed.includes(o.id));
    return other ? { kind: 'choice', optionIds: [other.id] } : { kind: 'dont-know' };
  }
  if (response.kind === 'numeric' && right && item.resolvedKey.value !== null)
    return { kind: 'number', value: item.resolvedKey.value };
  if (response.kind === 'short-text') return { kind: 'text', text: 'the ferry to Velmora Isle' };
  return { kind: 'dont-know' };
}

/** The report without what differs between two calibrations of the same data (id, time stamp). */
function comparable(report: Report): unknown {
  const { id, createdAt } = report.calibration;
  return JSON.parse(
    JSON.stringify(report).replaceAll(id, 'calibration-id').replaceAll(createdAt, 'created-at'),
  );
}

describe('sqlite: backup taken under load', () => {
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-backup-load-'));
  const source = path.join(folder, 'source.db');
  const backup = path.join(folder, 'backup.db');
  const restored = path.join(folder, 'restored.db');
  const atSnapshot = path.join(folder, 'source-at-snapshot.db');
  let server: ChildProcess | undefined;
  afterAll(() => {
    server?.kill('SIGKILL');
    rmSync(folder, { recursive: true, force: true });
  });

  it('restores to a sound database whose report equals the source at the snapshot', {
    timeout: 180_000,
  }, async () => {
    const bank = await loadBank(path.join(repo, 'items'));
    const port = await freePort();
    server = await startServer(port, `sqlite:${source}`, { ADMIN_TOKEN: adminToken });
    const base = `http://127.0.0.1:${port}`;
    const post = async (url: string, body: unknown, headers: Record<string, string>) => {
      const reply = await fetch(`${base}${url}`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', ...headers },
        body: JSON.stringify(body),
      });
      return { status: reply.status, body: (await reply.json()) as Record<string, unknown> };
    };
    const admin = { authorization: `Bearer ${adminToken}` };
    const study = await post(
      '/api/admin/studies',
      { title: 'Lumen Hall backup', maxItems: itemsEach },
      admin,
    );
    expect(study.status).toBe(201);
    const cohort = await post(
      `/api/admin/studies/${study.body.id}/cohorts`,
      { label: 'Evening visitors' },
      admin,
    );
    expect(cohort.status).toBe(201);

    let finished = 0;
    let acknowledged = 0;
    let backupRunning = false;
    let acknowledgedDuringBackup = 0;
    let backupDone: Promise<{ code: number | null; out: string; errors: string }> | undefined;

    async function respondent(index: number): Promise<void> {
      const next = random(2031 + index);
      const theta = Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
      const joined = await post('/api/join', { code: cohort.body.joinCode }, {});
      if (joined.status !== 201) throw new Error(`join: ${joined.status}`);
      const headers = { authorization: `Bearer ${joined.body.token as string}` };
      const consent = await post('/api/attempt/consent', { agree: true }, headers);
      let state = consent.body as { step: string; item?: { itemId: string } };
      while (state.step === 'item' && state.item) {
        const item = bank.byId.get(state.item.itemId);
        const b = item ? (item.id.length % 5) / 2 - 1 : 0; // an invented difficulty in [-1, 1]
        const right = next() < 1 / (1 + Math.exp(-(theta - b)));
        const reply = await post(
          '/api/attempt/responses',
          { itemId: state.item.itemId, answer: answerFor(item, right) },
          headers,
        );
        if (reply.status !== 201) throw new Error(`answer: ${reply.status} ${JSON.stringify(reply.body)}`);
        acknowledged += 1;
        if (backupRunning) acknowledgedDuringBackup += 1;
        state = reply.body.attempt as typeof state;
      }
      finished += 1;
      if (finished === finishedBeforeBackup) {
        // The real command, in its own process, while the other respondents keep answering.
        backupRunning = true;
        backupDone = runCliProcess(['backup', backup, '--database', `sqlite:${source}`]).then((result) => {
          backupRunning = false;
          return result;
        });
      }
    }

    let started = 0;
    await Promise.all(
      Array.from({ length: atOnce }, async () => {
        // Keep the load on until the copy is done: the command takes seconds to start.
        while (started < respondents || (backupRunning && started < maxRespondents))
          await respondent(started++);
      }),
    );
    const backupResult = await (backupDone as NonNullable<typeof backupDone>);
    await stopServer(server);
    expect(backupResult.code, backupResult.errors).toBe(0);
    expect(backupResult.out).toMatch(/integrity ok/);
    expect(acknowledged).toBe(started * itemsEach);
    // Under load: answers were acknowledged (so committed) while the copy was being taken.
    expect(acknowledgedDuringBackup).toBeGreaterThan(0);

    const restore = await runCliProcess(['restore', backup, '--database', `sqlite:${restored}`]);
    expect(restore.code, restore.errors).toBe(0);
    const copy = new Sqlite(restored, { readonly: true });
    const whole = new Sqlite(source, { readonly: true });
    try {
      // SQLite documentation, PRAGMA integrity_check: a sound database answers one row, 'ok'.
      expect(copy.pragma('integrity_check')).toEqual([{ integrity_check: 'ok' }]);
      const copied = copy.prepare('select * from responses order by id').all() as {
        id: string;
        received_at: string;
      }[];
      const all = new Map(
        (whole.prepare('select * from responses').all() as { id: string; received_at: string }[]).map(
          (row) => [row.id, row],
        ),
      );
      // A snapshot taken while answers kept arriving: some, not all, and at least the finished ones.
      expect(copied.length).toBeGreaterThanOrEqual(finishedBeforeBackup * itemsEach);
      expect(copied.length).toBeLessThan(all.size);
      expect(copied.filter((row) => JSON.stringify(all.get(row.id)) !== JSON.stringify(row))).toEqual([]);
      const lastCopied =
        copied
          .map((row) => row.received_at)
          .sort()
          .at(-1) ?? '';
      const copiedIds = new Set(copied.map((row) => row.id));
      const missedEarlier = [...all.values()].filter(
        (row) => !copiedIds.has(row.id) && row.received_at < lastCopied,
      );
      expect(missedEarlier).toEqual([]);
    } finally {
      copy.close();
      whole.close();
    }

    // The source as it stood at the snapshot: its own rows, cut to the answers and attempts the copy has.
    const final = new Sqlite(source, { readonly: true });
    await final.backup(atSnapshot);
    final.close();
    const cut = new Sqlite(atSnapshot);
    try {
      cut.prepare('attach database ? as snap').run(restored);
      cut.exec(`
        delete from responses where id not in (select id from snap.responses);
        delete from attempts where id not in (select id from snap.attempts);
        update attempts set status = 'started', finished_at = null
          where (select count(*) from responses r where r.attempt_id = attempts.id)
            < json_array_length(form, '$.items');
        update attempts set consented_at =
          (select s.consented_at from snap.attempts s where s.id = attempts.id);
        detach database snap;`);
    } finally {
      cut.close();
    }

    const info = (id: string) => {
      const item = bank.byId.get(id);
      return item ? { chartType: item.chart.type, level: item.level } : undefined;
    };
    const reportOf = async (file: string) => {
      const db = createDatabase(`sqlite:${file}`);
      try {
        return await buildReport(db, info, study.body.id as string);
      } finally {
        await db.destroy();
      }
    };
    const fromBackup = await reportOf(restored);
    const fromSource = await reportOf(atSnapshot);
    expect(fromBackup.calibration.itemsCalibrated).toBeGreaterThan(0);
    expect(comparable(fromBackup)).toEqual(comparable(fromSource));
  });
});
