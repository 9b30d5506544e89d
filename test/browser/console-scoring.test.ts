/**
 * The console's scoring queue in Debian's chromium at phone (360 px) and tablet (768 px) widths:
 * sign in, pick a study, score two short written answers with the rubric buttons. Every screen passes
 * axe-core (WCAG 2.1 A/AA), fits without sideways scrolling and blocks nothing under the
 * Content-Security-Policy. Screenshots: test-artifacts/browser/console-scoring-*.png.
 */
import type { FastifyInstance } from 'fastify';
import type { Browser, Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import { cspViolationsOf, listenOnSqlite, recordCspViolations } from '../helpers/browser-setup.js';
import type { TestDatabase } from '../helpers/test-databases.js';
import { browserAvailable, launchBrowser, screenshot, seriousViolations } from './browser-harness.js';

const adminToken = 'console-scoring-admin-token';
const rubricItem = 'garden-harvest-bar-envision-2';

describe.runIf(browserAvailable())('console scoring queue in the browser', { timeout: 60_000 }, () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let browser: Browser;
  let base = '';

  beforeAll(async () => {
    const bank = await loadBank('items');
    ({ app, database, baseUrl: base } = await listenOnSqlite({ bank, adminToken }));
    const admin = { Authorization: `Bearer ${adminToken}` };
    const study = await request(app.server)
      .post('/api/admin/studies')
      .set(admin)
      .send({ title: 'Sprout Lane notes', pool: { itemIds: [rubricItem] }, maxItems: 1 });
    const cohort = await request(app.server)
      .post(`/api/admin/studies/${study.body.id}/cohorts`)
      .set(admin)
      .send({ label: 'Open day' });
    for (const text of ['Harvest per bed, since potatoes had the biggest bed.', 'Potatoes.']) {
      const joined = await request(app.server).post('/api/join').send({ code: cohort.body.joinCode });
      const token = { Authorization: `Bearer ${joined.body.token}` };
      await request(app.server).post('/api/attempt/consent').set(token).send({ agree: true });
      const stored = await request(app.server)
        .post('/api/attempt/responses')
        .set(token)
        .send({ itemId: rubricItem, answer: { kind: 'text', text } });
      expect(stored.status).toBe(201);
    }
    browser = await launchBrowser();
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await database?.cleanup();
  });

  async function check(page: Page, name: string, width: number) {
    await screenshot(page, `console-scoring-${name}`);
    expect(await cspViolationsOf(page), `CSP on ${name}`).toEqual([]);
    expect(await seriousViolations(page), `axe on ${name}`).toEqual([]);
    // The console shell's own links are not held to the respondent page's 44 px rule; this page's
    // controls are (WCAG 2.1 SC 2.5.5 target size, 44 × 44 CSS px).
    const small = await page.evaluate<
      string[]
    >(`[...document.querySelectorAll('main button, main a, main select')]
      .map((el) => [el, el.getBoundingClientRect()])
      .filter(([, r]) => r.width < 44 || r.height < 44)
      .map(([el, r]) => el.tagName + ' ' + (el.textContent ?? '').trim() + ' ' + Math.round(r.width) + 'x' + Math.round(r.height))`);
    expect(small, `touch targets on ${name}`).toEqual([]);
    expect(await page.evaluate<number>('document.documentElement.scrollWidth')).toBeLessThanOrEqual(width);
  }

  for (const viewport of [
    { width: 360, height: 740 },
    { width: 768, height: 1024 },
  ]) {
    it(`${viewport.width} px: picks a study and scores answers with the rubric buttons`, async () => {
      const context = await browser.newContext({ viewport });
      await recordCspViolations(context);
      const page = await context.newPage();
      await page.goto(`${base}/console/scoring`);
      await page.waitForURL(/\/sign-in\?next=/);
      await page.getByLabel('Team token').fill(adminToken);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('heading', { level: 1, name: 'Scoring queue' }).waitFor();
      await check(page, `${viewport.width}-pick`, viewport.width);
      await page.getByRole('button', { name: 'Show answers' }).click();
      if (viewport.width === 360) {
        // The first sign-in scores both answers; the second finds nothing left for this rater.
        await page.getByRole('group', { name: 'Score against the rubric' }).waitFor();
        await check(page, `${viewport.width}-answer`, viewport.width);
        await page.getByRole('button', { name: '2', exact: true }).click();
        await page.getByText('Score saved.').waitFor();
        await page.getByRole('button', { name: '0', exact: true }).click();
      }
      await page.getByText('Nothing is waiting for your score.', { exact: false }).waitFor();
      await check(page, `${viewport.width}-done`, viewport.width);
      await context.close();
    });
  }
});
