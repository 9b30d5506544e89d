import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Sqlite from 'better-sqlite3';
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { backupSqlite, integrityOf } from '../../server/cli/backup-command.js';
import { createAccessToken } from '../../server/storage/token-repository.js';
import {
  admin,
  bearer,
  correctAnswers,
  deliveryApp,
  joinAndConsent,
  studyWithCohort,
} from '../helpers/delivery-fixture.js';
import { runCliCaptured } from '../helpers/run-cli.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const cli = runCliCaptured;

/** Joins, consents and answers the first question; returns the token and the attempt's first item. */
async function answeredAttempt(app: FastifyInstance, joinCode: string): Promise<string> {
  const token = await joinAndConsent(app, joinCode);
  const state = await request(app.server).get('/api/attempt').set(bearer(token));
  const itemId = state.body.item.itemId as string;
  await request(app.server)
    .post('/api/attempt/responses')
    .set(bearer(token))
    .send({ itemId, answer: correctAnswers[itemId] })
    .expect(201);
  return token;
}

const [sqlite] = testEngines();

describe('backup and erasure', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let joinCode: string;
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-ops-'));
  beforeAll(async () => {
    database = await sqlite!.open();
    app = await deliveryApp(database);
    ({ joinCode } = await studyWithCohort(app));
  });
  afterAll(async () => {
    await app.close();
    await database.cleanup();
    rmSync(folder, { recursive: true, force: true });
  });

  it('backs up a database while answers keep arriving; the copy is consistent', async () => {
    for (let i = 0; i < 5; i++) await answeredAttempt(app, joinCode);
    const file = database.url.slice('sqlite:'.length);
    const target = path.join(folder, 'copy.db');
    const writes = Promise.all(Array.from({ length: 10 }, () => answeredAttempt(app, joinCode)));
    const { pages } = await backupSqlite(file, target);
    await writes;
    expect(pages).toBeGreaterThan(0);
    // PRAGMA integrity_check answers the single row 'ok' for a sound file (SQLite documentation, PRAGMA integrity_check).
    expect(integrityOf(target)).toBe('ok');
    const copy = new Sqlite(target, { readonly: true });
    const attempts = (copy.prepare('select count(*) as n from attempts').get() as { n: number }).n;
    const responses = (copy.prepare('select count(*) as n from responses').get() as { n: number }).n;
    const orphans = copy
      .prepare('select count(*) as n from responses where attempt_id not in (select id from attempts)')
      .get() as { n: number };
    copy.close();
    expect(attempts).toBeGreaterThanOrEqual(5);
    expect(attempts).toBeLessThanOrEqual(15);
    expect(orphans.n).toBe(0);
    expect(responses).toBeLessThanOrEqual(attempts);
    // A second backup to the same file is refused rather than overwriting it.
    expect((await cli(['backup', target, '--database', database.url])).code).toBe(2);
  });

  it('restores a backup: refuses an existing database without --force, then reproduces the copy', async () => {
    const file = database.url.slice('sqlite:'.length);
    const snapshot = path.join(folder, 'snapshot.db');
    await backupSqlite(file, snapshot);
    const count = (f: string) => {
      const db = new Sqlite(f, { readonly: true });
      const n = (db.prepare('select count(*) as n from responses').get() as { n: number }).n;
      db.close();
      return n;
    };
    const atBackup = count(snapshot);
    await answeredAttempt(app, joinCode);
    expect(count(file)).toBe(atBackup + 1);
    const target = path.join(folder, 'restored.db');
    expect((await cli(['restore', snapshot, '--database', `sqlite:${target}`])).code).toBe(0);
    expect(count(target)).toBe(atBackup);
    const refused = await cli(['restore', snapshot, '--database', `sqlite:${target}`]);
    expect(refused.code).toBe(2);
    expect(refused.errors.join('\n')).toMatch(/--force/);
    expect((await cli(['restore', snapshot, '--force', '--database', `sqlite:${target}`])).code).toBe(0);
    expect(integrityOf(target)).toBe('ok');
    expect(
      (await cli(['restore', path.join(folder, 'none.db'), '--database', `sqlite:${target}`])).code,
    ).toBe(2);
  });

  it('drops background answers older than the retention period, keeping responses', async () => {
    await answeredAttempt(app, joinCode);
    await answeredAttempt(app, joinCode);
    const [old, recent] = await database.db
      .selectFrom('attempts')
      .select('id')
      .orderBy('started_at', 'desc')
      .limit(2)
      .execute();
    const background = JSON.stringify({ 'age-band': '12-17' });
    await database.db
      .updateTable('attempts')
      .set({ background })
      .where('id', 'in', [old!.id, recent!.id])
      .execute();
    await database.db
      .updateTable('attempts')
      .set({ started_at: new Date(Date.now() - 40 * 86_400_000).toISOString() })
      .where('id', '=', old!.id)
      .execute();
    const responsesBefore = await database.db.selectFrom('responses').select('id').orderBy('id').execute();
    const result = await cli(['retention', 'apply', '--days', '30', '--database', database.url]);
    expect(result.code).toBe(0);
    const rows = await database.db
      .selectFrom('attempts')
      .select(['id', 'background'])
      .where('id', 'in', [old!.id, recent!.id])
      .execute();
    expect(Object.fromEntries(rows.map((r) => [r.id, r.background]))).toEqual({
      [old!.id]: '{}',
      [recent!.id]: background,
    });
    expect(await database.db.selectFrom('responses').select('id').orderBy('id').execute()).toEqual(
      responsesBefore,
    );
    const audit = await database.db
      .selectFrom('audit_log')
      .selectAll()
      .where('action', '=', 'retention.apply')
      .execute();
    expect(audit).toHaveLength(1);
    expect(JSON.stringify(audit)).not.toContain('12-17');
    expect((await cli(['retention', 'apply', '--days', '0', '--database', database.url])).code).toBe(2);
  });

  it('prints the pg_dump way for PostgreSQL and exits 2', async () => {
    const result = await cli([
      'backup',
      path.join(folder, 'pg.dump'),
      '--database',
      'postgres://127.0.0.1:1/none',
    ]);
    expect(result.code).toBe(2);
    expect(result.errors.join('\n')).toMatch(/pg_dump/);
  });

  it("erases one person's attempt and answers through the admin API, auditing the count only", async () => {
    const token = await answeredAttempt(app, joinCode);
    const attempt = await database.db
      .selectFrom('attempts')
      .select(['id', 'background'])
      .orderBy('started_at', 'desc')
      .executeTakeFirstOrThrow();
    const others = await database.db
      .selectFrom('responses')
      .select('id')
      .where('attempt_id', '!=', attempt.id)
      .execute();
    const steward = (await createAccessToken(database.db, 'admin', 'data steward')).token;
    const erased = await request(app.server).delete(`/api/admin/attempts/${attempt.id}`).set(bearer(steward));
    expect(erased.status).toBe(200);
    expect(erased.body).toEqual({ attemptId: attempt.id, responses: 1 });
    expect(
      await database.db.selectFrom('attempts').where('id', '=', attempt.id).selectAll().execute(),
    ).toEqual([]);
    expect(
      await database.db.selectFrom('responses').where('attempt_id', '=', attempt.id).selectAll().execute(),
    ).toEqual([]);
    // Nobody else's answers went with it.
    const left = await database.db
      .selectFrom('responses')
      .select('id')
      .where('attempt_id', '!=', attempt.id)
      .execute();
    expect(left).toEqual(others);
    const audit = await database.db
      .selectFrom('audit_log')
      .selectAll()
      .where('action', '=', 'attempt.erase')
      .executeTakeFirstOrThrow();
    expect(audit).toMatchObject({ actor: 'data steward', subject: attempt.id });
    expect(JSON.parse(audit.details)).toEqual({ responses: 1 });
    // The respondent's token no longer reaches anything, and a second erasure finds nothing.
    expect((await request(app.server).get('/api/attempt').set(bearer(token))).status).toBe(401);
    const again = await request(app.server).delete(`/api/admin/attempts/${attempt.id}`).set(admin);
    expect(again.status).toBe(404);
    expect(again.body.error.code).toBe('ATTEMPT_NOT_FOUND');
  });

  it('erases by the respondent token from the command line', async () => {
    const token = await answeredAttempt(app, joinCode);
    const before = await database.db.selectFrom('attempts').select('id').execute();
    const result = await cli(['erase', '--token', token, '--database', database.url]);
    expect(result.code).toBe(0);
    expect(result.out.join('\n')).toMatch(/erased with 1 responses/);
    const after = await database.db.selectFrom('attempts').select('id').execute();
    expect(after).toHaveLength(before.length - 1);
    expect((await cli(['erase', '--token', token, '--database', database.url])).code).toBe(2);
    expect((await cli(['erase', '--database', database.url])).code).toBe(2);
  });
});
