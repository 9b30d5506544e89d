/**
 * Print check of the report page: the summary (title, ceiling, ladder sentences, facts, profile grid)
 * fits on one printed page for A4 and for US Letter, in Debian's chromium through playwright-core.
 * Skipped with a visible message when chromium is missing; fails under REQUIRE_ALL=1 (browserAvailable).
 * The PDFs and a print-emulated screenshot are written to test-artifacts/browser/ for a person to look at.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { FastifyInstance } from 'fastify';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import { generatingDifficulty } from '../../server/demo/generating-difficulty.js';
import { listenOnSqlite } from '../helpers/browser-setup.js';
import type { TestDatabase } from '../helpers/test-databases.js';
import { insertSimulatedStudy, normalDraws } from '../reports/simulated-study.js';
import { artifactsFolder, browserAvailable, launchBrowser } from './browser-harness.js';

const adminToken = 'report-print-test-admin-token';

/** Pages of a PDF: the page objects (`/Type /Page`, not `/Pages`) in the file (ISO 32000-1 §7.7.3.3). */
function pdfPageCount(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-zA-Z])/g) ?? []).length;
}

describe.runIf(browserAvailable())('report page in print', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let browser: Browser;
  let page: Page;
  let reportUrl = '';

  beforeAll(async () => {
    const bank = await loadBank('items');
    // Every active choice item of the bank, at the demo's invented generating difficulties, so the
    // summary has as many chart types and sentences as the demo's.
    const items = bank.items
      .filter((item) => item.status === 'active' && item.response.kind !== 'short-text')
      .map((item) => ({
        id: item.id,
        difficulty: generatingDifficulty({
          chartType: item.chart.type,
          level: item.level,
          markCount: item.features.markCount,
          seriesCount: item.features.seriesCount,
          legend: item.features.legend,
          logAxis: item.features.logAxis,
          truncatedAxis: item.features.truncatedAxis,
          multiStep: item.features.multiStep,
        }),
      }));
    let studyId = '';
    const prepare = async ({ db }: TestDatabase) => {
      ({ studyId } = await insertSimulatedStudy(db, {
        items,
        seed: 11,
        itemsPerPerson: 12,
        cohorts: [
          { label: 'Weekday visitors', abilities: normalDraws(21, 110, 0, 1) },
          { label: 'Weekend visitors', abilities: normalDraws(22, 110, 0.4, 1.1) },
        ],
      }));
    };
    const started = await listenOnSqlite({ bank, adminToken, prepare });
    ({ app, database } = started);
    const base = started.baseUrl;
    reportUrl = `${base}/studies/${studyId}/report`;
    browser = await launchBrowser();
    // bypassCSP only so the test can add a print style that hides everything after the summary.
    page = await (await browser.newContext({ bypassCSP: true })).newPage();
    // The sign-in link: its script posts the fragment's token and the server redirects to the report.
    await page.goto(
      `${base}/sign-in?next=${encodeURIComponent(`/studies/${studyId}/report`)}#token=${adminToken}`,
    );
    await page.waitForURL(reportUrl, { timeout: 60_000 });
    await page.emulateMedia({ media: 'print' });
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await database?.cleanup();
  });

  /** The PDF with everything after the first audience section hidden: the printed summary alone. */
  async function summaryPdf(format: 'A4' | 'Letter'): Promise<Buffer> {
    const style = await page.addStyleTag({
      content:
        '@media print { main > :not(section.audience:first-of-type), footer { display: none !important; } }',
    });
    try {
      return await page.pdf({ format, printBackground: true });
    } finally {
      await style.evaluate((element) => element.parentNode?.removeChild(element));
    }
  }

  for (const format of ['A4', 'Letter'] as const) {
    it(`prints the summary on one ${format} page`, async () => {
      expect(await page.locator('section.audience h2').first().textContent()).toBe('Everyone in the study');
      const summary = await summaryPdf(format);
      const whole = await page.pdf({ format, printBackground: true });
      mkdirSync(artifactsFolder, { recursive: true });
      writeFileSync(path.join(artifactsFolder, `report-print-${format}.pdf`), whole);
      writeFileSync(path.join(artifactsFolder, `report-print-summary-${format}.pdf`), summary);
      expect(pdfPageCount(summary)).toBe(1);
      // The whole printout has the summary and the foot with the caution; the screen-only tables stay out.
      expect(pdfPageCount(whole)).toBeGreaterThanOrEqual(1);
      expect(pdfPageCount(whole)).toBeLessThanOrEqual(3);
    }, 60_000);
  }

  it('keeps the caution and hides the screen-only parts in print', async () => {
    expect(await page.locator('footer .caution').isVisible()).toBe(true);
    expect(await page.locator('section.items').isVisible()).toBe(false);
    expect(await page.locator('nav').isVisible()).toBe(false);
    // A4 width at 96 CSS px per inch (210 mm), for a person to look at the printed layout.
    await page.setViewportSize({ width: 794, height: 1123 });
    mkdirSync(artifactsFolder, { recursive: true });
    await page.screenshot({ path: path.join(artifactsFolder, 'report-print-a4.png'), fullPage: true });
  }, 60_000);
});

describe('pdfPageCount', () => {
  it('counts page objects, not the page tree', () => {
    const pdf = Buffer.from(
      '1 0 obj << /Type /Pages /Kids [2 0 R 3 0 R] /Count 2 >> endobj\n2 0 obj << /Type /Page >> endobj\n3 0 obj <</Type/Page/Parent 1 0 R>> endobj',
      'latin1',
    );
    expect(pdfPageCount(pdf)).toBe(2);
  });
});
