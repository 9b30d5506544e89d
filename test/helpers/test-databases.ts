import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { type Kysely, sql } from 'kysely';
import { createDatabase, type Engine } from '../../server/storage/create-database.js';
import type { Database } from '../../server/storage/database.js';

/** A database for one test file: its URL, an open handle, and a cleanup that removes it. */
export interface TestDatabase {
  readonly engine: Engine;
  readonly url: string;
  readonly db: Kysely<Database>;
  cleanup(): Promise<void>;
}

export interface TestEngine {
  readonly engine: Engine;
  /** Why the engine is skipped; undefined when available. */
  readonly skipReason: string | undefined;
  open(): Promise<TestDatabase>;
}

const requireAll = process.env.REQUIRE_ALL === '1';
const postgresUrl = process.env.TEST_DATABASE_URL;

function randomName(prefix: string): string {
  return `${prefix}_${Date.now().toString(36)}_${Math.random().toString(36).slice(2, 8)}`;
}

async function openSqlite(): Promise<TestDatabase> {
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-test-'));
  const url = `sqlite:${path.join(folder, 'test.db')}`;
  const db = createDatabase(url);
  return {
    engine: 'sqlite',
    url,
    db,
    async cleanup() {
      await db.destroy();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}

/** Each test file gets its own PostgreSQL database, created from TEST_DATABASE_URL and dropped after. */
async function openPostgres(baseUrl: string): Promise<TestDatabase> {
  const name = randomName('plotgauge_test');
  const admin = createDatabase(baseUrl);
  await sql`create database ${sql.id(name)}`.execute(admin);
  const url = new URL(baseUrl);
  url.pathname = `/${name}`;
  const db = createDatabase(url.toString());
  return {
    engine: 'postgres',
    url: url.toString(),
    db,
    async cleanup() {
      await db.destroy();
      await sql`drop database if exists ${sql.id(name)} with (force)`.execute(admin);
      await admin.destroy();
    },
  };
}

/**
 * The engines storage tests run on: SQLite always (a temp file), PostgreSQL when
 * TEST_DATABASE_URL is set. Without it the PostgreSQL tests are skipped with a visible message;
 * with REQUIRE_ALL=1 a missing engine fails the run instead.
 */
export function testEngines(): TestEngine[] {
  let postgresSkip: string | undefined;
  if (!postgresUrl) {
    postgresSkip = 'TEST_DATABASE_URL is not set (e.g. postgres://127.0.0.1:5432/test)';
    if (requireAll) throw new Error(`REQUIRE_ALL=1 but PostgreSQL tests cannot run: ${postgresSkip}`);
    console.warn(`[plotgauge tests] skipping PostgreSQL: ${postgresSkip}`);
  }
  return [
    { engine: 'sqlite', skipReason: undefined, open: openSqlite },
    { engine: 'postgres', skipReason: postgresSkip, open: () => openPostgres(postgresUrl ?? '') },
  ];
}
