/**
 * A team's whole day in the console, in Debian's chromium at tablet width (768 px): sign in, create
 * a study with two cohorts, open a join link in a second browser context and finish attempts, watch
 * progress change, calibrate, open and print the report, browse the bank and retire an item, add a
 * pilot chart, sign out; then a wrong token and a revoked token see no console page. Every console
 * page visited passes axe-core (WCAG 2.1 A/AA: no serious or critical violation), fits 768 px without
 * sideways scrolling and blocks nothing under the Content-Security-Policy. Screenshots and the
 * printed report go to test-artifacts/browser/day-*.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { FastifyInstance } from 'fastify';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ItemBank, loadBank } from '../../server/bank/load-bank.js';
import { simulateRespondent } from '../../server/demo/simulate-through-api.js';
import { en } from '../../server/pages/strings/en.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';
import { createAccessToken, revokeAccessToken } from '../../server/storage/token-repository.js';
import { cspViolationsOf, listenOnSqlite, recordCspViolations } from '../helpers/browser-setup.js';
import type { TestDatabase } from '../helpers/test-databases.js';
import {
  answerCurrentItem,
  artifactsFolder,
  browserAvailable,
  launchBrowser,
  screenshot,
  seriousViolations,
  waitForHeading,
} from './browser-harness.js';

const tablet = { width: 768, height: 1024 };
const phone = { width: 390, height: 800 };
const itemsPerAttempt = 6;
const studyTitle = 'Sprout Lane Garden, harvest open day';
const pilotSvg =
  '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 200 120" role="img"><title>Beans per bed</title>' +
  '<rect x="20" y="40" width="40" height="70" fill="#2a6f97"/><rect x="80" y="20" width="40" height="90" fill="#2a6f97"/>' +
  '<rect x="140" y="60" width="40" height="50" fill="#2a6f97"/></svg>';

/** Pages of a PDF: the page objects (`/Type /Page`, not `/Pages`) in the file (ISO 32000-1 §7.7.3.3). */
function pdfPageCount(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-zA-Z])/g) ?? []).length;
}

