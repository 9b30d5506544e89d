import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Sqlite from 'better-sqlite3';
import { type Kysely, sql } from 'kysely';
import { afterAll, afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AppError } from '../../server/errors.js';
import { createDatabase } from '../../server/storage/create-database.js';
import type { Database } from '../../server/storage/database.js';
import { isSqlite, WriteBatch, writeQueueFor } from '../../server/storage/write-batch.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** Rows of the scratch table, read through the batch's own handle (after the batch settled). */
async function storedValues(db: Kysely<Database>): Promise<string[]> {
  const result = await sql<{ v: string }>`select v from scratch order by id`.execute(db);
  return result.rows.map((row) => row.v);
}

const insert = (v: string) => (trx: Parameters<Parameters<WriteBatch['run']>[0]>[0]) =>
  sql`insert into scratch (v) values (${v})`.execute(trx);

describe('sqlite: WriteBatch (group commit)', () => {
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-batch-'));
  let file: string;
  let db: Kysely<Database>;
  let counter = 0;

  beforeEach(async () => {
    counter += 1;
    file = path.join(folder, `batch-${counter}.db`);
    db = createDatabase(`sqlite:${file}`, { sqliteSync: 'full' });
    await sql`create table scratch (id integer primary key, v text not null unique)`.execute(db);
    await sql`create table parent (id integer primary key)`.execute(db);
    await sql`create table child (id integer primary key, parent_id integer not null references parent (id))`.execute(
      db,
    );
  });
  afterEach(async () => {
    await db.destroy();
  });
  afterAll(() => rmSync(folder, { recursive: true, force: true }));

  it('commits units queued together once, in arrival order, each seeing the writes before it', async () => {
    const commits: number[] = [];
    const batch = new WriteBatch(db, { onCommit: (units) => commits.push(units) });
    const seen = await Promise.all(
      ['a', 'b', 'c', 'd', 'e'].map((v) =>
        batch.run(async (trx) => {
          const before = await sql<{ n: number }>`select count(*) as n from scratch`.execute(trx);
          await insert(v)(trx);
          return before.rows[0]?.n;
        }),
      ),
    );
    expect(seen).toEqual([0, 1, 2, 3, 4]);
    expect(commits).toEqual([5]);
    expect(batch.stats).toEqual({ commits: 1, units: 5 });
    expect(await storedValues(db)).toEqual(['a', 'b', 'c', 'd', 'e']);
  });

  it('rolls back a failing unit to its savepoint; the others of its batch are stored', async () => {
    const commits: number[] = [];
    const batch = new WriteBatch(db, { onCommit: (units) => commits.push(units) });
    const refused = new AppError('ITEM_NOT_CURRENT', 'not now');
    const results = await Promise.allSettled([
      batch.run(insert('first')),
      batch.run(async (trx) => {
        await insert('half-done')(trx);
        throw refused;
      }),
      // A failing statement (unique violation) is undone too, and rejects with the engine's error.
      batch.run(insert('first')),
      batch.run(insert('last')),
    ]);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'rejected', 'fulfilled']);
    // Its own error, unchanged: an AppError stays the same object (so a 4xx stays a 4xx).
    expect((results[1] as PromiseRejectedResult).reason).toBe(refused);
    expect(String((results[2] as PromiseRejectedResult).reason)).toMatch(/UNIQUE constraint failed/);
    expect(commits).toEqual([4]);
    expect(await storedValues(db)).toEqual(['first', 'last']);
  });

  it('settles no unit before its commit is visible to another connection', async () => {
    const batch = new WriteBatch(db);
    const reader = new Sqlite(file, { readonly: true });
    try {
      const count = reader.prepare('select count(*) as n from scratch where v = ?');
      const visibleAtSettle: boolean[] = [];
      const values = Array.from({ length: 20 }, (_, i) => `v${i}`);
      await Promise.all(
        values.map((v) =>
          batch.run(insert(v)).then(() => {
            // Another connection sees only committed data: a resolve before COMMIT would read 0.
            visibleAtSettle.push((count.get(v) as { n: number }).n === 1);
          }),
        ),
      );
      expect(visibleAtSettle).toEqual(values.map(() => true));
    } finally {
      reader.close();
    }
  });

  it('forms batches while a commit runs and keeps each batch within maxBatch', async () => {
    const commits: number[] = [];
    const batch = new WriteBatch(db, { maxBatch: 4, onCommit: (units) => commits.push(units) });
    await Promise.all(Array.from({ length: 10 }, (_, i) => batch.run(insert(`x${i}`))));
    expect(commits).toEqual([4, 4, 2]);
    // A lone unit on an idle writer runs without waiting for company.
    await batch.run(insert('alone'));
    expect(commits).toEqual([4, 4, 2, 1]);
    expect(batch.waiting).toBe(0);
  });

  it('rejects every unit of a batch whose COMMIT fails, stores none of it, and goes on', async () => {
    const batch = new WriteBatch(db);
    await sql`insert into parent (id) values (1)`.execute(db);
    const results = await Promise.allSettled([
      batch.run(insert('kept-back')),
      batch.run(async (trx) => {
        // A deferred foreign key is checked at COMMIT (SQLite documentation, PRAGMA defer_foreign_keys),
        // so the statement succeeds and the commit of the whole batch fails.
        await sql`pragma defer_foreign_keys = on`.execute(trx);
        await sql`insert into child (id, parent_id) values (1, 99)`.execute(trx);
      }),
    ]);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected']);
    expect(String((results[0] as PromiseRejectedResult).reason)).toMatch(/FOREIGN KEY constraint failed/);
    expect(await storedValues(db)).toEqual([]);
    // The connection was handed back: the next batch commits.
    await batch.run(insert('after'));
    expect(await storedValues(db)).toEqual(['after']);
  });

  it('refuses a batch bound that is not a whole number of at least 1', () => {
    expect(() => new WriteBatch(db, { maxBatch: 0 })).toThrow(/maxBatch/);
    expect(() => new WriteBatch(db, { maxBatch: 2.5 })).toThrow(/maxBatch/);
  });

  it('gives every route of one database the same group-commit queue', () => {
    expect(isSqlite(db)).toBe(true);
    const queue = writeQueueFor(db);
    expect(queue).toBeInstanceOf(WriteBatch);
    expect(writeQueueFor(db)).toBe(queue);
  });
});

const postgres = testEngines().find((engine) => engine.engine === 'postgres');

describe.skipIf(postgres?.skipReason !== undefined)('postgres: one transaction per unit', () => {
  let database: TestDatabase;
  afterAll(async () => {
    await database?.cleanup();
  });

  it('uses no batch and rolls back a failing unit alone', async () => {
    database = await (postgres as NonNullable<typeof postgres>).open();
    const db = database.db;
    await sql`create table scratch (id serial primary key, v text not null unique)`.execute(db);
    expect(isSqlite(db)).toBe(false);
    const queue = writeQueueFor(db);
    expect(queue).not.toBeInstanceOf(WriteBatch);
    const results = await Promise.allSettled([
      queue.run(insert('one')),
      queue.run(async (trx) => {
        await insert('undone')(trx);
        throw new AppError('CONFLICT', 'no');
      }),
      queue.run(insert('two')),
    ]);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect((await storedValues(db)).sort()).toEqual(['one', 'two']);
  });
});
