import { rmSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliCapturedText } from '../helpers/run-cli.js';
import { type StoredStudy, storeSimulatedStudy } from './stored-study.js';

/**
 * `plotgauge report <study>` on a stored simulated study (tables to read at −2.5 logits, network
 * diagrams to envision at +3, audience around 0 with SD 1): the text summary states the ladder in
 * sentences, with the easy cell among "most" and the hard one among "few", and ends with the caution.
 */
describe('plotgauge report', () => {
  let stored: StoredStudy;
  beforeAll(async () => {
    stored = await storeSimulatedStudy();
  });
  afterAll(() => {
    if (stored) rmSync(stored.folder, { recursive: true, force: true });
  });

  const run = runCliCapturedText;

  it('prints the text summary with the ladder sentences and the caution', async () => {
    const { code, out, errors } = await run(['report', stored.studyId, '--database', stored.url]);
    expect(errors).toEqual([]);
    expect(code).toBe(0);
    expect(out).toContain('Readability report: Simulated test study');
    expect(out).toMatch(/^Everyone in the study: 80 respondents, 100% finished\.$/m);
    // Share at or above RP67 for b = −2.5: 1 − Φ((−2.5 + ln 2 − μ)/σ) ≈ 0.95 for μ ≈ 0.25, σ ≈ 1
    // (the RP definition: common practice, no source); for b = 3 it is about 0.001.
    const most = out.split('\n').find((line) => line.includes('Most of this audience (80% or more)'));
    expect(most).toMatch(/can read values from tables/);
    const few = out.split('\n').find((line) => line.includes('Few in this audience (0–20%)'));
    expect(few).toMatch(/network diagrams/);
    expect(few).not.toMatch(/read values from tables/);
    expect(out).toMatch(/Reading ceiling: the hardest task that at least 80% of this audience handles/);
    expect(out).toContain('This report describes an audience, not a person.');
    expect(out).toContain('It is not for high-stakes decisions about anyone.');
  });

  it('adds the Fairness section with --fairness, and refuses a malformed one in one line', async () => {
    const [a, b] = stored.cohortIds;
    const { code, out, errors } = await run([
      'report',
      stored.studyId,
      '--database',
      stored.url,
      '--fairness',
      `cohorts:${a},${b}`,
    ]);
    expect(errors).toEqual([]);
    expect(code).toBe(0);
    expect(out).toMatch(/^Fairness, Island library vs Harbour school: /m);
    expect(out).toContain('An item is classed only when each group gave it at least 50 answers');
    const csv = await run([
      'report',
      stored.studyId,
      '--database',
      stored.url,
      '--fairness',
      `cohorts:${a},${b}`,
      '--format',
      'csv',
    ]);
    expect(csv.out).toContain('fairness,,,reference_persons,40');
    const bad = await run(['report', stored.studyId, '--database', stored.url, '--fairness', 'yes,no']);
    expect(bad.code).toBe(2);
    expect(bad.errors.join('\n')).toContain('plotgauge: --fairness: fairness must be');
    const unknown = await run([
      'report',
      stored.studyId,
      '--database',
      stored.url,
      '--fairness',
      'works-with-data:yes,no',
    ]);
    expect(unknown.code).toBe(2);
    expect(unknown.errors.join('\n')).toContain('no background question "works-with-data"');
  });

  it('writes the report JSON with --format json and refuses an unknown format', async () => {
    const json = await run(['report', stored.studyId, '--database', stored.url, '--format', 'json']);
    expect(json.code).toBe(0);
    const report = JSON.parse(json.out) as { audiences: { respondents: number }[] };
    expect(report.audiences[0]!.respondents).toBe(80);
    const bad = await run(['report', stored.studyId, '--database', stored.url, '--format', 'xml']);
    expect(bad.code).toBe(2);
    expect(bad.errors.join('\n')).toContain('--format: must be text, json or csv');
  });
});
