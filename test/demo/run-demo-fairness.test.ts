/**
 * The demo's invented DIF through the real delivery: `runDemo` at half the demo's size (260 simulated
 * respondents instead of 520; the same rotated design of 12 items per booklet over the active bank
 * with the two DIF items as the common block, the same background shares and DIF shift) answers over
 * HTTP; the report's Fairness section ("works with data", yes vs no) must flag exactly the two items
 * given DIF, and class no other (each rotated item has too few answers per group to be classed).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type RunningDemo, runDemo } from '../../server/demo/run-demo.js';
import { injectedDifItems } from '../../server/demo/simulated-background.js';
import { buildReport } from '../../server/reports/build-report.js';
import { minAnswersPerGroupToClass } from '../../server/reports/fairness-section.js';
import { parseFairnessQuery } from '../../server/reports/fairness-service.js';

describe('the demo flags the two items given invented DIF', () => {
  let folder: string;
  let demo: RunningDemo;
  const lines: string[] = [];

  beforeAll(async () => {
    folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-demo-'));
    demo = await runDemo({
      databaseFile: path.join(folder, 'demo.db'),
      port: 0,
      sizeFactor: 0.5,
      print: (line) => lines.push(line),
    });
  }, 300_000);
  afterAll(async () => {
    await demo?.close();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('puts the two DIF items in every booklet and flags exactly them', async () => {
    const pool = demo.bank.items.filter((i) => i.status === 'active' && i.response.kind !== 'short-text');
    const injected = injectedDifItems(pool.map((i) => i.id));
    const info = (id: string) => {
      const item = demo.bank.byId.get(id);
      return item ? { chartType: item.chart.type, level: item.level } : undefined;
    };
    const report = await buildReport(demo.db, info, demo.studyId, {
      fairness: parseFairnessQuery('works-with-data:yes,no'),
    });
    const fairness = report.fairness!;
    expect([...fairness.flaggedItemIds].sort()).toEqual([...injected].sort());
    for (const id of injected) {
      const item = fairness.items.find((i) => i.itemId === id)!;
      // everyone in both groups answered it (the common block)
      expect(item.referenceAnswers).toBe(fairness.referencePersons);
      expect(item.focalAnswers).toBe(fairness.focalPersons);
      // generating model: 1.5 logits harder for "no" (invented), MH D-DIF ≈ −2.35 × 1.5 (Holland & Thayer 1988)
      expect(item.etsClass).toMatch(/^[BC]-$/);
      expect(item.dDif!).toBeLessThan(-1.5);
    }
    const classed = fairness.items.filter((i) => i.etsClass !== null).map((i) => i.itemId);
    expect(classed.sort()).toEqual([...injected].sort());
    const others = fairness.items.filter((i) => !injected.includes(i.itemId));
    expect(others.length).toBeGreaterThan(90);
    for (const item of others)
      expect(Math.min(item.referenceAnswers, item.focalAnswers)).toBeLessThan(minAnswersPerGroupToClass);
    expect(demo.fairnessUrl).toBe(`${demo.reportUrl}?fairness=works-with-data:yes,no`);
  }, 120_000);
});
