import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { runCli } from '../../server/main.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { pendingMigrations } from '../../server/storage/migrate.js';

describe('plotgauge command line', () => {
  let folder: string;
  let errors: string[];
  const saved = { ...process.env };
  beforeEach(() => {
    folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-cli-'));
    errors = [];
    vi.spyOn(console, 'error').mockImplementation((line: string) => void errors.push(line));
    vi.spyOn(console, 'log').mockImplementation(() => {});
  });
  afterEach(() => {
    process.env = { ...saved };
    vi.restoreAllMocks();
    rmSync(folder, { recursive: true, force: true });
  });

  it('migrate creates and migrates a new SQLite file', async () => {
    const url = `sqlite:${path.join(folder, 'sub', 'p.db')}`;
    expect(await runCli(['migrate', '--database', url])).toBe(0);
    const db = createDatabase(url);
    expect(await pendingMigrations(db)).toEqual([]);
    await db.destroy();
  });

  it.each([
    [['serve', '--port', 'abc'], /^plotgauge: PORT: must be a whole number/],
    [['migrate', '--database', 'mongodb://x'], /^plotgauge: DATABASE_URL: must start with sqlite:/],
    [
      ['migrate', '--database', 'postgres://postgres@127.0.0.1:1/none'],
      /^plotgauge: DATABASE_URL: cannot reach the database \(ECONNREFUSED\)$/,
    ],
  ])('%j prints one line and exits with 2', async (argv, line) => {
    expect(await runCli(argv)).toBe(2);
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatch(line);
    expect(errors[0]).not.toMatch(/\n\s+at /);
  });

  it('reads configuration from the environment when no flag is given', async () => {
    process.env.LOG_LEVEL = 'shouting';
    expect(await runCli(['migrate', '--database', `sqlite:${path.join(folder, 'x.db')}`])).toBe(2);
    expect(errors[0]).toMatch(/^plotgauge: LOG_LEVEL: /);
  });

  it('an unknown command or option exits with 2', async () => {
    vi.spyOn(process.stderr, 'write').mockImplementation(() => true);
    expect(await runCli(['--no-such-flag'])).toBe(2);
  });
});
