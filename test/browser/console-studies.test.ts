/**
 * The console's study pages in Debian's chromium at tablet width (768 px): sign in, create a study
 * (live item count, a refused form with its fields marked, a draft kept across an expired sign-in),
 * add a cohort, print its kiosk sign, watch progress change without a reload, and an analyst's
 * read-only view. Every page passes axe-core (WCAG 2.1 A/AA, no serious or critical violation),
 * fits 768 px without sideways scrolling and blocks nothing under the Content-Security-Policy.
 * Screenshots go to test-artifacts/browser/console-*.png.
 */
import type { FastifyInstance } from 'fastify';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ItemBank, loadBank } from '../../server/bank/load-bank.js';
import { selectItemPool } from '../../server/delivery/select-item-pool.js';
import { createAccessToken } from '../../server/storage/token-repository.js';
import { cspViolationsOf, listenOnSqlite, recordCspViolations } from '../helpers/browser-setup.js';
import type { TestDatabase } from '../helpers/test-databases.js';
import { browserAvailable, launchBrowser, screenshot, seriousViolations } from './browser-harness.js';

const adminToken = 'console-studies-admin-token';
const tablet = { width: 768, height: 1024 };

describe.runIf(browserAvailable())('console study pages in the browser (768 px)', { timeout: 60_000 }, () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let bank: ItemBank;
  let browser: Browser;
  let base = '';
  let analystToken = '';
  let context: BrowserContext;
  let page: Page;
  let studyUrl = '';

  beforeAll(async () => {
    bank = await loadBank('items');
    ({ app, database, baseUrl: base } = await listenOnSqlite({ bank, adminToken }));
    analystToken = (await createAccessToken(database.db, 'analyst', 'visitor team')).token;
    browser = await launchBrowser();
    ({ context, page } = await newPage());
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await database?.cleanup();
  });

  async function newPage() {
    const ctx = await browser.newContext({ viewport: tablet });
    await recordCspViolations(ctx);
    return { context: ctx, page: await ctx.newPage() };
  }

  /** axe, CSP, no sideways scrolling at 768 px, and a screenshot. */
  async function checkPage(p: Page, name: string) {
    await screenshot(p, `console-${name}`);
    expect(await cspViolationsOf(p), `CSP on ${name}`).toEqual([]);
    expect(await seriousViolations(p), `axe on ${name}`).toEqual([]);
    const width = await p.evaluate<number>('document.documentElement.scrollWidth');
    expect(width, `page width on ${name}`).toBeLessThanOrEqual(tablet.width);
  }

  async function signIn(p: Page, token: string) {
    await p.getByLabel('Team token').fill(token);
    await p.getByRole('button', { name: 'Sign in' }).click();
  }

  const expectedCount = (pool: { levels?: ('read' | 'interpret' | 'envision')[] }) =>
    selectItemPool(bank.items, pool).itemIds.length;

  it('signs in and lists the studies', async () => {
    await page.goto(`${base}/console`);
    await page.waitForURL(/\/sign-in\?next=/);
    await signIn(page, adminToken);
    await page.waitForURL(`${base}/console`);
    await page.getByRole('heading', { level: 1, name: 'Studies' }).waitFor();
    await checkPage(page, 'studies-empty');
  });

  it('counts matching items as filters change, and marks invalid fields keeping the values', async () => {
    await page.getByRole('link', { name: 'New study' }).click();
    await page.getByRole('heading', { level: 1, name: 'New study' }).waitFor();
    const count = page.locator('#pool-count');
    expect(await count.getAttribute('data-count')).toBe(String(expectedCount({})));
    await checkPage(page, 'new-study');
    await page.getByLabel('Read (find a value)').check();
    const readOnly = expectedCount({ levels: ['read'] });
    expect(readOnly).toBeLessThan(expectedCount({}));
    await expect.poll(() => count.getAttribute('data-count'), { timeout: 10_000 }).toBe(String(readOnly));
    expect(await count.textContent()).toBe(`${readOnly} items match these filters.`);

    await page.getByLabel('Title').fill('Orbelle Bikes, shop visitors');
    await page.getByLabel('Items per attempt').fill('0');
    await page.getByLabel('Time limit in seconds (blank: none)').fill('ten');
    await page.getByRole('button', { name: 'Create study' }).click();
    await page.locator('#form-problems').waitFor();
    expect(await page.getByLabel('Items per attempt').getAttribute('aria-invalid')).toBe('true');
    expect(await page.locator('#maxItems-error').textContent()).toBe('must be at least 1');
    expect(await page.locator('#timeLimitSeconds-error').textContent()).toBe('must be a whole number');
    expect(await page.getByLabel('Title').inputValue()).toBe('Orbelle Bikes, shop visitors');
    expect(await page.getByLabel('Read (find a value)').isChecked()).toBe(true);
    // The summary of problems takes focus, so a screen reader hears it first.
    expect(await page.evaluate<string>('document.activeElement.id')).toBe('form-problems');
    await checkPage(page, 'new-study-problems');
  });

  it('keeps a half-filled form across an expired sign-in and saves it after signing in again', async () => {
    await page.getByLabel('Items per attempt').fill('8');
    await page.getByLabel('Time limit in seconds (blank: none)').fill('');
    await page
      .getByLabel('Consent text')
      .fill('A short chart activity at the Orbelle Bikes shop. No names are kept.');
    // The sign-in runs out while the form is open.
    await context.clearCookies();
    await page.getByRole('button', { name: 'Create study' }).click();
    await page.waitForURL(/\/sign-in\?next=%2Fconsole%2Fstudies%2Fnew/);
    await signIn(page, adminToken);
    await page.waitForURL(`${base}/console/studies/new`);
    await page.locator('#draft-note:not([hidden])').waitFor();
    expect(await page.getByLabel('Title').inputValue()).toBe('Orbelle Bikes, shop visitors');
    expect(await page.getByLabel('Items per attempt').inputValue()).toBe('8');
    expect(await page.getByLabel('Read (find a value)').isChecked()).toBe(true);
    expect(await page.getByLabel('Consent text').inputValue()).toContain('Orbelle Bikes shop');
    await checkPage(page, 'new-study-restored');
    await page.getByRole('button', { name: 'Create study' }).click();
    await page.getByText('Study created.').waitFor();
    studyUrl = page.url().replace(/\?.*$/, '');
    expect(
      await page.evaluate<string | null>(`sessionStorage.getItem('plotgauge.console.draft.new-study')`),
    ).toBeNull();
    const stored = await database.db.selectFrom('studies').selectAll().execute();
    expect(stored).toHaveLength(1);
    expect(JSON.parse(stored[0]!.settings)).toMatchObject({ maxItems: 8, pool: { levels: ['read'] } });
  });

  it('adds a cohort with a join link and QR code, and prints its kiosk sign', async () => {
    await page.getByLabel('New cohort label').fill('Saturday shop visitors');
    await page.getByRole('button', { name: 'Add cohort' }).click();
    await page.getByText('Cohort added.').waitFor();
    const cohort = await database.db.selectFrom('cohorts').selectAll().executeTakeFirstOrThrow();
    await page.getByText(cohort.join_code, { exact: true }).first().waitFor();
    expect(
      await page.getByRole('img', { name: 'QR code of the join link of Saturday shop visitors' }).count(),
    ).toBe(1);
    await checkPage(page, 'study');

    await page.getByRole('link', { name: 'Kiosk sign' }).click();
    await page.getByRole('heading', { level: 1, name: 'Kiosk sign: Saturday shop visitors' }).waitFor();
    expect(await page.getByRole('button', { name: 'Print the sign' }).isVisible()).toBe(true);
    await checkPage(page, 'kiosk-sign');
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('.console-header').isVisible()).toBe(false);
    expect(await page.locator('.kiosk-sign').isVisible()).toBe(true);
    expect(await page.locator('.sign-code').textContent()).toBe(cohort.join_code);
    await screenshot(page, 'console-kiosk-sign-print');
    const pdf = await page.pdf({ format: 'A4' });
    // One page: the page objects of the PDF (ISO 32000-1 §7.7.3.3).
    expect((pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-zA-Z])/g) ?? []).length).toBe(1);
    await page.emulateMedia({ media: 'screen' });
  });

  it('shows progress changing without a reload', async () => {
    await page.goto(`${studyUrl}/progress`);
    await page.getByRole('heading', { level: 1, name: 'Progress: Orbelle Bikes, shop visitors' }).waitFor();
    await checkPage(page, 'progress-empty');
    await page.evaluate('window.sameDocument = true');
    const cohort = await database.db.selectFrom('cohorts').selectAll().executeTakeFirstOrThrow();
    const joined = await request(app.server).post('/api/join').send({ code: cohort.join_code });
    expect(joined.status).toBe(201);
    await request(app.server)
      .post('/api/attempt/consent')
      .set('Authorization', `Bearer ${joined.body.token}`)
      .send({ agree: true });
    // Playwright's string predicates are eval, which the page's policy forbids: poll from here.
    await expect
      .poll(() => page.locator('#attempts-table tfoot td').first().textContent(), { timeout: 15_000 })
      .toBe('1');
    expect(await page.evaluate('window.sameDocument')).toBe(true);
    await checkPage(page, 'progress-one-attempt');
  });

  it("gives an analyst the study without forms, and an expired sign-in's fetch a way back", async () => {
    const analyst = await newPage();
    await analyst.page.goto(studyUrl);
    await signIn(analyst.page, analystToken);
    await analyst.page.getByRole('heading', { level: 1, name: 'Orbelle Bikes, shop visitors' }).waitFor();
    expect(await analyst.page.locator('form[method="post"][action^="/console"]').count()).toBe(0);
    expect(await analyst.page.getByText('Only an admin can change these settings.').isVisible()).toBe(true);
    await checkPage(analyst.page, 'study-analyst');
    await analyst.page.goto(`${studyUrl}/progress`);
    await analyst.context.clearCookies();
    await analyst.page.getByRole('link', { name: 'Sign in again' }).waitFor({ timeout: 15_000 });
    await analyst.context.close();
  });
});
