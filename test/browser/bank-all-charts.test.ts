/**
 * The console's bank browser with the WHOLE item bank on one page (every chart the server draws, as
 * respondents see it): axe-core finds no serious or critical WCAG 2.1 A/AA violation, the
 * Content-Security-Policy blocks nothing, and the page fits 768 px without sideways scrolling. The
 * heaviest page the server draws (axe over about 110 charts: about 10 s on a 2-core machine), so it
 * has a file of its own; the other console tests check filtered bank pages.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ItemBank, loadBank } from '../../server/bank/load-bank.js';
import { createAccessToken } from '../../server/storage/token-repository.js';
import {
  cspViolationsOf,
  type ListeningApp,
  listenOnSqlite,
  recordCspViolations,
} from '../helpers/browser-setup.js';
import { browserAvailable, launchBrowser, seriousViolations } from './browser-harness.js';

describe.runIf(browserAvailable())('the whole bank in the console bank browser', { timeout: 300_000 }, () => {
  let server: ListeningApp;
  let bank: ItemBank;
  let browser: Browser;
  let page: Page;

  beforeAll(async () => {
    bank = await loadBank('items');
    server = await listenOnSqlite({ bank });
    const { token } = await createAccessToken(server.database.db, 'analyst', 'accessibility check');
    browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 768, height: 1024 } });
    await recordCspViolations(context);
    page = await context.newPage();
    await page.goto(`${server.baseUrl}/console/bank`);
    await page.waitForURL(/\/sign-in\?next=/);
    await page.getByLabel('Team token').fill(token);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${server.baseUrl}/console/bank`);
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('draws every active item, passes axe and the CSP, and fits 768 px', async () => {
    const active = bank.items.filter((item) => item.status === 'active');
    const charts = await page.locator('main svg[role="img"]').count();
    expect(charts).toBeGreaterThanOrEqual(active.length);
    expect(await cspViolationsOf(page)).toEqual([]);
    expect(await seriousViolations(page)).toEqual([]);
    expect(await page.evaluate<number>('document.documentElement.scrollWidth')).toBeLessThanOrEqual(768);
  });
});
