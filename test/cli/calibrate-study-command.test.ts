import { rmSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { runCli } from '../../server/main.js';
import { type StoredStudy, storeSimulatedStudy } from './stored-study.js';

/** `plotgauge calibrate --study <id>`: calibrates a stored study and prints one line per fact. */
describe('plotgauge calibrate --study', () => {
  let stored: StoredStudy;
  let out: string[];
  let errors: string[];
  beforeAll(async () => {
    stored = await storeSimulatedStudy();
  });
  afterAll(() => {
    if (stored) rmSync(stored.folder, { recursive: true, force: true });
  });

  async function run(args: string[]): Promise<number> {
    out = [];
    errors = [];
    const log = vi.spyOn(console, 'log').mockImplementation((line: string) => void out.push(line));
    const error = vi.spyOn(console, 'error').mockImplementation((line: string) => void errors.push(line));
    try {
      return await runCli(args);
    } finally {
      log.mockRestore();
      error.mockRestore();
    }
  }

  it('stores a calibration with one group per cohort, the first fixed at mean 0', async () => {
    expect(
      await run(['calibrate', '--study', stored.studyId, '--database', stored.url, '--replicates', '20']),
    ).toBe(0);
    expect(errors).toEqual([]);
    expect(out[0]).toMatch(/^calibration \S+ stored$/);
    // 80 respondents × 10 items, all scored
    expect(out[1]).toBe('  800 scored responses, 10 items calibrated, 0 not yet');
    expect(out[2]).toMatch(/^ {2}Harbour school: 40 respondents, mean 0\.00, SD \d\.\d\d logits$/);
    // The second cohort was drawn 0.5 logits higher; 40 + 40 people put its estimate within about ±0.5.
    const second = /^ {2}Island library: 40 respondents, mean (-?\d\.\d\d)/.exec(out[3] ?? '');
    expect(Number(second?.[1])).toBeGreaterThan(0);
    expect(Number(second?.[1])).toBeLessThan(1.1);
  });

  it('refuses neither a CSV nor --study, and both at once', async () => {
    expect(await run(['calibrate'])).toBe(2);
    expect(errors.join('\n')).toContain('give a responses CSV, or --study <id>');
    expect(await run(['calibrate', 'answers.csv', '--study', stored.studyId])).toBe(2);
    expect(errors.join('\n')).toContain('give either a responses CSV or --study <id>, not both');
  });

  it('reports an unknown study in one line', async () => {
    expect(await run(['calibrate', '--study', 'no-such-study', '--database', stored.url])).toBe(2);
    expect(errors).toHaveLength(1);
  });
});
