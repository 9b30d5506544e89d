import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { buildApp } from '../../server/app.js';
import { loadBank } from '../../server/bank/load-bank.js';
import { loadConfig } from '../../server/config.js';
import { runCli } from '../../server/main.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { bearer } from '../helpers/delivery-fixture.js';
import { writeTestBank } from '../helpers/test-bank.js';

/**
 * The command-line path a newcomer takes: study create → cohort add (join link + QR file) →
 * someone answers through the API → export. Errors are one line and exit code 2.
 */
describe('plotgauge study / cohort / export', () => {
  let folder: string;
  let url: string;
  let out: string[];
  let errors: string[];
  const saved = { ...process.env };
  beforeEach(() => {
    folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-cli-'));
    mkdirSync(path.join(folder, 'items'));
    writeTestBank(path.join(folder, 'items'));
    process.env.ITEMS_DIR = path.join(folder, 'items');
    url = `sqlite:${path.join(folder, 'p.db')}`;
    out = [];
    errors = [];
    vi.spyOn(console, 'log').mockImplementation((line: string) => void out.push(line));
    vi.spyOn(console, 'error').mockImplementation((line: string) => void errors.push(line));
  });
  afterEach(() => {
    process.env = { ...saved };
    vi.restoreAllMocks();
    rmSync(folder, { recursive: true, force: true });
  });

  it('creates a study and a cohort, writes the QR code, and exports what was answered', async () => {
    expect(
      await runCli([
        'study',
        'create',
        '--title',
        'Harbour kiosk',
        '--levels',
        'read',
        '--max-items',
        '3',
        '--kiosk',
        '--database',
        url,
      ]),
    ).toBe(0);
    const studyId = /^study (\S+) created: "Harbour kiosk", fixed form, 3 items in the pool$/.exec(
      out[0] ?? '',
    )?.[1];
    expect(studyId).toBeDefined();

    const qr = path.join(folder, 'walk-ups.svg');
    expect(
      await runCli([
        'cohort',
        'add',
        studyId!,
        '--label',
        'Saturday walk-ups',
        '--base-url',
        'https://gauge.example.test',
        '--qr',
        qr,
        '--database',
        url,
      ]),
    ).toBe(0);
    const code = /^cohort "Saturday walk-ups": join code ([A-HJ-NP-Z]{4}-[2-9]{2})$/.exec(out[2] ?? '')?.[1];
    expect(code).toBeDefined();
    expect(out[3]).toBe(`join link: https://gauge.example.test/join/${code}`);
    expect(existsSync(qr)).toBe(true);
    expect(readFileSync(qr, 'utf8')).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);

    // Someone answers through the API on the same database.
    const db = createDatabase(url);
    const app = await buildApp({
      config: loadConfig({}, { databaseUrl: url }),
      db,
      bank: await loadBank(process.env.ITEMS_DIR!),
    });
    await app.ready();
    const joined = await request(app.server).post('/api/join').send({ code });
    const token = joined.body.token;
    let state = (
      await request(app.server).post('/api/attempt/consent').set(bearer(token)).send({ agree: true })
    ).body;
    expect(state.study.kiosk).toBe(true);
    while (state.step === 'item') {
      state = (
        await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send({ itemId: state.item.itemId, answer: { kind: 'dont-know' }, clientMs: 700 })
      ).body.attempt;
    }
    await app.close();
    const audit = await db
      .selectFrom('audit_log')
      .select(['actor', 'action', 'details'])
      .orderBy('at')
      .execute();
    expect(audit.map((a) => [a.actor, a.action])).toEqual([
      ['cli', 'study.create'],
      ['cli', 'cohort.create'],
    ]);
    expect(audit.map((a) => a.details).join()).not.toContain(token);
    await db.destroy();

    const csvFile = path.join(folder, 'long.csv');
    expect(await runCli(['export', studyId!, '--format', 'long', '--out', csvFile, '--database', url])).toBe(
      0,
    );
    const rows = parse(readFileSync(csvFile, 'utf8'), { columns: true }) as Record<string, string>[];
    expect(rows).toHaveLength(3);
    expect(rows.map((r) => r.item_id)).toEqual([
      'isle-ferry-busiest-day',
      'town-ferry-quietest-day',
      'isle-ferry-monday-count',
    ]);
    expect(rows.every((r) => r.answer_kind === 'dont-know' && r.score === '0' && r.client_ms === '700')).toBe(
      true,
    );
    expect(rows[0]!.cohort_label).toBe('Saturday walk-ups');

    const writes: string[] = [];
    vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => {
      writes.push(String(chunk));
      return true;
    });
    expect(await runCli(['export', studyId!, '--format', 'wide', '--database', url])).toBe(0);
    const wide = parse(writes.join(''), { columns: false }) as string[][];
    expect(wide[0]).toEqual([
      'attempt_id',
      'cohort_label',
      'isle-ferry-busiest-day',
      'isle-ferry-monday-count',
      'town-ferry-quietest-day',
    ]);
    expect(wide[1]!.slice(1)).toEqual(['Saturday walk-ups', '0', '0', '0']);
  });

  it.each([
    [
      ['study', 'create', '--title', 'X', '--items', 'no-such-item'],
      /^plotgauge: body\.pool\.itemIds: not active items of the bank: no-such-item$/,
    ],
    [['study', 'create', '--title', 'X', '--design', 'spiral'], /^plotgauge: body\.design: /],
    [
      ['study', 'create', '--title', 'X', '--max-items', 'ten'],
      /^plotgauge: --max-items: must be a whole number/,
    ],
    [['study', 'create', '--title', 'X', '--levels', 'guess'], /^plotgauge: body\.pool\.levels\.0: /],
    [['cohort', 'add', 'no-such-study', '--label', 'A'], /^plotgauge: No study with id no-such-study\.$/],
    [
      ['cohort', 'add', 'x', '--label', 'A', '--base-url', 'ftp://x'],
      /^plotgauge: --base-url: must be an http\(s\) URL/,
    ],
    [['export', 'no-such-study'], /^plotgauge: No study with id no-such-study\.$/],
    [['export', 'x', '--format', 'matrix'], /^plotgauge: --format: must be long or wide/],
  ])('%j prints one line and exits with 2', async (argv, line) => {
    expect(await runCli([...argv, '--database', url])).toBe(2);
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatch(line);
  });

  it('a malformed bank stops the command with the file and field named', async () => {
    const bad = path.join(folder, 'items', 'isle', 'isle-ferry-busiest-day.json');
    const item = JSON.parse(readFileSync(bad, 'utf8'));
    delete item.prompt;
    const { writeFileSync } = await import('node:fs');
    writeFileSync(bad, JSON.stringify(item));
    expect(await runCli(['study', 'create', '--title', 'X', '--database', url])).toBe(2);
    expect(errors[0]).toMatch(/^plotgauge: ITEMS_DIR: the item bank has 1 problem/);
    expect(errors[0]).toMatch(/isle-ferry-busiest-day\.json: prompt/);
  });
});
