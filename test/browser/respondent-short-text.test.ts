import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { en } from '../../server/pages/strings/en.js';
import {
  browserAvailable,
  createStudyWithCohort,
  launchBrowser,
  type RunningServer,
  screenshot,
  seriousViolations,
  smallTargets,
  startServer,
  storedResponses,
  waitForHeading,
} from './browser-harness.js';

const available = browserAvailable();
const phone = { width: 360, height: 740 };
const shortTextItem = 'isle-test-crossings-short-text';

describe.skipIf(!available)('respondent page: a short-text question in chromium', { timeout: 90_000 }, () => {
  let server: RunningServer;
  let browser: Browser;

  beforeAll(async () => {
    server = await startServer();
    browser = await launchBrowser();
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('phone (360x740): a labelled text box with a live letter count, posted as { kind: "text", text }', async () => {
    const { joinCode, cohortId } = await createStudyWithCohort(server, {
      title: 'Ferry crossings in words',
      pool: { itemIds: [shortTextItem] },
      design: 'fixed',
      maxItems: 1,
    });
    const context = await browser.newContext({ viewport: phone });
    const page = await context.newPage();
    await page.goto(`${server.baseUrl}/join/${joinCode}`);
    await waitForHeading(page, en.welcomeHeading);
    await page.getByRole('button', { name: en.startButton }).click();
    await waitForHeading(page, en.consentHeading);
    await page.getByRole('button', { name: en.consentYes }).click();
    await page.locator('form[data-kind="short-text"]').waitFor();

    // The box is found by its label and says how much room there is (the fixture allows 200 letters).
    const box = page.getByLabel(en.textLabel, { exact: true });
    expect(await box.evaluate((el) => el.tagName)).toBe('TEXTAREA');
    expect(await box.getAttribute('maxlength')).toBe('200');
    const count = page.locator('#answer-count');
    const counted = (n: number) => en.textCount.replace('{count}', String(n)).replace('{maxLength}', '200');
    expect(await count.textContent()).toBe(counted(0));
    expect((await box.getAttribute('aria-describedby'))?.split(' ')).toContain('answer-count');

    const text = 'More on Friday, fewer midweek.';
    await box.pressSequentially(text);
    expect(await count.textContent()).toBe(counted(text.length));
    // Fits the phone: no sideways scrolling, and the box spans the column.
    expect(await page.evaluate('document.documentElement.scrollWidth')).toBeLessThanOrEqual(phone.width);
    expect((await box.boundingBox())!.width).toBeGreaterThan(phone.width * 0.7);
    await screenshot(page, 'phone-short-text');
    expect(await seriousViolations(page)).toEqual([]);
    expect(await smallTargets(page)).toEqual([]);

    await page.getByRole('button', { name: en.finishButton }).click();
    await waitForHeading(page, en.endHeading);
    const rows = await storedResponses(server, cohortId);
    expect(rows.map((row) => [row.item_id, row.answer_kind, row.answer])).toEqual([
      [shortTextItem, 'answer', JSON.stringify({ kind: 'text', text })],
    ]);
    await context.close();
  });
});