describe.runIf(browserAvailable())('a team day in the console (768 px)', { timeout: 90_000 }, () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let bank: ItemBank;
  let browser: Browser;
  let base = '';
  let teamToken = '';
  let team: { context: BrowserContext; page: Page };
  let studyUrl = '';
  let studyId = '';
  /** Every console page the day visited (paths), for the signed-out and revoked checks. */
  const visited = new Set<string>();

  beforeAll(async () => {
    bank = await loadBank('items');
    ({ app, database, baseUrl: base } = await listenOnSqlite({ bank }));
    // The team's admin token, made as `plotgauge token create` makes it.
    teamToken = (await createAccessToken(database.db, 'admin', 'garden team laptop')).token;
    browser = await launchBrowser();
    team = await newPage(tablet);
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await database?.cleanup();
  });

  async function newPage(viewport: { width: number; height: number }) {
    const context = await browser.newContext({ viewport });
    await recordCspViolations(context);
    return { context, page: await context.newPage() };
  }

  /** axe, CSP, no sideways scrolling at 768 px, and a screenshot; remembers the page's path. */
  async function checkPage(page: Page, name: string) {
    visited.add(new URL(page.url()).pathname);
    await screenshot(page, `day-${name}`);
    expect(await cspViolationsOf(page), `CSP on ${name}`).toEqual([]);
    expect(await seriousViolations(page), `axe on ${name}`).toEqual([]);
    const width = await page.evaluate<number>('document.documentElement.scrollWidth');
    expect(width, `page width on ${name}`).toBeLessThanOrEqual(tablet.width);
  }

  const heading = (page: Page, name: string | RegExp) =>
    page.getByRole('heading', { level: 1, name }).waitFor();

  it('signs in', async () => {
    const { page } = team;
    await page.goto(`${base}/console`);
    await page.waitForURL(/\/sign-in\?next=/);
    await page.getByLabel('Team token').fill(teamToken);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${base}/console`);
    await heading(page, 'Studies');
    await checkPage(page, '01-studies');
  });

  it('creates a study with two cohorts', async () => {
    const { page } = team;
    await page.getByRole('link', { name: 'New study' }).click();
    await heading(page, 'New study');
    await checkPage(page, '02-new-study');
    await page.getByLabel('Title').fill(studyTitle);
    await page.getByLabel('Read (find a value)').check();
    await page.getByLabel('Items per attempt').fill(String(itemsPerAttempt));
    await page.getByRole('button', { name: 'Create study' }).click();
    await page.getByText('Study created.').waitFor();
    studyUrl = page.url().replace(/\?.*$/, '');
    studyId = studyUrl.split('/').at(-1)!;
    for (const label of ['Morning visitors', 'Afternoon visitors']) {
      await page.getByLabel('New cohort label').fill(label);
      await page.getByRole('button', { name: 'Add cohort' }).click();
      await page.getByText('Cohort added.').waitFor();
    }
    const cohorts = await database.db.selectFrom('cohorts').selectAll().orderBy('label', 'desc').execute();
    expect(cohorts.map((c) => c.label)).toEqual(['Morning visitors', 'Afternoon visitors']);
    for (const cohort of cohorts) await page.getByText(cohort.join_code, { exact: true }).first().waitFor();
    await checkPage(page, '03-study-two-cohorts');
  });

  it('finishes attempts from a join link in a second browser and watches progress change', async () => {
    const { page } = team;
    await page.goto(`${studyUrl}/progress`);
    await heading(page, `Progress: ${studyTitle}`);
    const finished = page.locator('#attempts-table tfoot td').nth(2);
    expect(await finished.textContent()).toBe('0');
    await checkPage(page, '04-progress-empty');

    const cohorts = await database.db.selectFrom('cohorts').selectAll().orderBy('label', 'desc').execute();
    for (const [index, cohort] of cohorts.entries()) {
      // A visitor's phone: its own browser context, no team cookie.
      const visitor = await newPage(phone);
      await visitor.page.goto(`${base}/join/${cohort.join_code}`);
      await waitForHeading(visitor.page, en.welcomeHeading);
      await visitor.page.getByRole('button', { name: en.startButton }).click();
      await waitForHeading(visitor.page, en.consentHeading);
      await visitor.page.getByRole('button', { name: en.consentYes }).click();
      for (let n = 1; n <= itemsPerAttempt; n += 1) {
        await waitForHeading(
          visitor.page,
          en.progress.replace('{current}', String(n)).replace('{total}', String(itemsPerAttempt)),
        );
        await answerCurrentItem(visitor.page);
      }
      await waitForHeading(visitor.page, en.endHeading);
      await screenshot(visitor.page, `day-05-visitor-${index + 1}-done`);
      // The team page, left open, shows the finished attempt without a reload.
      await expect.poll(() => finished.textContent(), { timeout: 15_000 }).toBe(String(index + 1));
      await visitor.context.close();
    }
    await checkPage(page, '06-progress-two-finished');
  });

  it('calibrates once enough visitors have answered, and opens and prints the report', async () => {
    // The rest of the day's visitors, through the same respondent API (invented abilities).
    const random = seededRandom(20310601);
    const cohorts = await database.db.selectFrom('cohorts').selectAll().orderBy('label', 'desc').execute();
    const pool = bank.items.filter((i) => i.status === 'active' && i.level === 'read').map((i) => i.id);
    const difficultyOf = new Map(pool.map((id, i) => [id, -1.5 + (3 * (i % 7)) / 6]));
    for (let person = 0; person < 40; person += 1) {
      const cohort = cohorts[person % 2]!;
      const ability = random.normal() * 1.1 + (person % 2 === 0 ? 0 : 0.4);
      await simulateRespondent(base, cohort.join_code, ability, difficultyOf, bank, random);
    }

    const { page } = team;
    await page.goto(`${studyUrl}/calibrate`);
    await heading(page, `Calibrate ${studyTitle}`);
    await checkPage(page, '07-calibrate');
    await page.getByRole('button', { name: 'Calibrate now and open the report' }).click();
    await page.waitForURL(`${base}/studies/${studyId}/report`, { timeout: 60_000 });
    await page.locator('section.audience h2').first().waitFor();
    expect(await page.locator('section.audience h2').first().textContent()).toBe('Everyone in the study');
    await checkPage(page, '08-report');
    const calibrations = await database.db.selectFrom('calibrations').selectAll().execute();
    expect(calibrations.map((c) => [c.study_id, Number(c.converged)])).toEqual([[studyId, 1]]);

    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('footer .caution').isVisible()).toBe(true);
    const pdf = await page.pdf({ format: 'A4', printBackground: true });
    mkdirSync(artifactsFolder, { recursive: true });
    writeFileSync(path.join(artifactsFolder, 'day-09-report.pdf'), pdf);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdfPageCount(pdf)).toBeGreaterThanOrEqual(1);
    await page.emulateMedia({ media: 'screen' });
  });

  it('browses the bank with filters and retires an item of the study', async () => {
    const { page } = team;
    // From the console's header (the report page is not a console page and has none).
    await page.goto(`${base}/console`);
    await page
      .getByRole('navigation', { name: 'Console sections' })
      .getByRole('link', { name: 'Bank' })
      .click();
    await heading(page, 'Item bank');
    await page.getByLabel('Task level').selectOption('read');
    await page.getByLabel('Scenario').selectOption('garden');
    await page.getByRole('button', { name: 'Show' }).click();
    await page.waitForURL(/level=read/);
    const cards = page.locator('article.bank-item');
    const garden = bank.items.filter((i) => i.level === 'read' && i.scenario === 'garden');
    expect(await cards.count()).toBe(garden.length);
    await checkPage(page, '10-bank-filtered');

    // The item every attempt of the fixed study starts with; after the visitors it has a difficulty.
    const first = await database.db
      .selectFrom('responses')
      .select('item_id')
      .where('position', '=', 0)
      .executeTakeFirstOrThrow();
    const itemId = first.item_id;
    await page.goto(`${base}/console/bank?level=read`);
    const card = page.locator('article.bank-item', { has: page.locator(`#item-${itemId}`) });
    expect(await card.locator('.bank-stats').textContent()).toMatch(/-?\d\.\d\d ± \d\.\d\d logits/);
    await card.getByRole('link', { name: itemId }).click();
    await heading(page, `Item ${itemId}`);
    await checkPage(page, '11-item');

    await page.getByLabel('Reason (kept in the log)').fill('Visitors misread the bean bed labels');
    await page.getByRole('button', { name: 'Retire this item' }).click();
    await page.getByText('Item retired.').waitFor();
    expect(await page.locator('.bank-tags .bank-status').textContent()).toBe('retired');
    await checkPage(page, '12-item-retired');
    const log = await database.db.selectFrom('item_status_changes').selectAll().execute();
    expect(log.map((c) => [c.item_id, c.status, c.actor])).toEqual([
      [itemId, 'retired', 'garden team laptop'],
    ]);

    // The next visitor's attempt no longer has it.
    const cohort = await database.db.selectFrom('cohorts').selectAll().executeTakeFirstOrThrow();
    const joined = await request(app.server).post('/api/join').send({ code: cohort.join_code });
    expect(joined.status).toBe(201);
    const attempt = await database.db
      .selectFrom('attempts')
      .select('form')
      .orderBy('started_at', 'desc')
      .executeTakeFirstOrThrow();
    const items = (JSON.parse(attempt.form) as { items: { itemId: string }[] }).items.map((i) => i.itemId);
    expect(items).toHaveLength(itemsPerAttempt);
    expect(items).not.toContain(itemId);
  });

  it('adds a pilot chart to the study', async () => {
    const { page } = team;
    await page.goto(`${studyUrl}/pilots/new`);
    await heading(page, 'Add a pilot chart');
    await checkPage(page, '13-pilot-form');
    await page.getByLabel('Chart image (SVG or PNG)').setInputFiles({
      name: 'beans.svg',
      mimeType: 'image/svg+xml',
      buffer: Buffer.from(pilotSvg),
    });
    await page
      .getByLabel('Text alternative (describes the chart, never gives the answer)')
      .fill('A bar chart of bean harvests in three garden beds.');
    await page.getByLabel('Question').fill('Which bed gave the most beans?');
    await page.getByLabel('Option A', { exact: true }).fill('North bed');
    await page.getByLabel('Option B', { exact: true }).fill('Middle bed');
    await page.getByLabel('Option C', { exact: true }).fill('South bed');
    // Sent without saying which option is right: the form comes back filled in, the problem linked.
    await page.getByRole('button', { name: 'Add the pilot chart' }).click();
    await page.getByText('The pilot was not added').waitFor();
    expect(await page.getByLabel('Option C', { exact: true }).inputValue()).toBe('South bed');
    await checkPage(page, '13b-pilot-problems');
    // A browser never refills a file field: choose the file again.
    await page.getByLabel('Chart image (SVG or PNG)').setInputFiles({
      name: 'beans.svg',
      mimeType: 'image/svg+xml',
      buffer: Buffer.from(pilotSvg),
    });
    await page.getByLabel('Option B is right').check();
    await page.getByRole('button', { name: 'Add the pilot chart' }).click();
    await page.getByText('Pilot chart added.').waitFor();
    expect(
      await page.getByRole('img', { name: 'A bar chart of bean harvests in three garden beds.' }).count(),
    ).toBe(1);
    // The stored, sanitized image loads (served by the pilot image route with the console cookie).
    await expect
      .poll(() => page.evaluate<number>("document.querySelector('.bank-pilot img').naturalWidth"))
      .toBeGreaterThan(0);
    await checkPage(page, '14-pilot-added');
    const stored = await database.db.selectFrom('pilot_items').selectAll().execute();
    expect(stored.map((p) => [p.study_id, p.key])).toEqual([[studyId, JSON.stringify('b')]]);

    // Enough answers for the team: stop giving it to new attempts.
    await page.getByRole('button', { name: 'Stop giving this chart to new attempts' }).click();
    await page.getByText('New attempts no longer get that pilot chart.').waitFor();
    await checkPage(page, '15-pilot-stopped');
    const after = await database.db.selectFrom('pilot_items').select('status').execute();
    expect(after.map((p) => p.status)).toEqual(['retired']);
  });

  it('signs out, and then no console page opens', async () => {
    const { page, context } = team;
    await page.goto(`${base}/console/bank`);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    for (const pathname of visited) {
      const reply = await context.request.get(`${base}${pathname}`, { maxRedirects: 0 });
      expect([pathname, reply.status(), reply.headers().location?.startsWith('/sign-in')]).toEqual([
        pathname,
        303,
        true,
      ]);
    }
    await screenshot(page, 'day-15-signed-out');
  });

  it('a wrong token cannot sign in, and a revoked one loses every console page', async () => {
    const { page } = await newPage(tablet);
    await page.goto(`${base}/sign-in?next=%2Fconsole%2Fbank`);
    await page.getByLabel('Team token').fill('pgt_not-the-team-token-at-all-000000000000000000');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('That token is not right.').waitFor();
    await page.goto(`${base}/console/bank`);
    await page.waitForURL(/\/sign-in\?next=/);

    const analyst = await createAccessToken(database.db, 'analyst', 'volunteer tablet');
    const reader = await newPage(tablet);
    // Filtered (the whole bank is checked in bank-all-charts.test.ts).
    await reader.page.goto(`${base}/sign-in?next=%2Fconsole%2Fbank%3Fscenario%3Dtown`);
    await reader.page.getByLabel('Team token').fill(analyst.token);
    await reader.page.getByRole('button', { name: 'Sign in' }).click();
    await reader.page.waitForURL(`${base}/console/bank?scenario=town`);
    await heading(reader.page, 'Item bank');
    expect(await reader.page.getByRole('button', { name: 'Retire this item' }).count()).toBe(0);
    await checkPage(reader.page, '16-bank-analyst');

    expect(await revokeAccessToken(database.db, analyst.summary.id)).toBe(true);
    for (const pathname of visited) {
      const reply = await reader.context.request.get(`${base}${pathname}`, { maxRedirects: 0 });
      expect([pathname, reply.status(), reply.headers().location?.startsWith('/sign-in')]).toEqual([
        pathname,
        303,
        true,
      ]);
    }
    await reader.page.reload();
    await reader.page.waitForURL(/\/sign-in\?next=/);
    await screenshot(reader.page, 'day-17-revoked');
  });
});
