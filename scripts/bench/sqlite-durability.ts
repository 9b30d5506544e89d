/**
 * What SQLite's `synchronous` setting costs: one committed transaction per response insert,
 * as the server does, with synchronous=FULL (the default: survives power cuts) and =NORMAL
 * (survives a killed process only), in the same run on the same disk. Prints a table and the
 * ratio. Run by hand: `npx tsx scripts/bench/sqlite-durability.ts [count]`.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { createDatabase } from '../../server/storage/create-database.js';
import { migrateToLatest } from '../../server/storage/migrate.js';

const count = Number(process.argv[2] ?? 2000);

async function run(sync: 'full' | 'normal'): Promise<number> {
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-bench-'));
  const db = createDatabase(`sqlite:${path.join(folder, 'bench.db')}`, { sqliteSync: sync });
  await migrateToLatest(db);
  const now = new Date().toISOString();
  await db
    .insertInto('studies')
    .values({ id: 's', title: 't', settings: '{}', status: 'open', created_at: now, updated_at: now })
    .execute();
  await db
    .insertInto('cohorts')
    .values({ id: 'c', study_id: 's', label: 'l', join_code: 'J', created_at: now })
    .execute();
  await db
    .insertInto('attempts')
    .values({
      id: 'a',
      cohort_id: 'c',
      token_hash: 'h',
      status: 'started',
      form: '[]',
      background: '{}',
      started_at: now,
      last_seen_at: now,
    })
    .execute();
  const start = process.hrtime.bigint();
  for (let i = 0; i < count; i++) {
    await db.transaction().execute((trx) =>
      trx
        .insertInto('responses')
        .values({
          id: `r${i}`,
          attempt_id: 'a',
          item_id: `i${i}`,
          item_version: 1,
          position: i,
          answer_kind: 'answer',
          answer: '"b"',
          score: 1,
          received_at: now,
        })
        .execute(),
    );
  }
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  await db.destroy();
  rmSync(folder, { recursive: true, force: true });
  return count / seconds;
}

const normal = await run('normal');
const full = await run('full');
console.log(`commits: ${count}, one insert per transaction, file in ${tmpdir()}`);
console.log('synchronous | commits/s | ratio to NORMAL');
console.log(`NORMAL      | ${normal.toFixed(0).padStart(9)} | 1.00`);
console.log(`FULL        | ${full.toFixed(0).padStart(9)} | ${(full / normal).toFixed(2)}`);
