import Sqlite from 'better-sqlite3';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { withStatementCache } from '../../../server/storage/dialects/statement-cache.js';

describe('withStatementCache', () => {
  let raw: Sqlite.Database;
  beforeEach(() => {
    raw = new Sqlite(':memory:');
    raw.exec(
      "create table harbour (id integer primary key, name text); insert into harbour values (1, 'Corrowen')",
    );
  });
  afterEach(() => raw.close());

  it('hands out one prepared statement per SQL text and binds parameters at each run', () => {
    const db = withStatementCache(raw);
    const select = 'select name from harbour where id = ?';
    const first = db.prepare(select);
    expect(db.prepare(select)).toBe(first);
    expect(db.prepare('select id from harbour')).not.toBe(first);
    expect(db.prepare(select).all([1])).toEqual([{ name: 'Corrowen' }]);
    expect(db.prepare(select).all([2])).toEqual([]);
  });

  it('keeps at most `size` statements, dropping the least recently used', () => {
    const db = withStatementCache(raw, 2);
    const a = db.prepare('select 1');
    const b = db.prepare('select 2');
    expect(db.prepare('select 1')).toBe(a); // a is now the most recent
    db.prepare('select 3'); // evicts b
    expect(db.prepare('select 1')).toBe(a);
    expect(db.prepare('select 2')).not.toBe(b);
  });

  it('prepares a fresh statement while the cached one is still being iterated', () => {
    const db = withStatementCache(raw);
    const sql = 'select name from harbour';
    const rows = db.prepare(sql).iterate([]);
    rows.next();
    const other = db.prepare(sql);
    expect(other.all([])).toEqual([{ name: 'Corrowen' }]);
    rows.return?.();
  });

  it('sees a column added after the statement was cached (SQLite re-prepares after a schema change)', () => {
    const db = withStatementCache(raw);
    expect(db.prepare('select * from harbour').all([])).toEqual([{ id: 1, name: 'Corrowen' }]);
    raw.exec("alter table harbour add column ferry text not null default 'daily'");
    expect(db.prepare('select * from harbour').all([])).toEqual([
      { id: 1, name: 'Corrowen', ferry: 'daily' },
    ]);
  });
});
