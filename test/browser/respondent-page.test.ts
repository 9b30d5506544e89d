import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StudySettingsInput } from '../../server/delivery/study-settings.js';
import { en } from '../../server/pages/strings/en.js';
import { cspViolationsOf, recordCspViolations } from '../helpers/browser-setup.js';
import {
  answerCurrentItem,
  browserAvailable,
  createStudyWithCohort,
  focused,
  launchBrowser,
  type RunningServer,
  screenshot,
  seriousViolations,
  smallTargets,
  startServer,
  stored,
  storedAttempts,
  storedResponses,
  waitForHeading,
} from './browser-harness.js';

const available = browserAvailable();
const phone = { width: 360, height: 740 };
const kiosk = { width: 1920, height: 1080 };
const progress = (current: number, total: number) =>
  en.progress.replace('{current}', String(current)).replace('{total}', String(total));

describe.skipIf(!available)('respondent page in chromium', { timeout: 90_000 }, () => {
  let server: RunningServer;
  let browser: Browser;
  /** Everything the browser reported as a Content-Security-Policy violation, across all tests. */
  const cspViolations: string[] = [];

  beforeAll(async () => {
    server = await startServer();
    browser = await launchBrowser();
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  function settings(extra: Partial<StudySettingsInput> = {}): StudySettingsInput {
    return {
      title: 'Ferries and harbours of Velmora Isle',
      pool: { itemIds: [...server.itemIds] },
      design: 'fixed',
      maxItems: server.itemIds.length,
      ...extra,
    };
  }

  const background: StudySettingsInput['background'] = [
    {
      id: 'age-band',
      prompt: 'How old are you?',
      options: [
        { id: 'under-12', text: 'Under 12' },
        { id: '12-17', text: '12 to 17' },
        { id: '18-plus', text: '18 or older' },
      ],
    },
    {
      id: 'works-with-data',
      prompt: 'Do you work with numbers or charts?',
      options: [
        { id: 'often', text: 'Often' },
        { id: 'sometimes', text: 'Sometimes' },
        { id: 'never', text: 'Never' },
      ],
    },
  ];

  /** A fresh browser context (own localStorage) that records blocked content. */
  async function newPage(viewport: { width: number; height: number }) {
    const context = await browser.newContext({ viewport });
    await recordCspViolations(context);
    const page = await context.newPage();
    page.on('console', (message) => {
      if (/Content.Security.Policy/i.test(message.text())) cspViolations.push(message.text());
    });
    return { context, page };
  }

  async function open(viewport: { width: number; height: number }, joinCode: string) {
    const { context, page } = await newPage(viewport);
    await page.goto(`${server.baseUrl}/join/${joinCode}`);
    await waitForHeading(page, en.welcomeHeading);
    return { context, page };
  }

  function blockedByPolicy(page: Page): Promise<string[]> {
    return cspViolationsOf(page);
  }

  /** Screenshot, axe and touch-target checks of the current screen. */
  async function checkScreen(page: Page, name: string) {
    await screenshot(page, name);
    expect(await blockedByPolicy(page), `CSP on ${name}`).toEqual([]);
    expect(await seriousViolations(page), `axe on ${name}`).toEqual([]);
    expect(await smallTargets(page), `touch targets on ${name}`).toEqual([]);
  }

  async function startAndConsent(page: Page) {
    await page.getByRole('button', { name: en.startButton }).click();
    await waitForHeading(page, en.consentHeading);
    await page.getByRole('button', { name: en.consentYes }).click();
  }

  async function answerBackground(page: Page) {
    await waitForHeading(page, en.backgroundHeading);
    await page.getByLabel('12 to 17').check();
    await page
      .getByRole('group', { name: 'Do you work with numbers or charts?' })
      .getByText(en.preferNotToSay)
      .click();
    await page.getByRole('button', { name: en.continueButton }).click();
  }

  it('phone (360x740): every screen from welcome to the end, readable, keyboard-ready and axe-clean', async () => {
    const { joinCode, cohortId } = await createStudyWithCohort(
      server,
      settings({ background, endSummary: true }),
    );
    const { context, page } = await open(phone, joinCode);
    await checkScreen(page, 'phone-1-welcome');

    await page.getByRole('button', { name: en.startButton }).click();
    await waitForHeading(page, en.consentHeading);
    // Focus moves to the new screen's heading.
    expect((await focused(page)).tag).toBe('H1');
    await checkScreen(page, 'phone-2-consent');
    await page.getByRole('button', { name: en.consentYes }).click();

    await waitForHeading(page, en.backgroundHeading);
    // Pressing Next with nothing chosen explains what to do, and stays.
    await page.getByRole('button', { name: en.continueButton }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toBe(en.backgroundMissing);
    await checkScreen(page, 'phone-3-background');
    await answerBackground(page);

    const total = server.itemIds.length;
    const seen: string[] = [];
    for (let number = 1; number <= total; number += 1) {
      await waitForHeading(page, progress(number, total));
      expect(await focused(page)).toEqual({ tag: 'H1', text: progress(number, total) });
      // The chart is our renderer's SVG, shown inline.
      expect(await page.locator('figure.chart svg').count()).toBe(1);
      await checkScreen(
        page,
        `phone-4-chart-${number}-${await page.locator('form').getAttribute('data-kind')}`,
      );
      seen.push(await answerCurrentItem(page));
    }
    await waitForHeading(page, en.endHeading);
    // The summary is on in this study: answered and correct counts, no per-question scores.
    await expect
      .poll(() => page.locator('.summary').textContent())
      .toMatch(/^You answered 4 questions and read [0-9] charts correctly\.$/);
    await checkScreen(page, 'phone-5-end');

    expect(seen).toEqual(server.itemIds);
    const rows = await storedResponses(server, cohortId);
    expect(rows.map((row) => row.item_id).sort()).toEqual([...server.itemIds].sort());
    const attempts = await storedAttempts(server, cohortId);
    expect(attempts.map((attempt) => attempt.status)).toEqual(['finished']);
    await context.close();
  });

  it('kiosk (1920x1080): chart beside the question, "Next visitor" ends the turn and clears the token', async () => {
    const { joinCode, cohortId } = await createStudyWithCohort(
      server,
      settings({ kiosk: true, idleSeconds: 120 }),
    );
    const { context, page } = await open(kiosk, joinCode);
    await checkScreen(page, 'kiosk-1-welcome');
    await startAndConsent(page);
    const total = server.itemIds.length;
    for (let number = 1; number <= total; number += 1) {
      await waitForHeading(page, progress(number, total));
      if (number === 1) {
        // Side by side: the chart's right edge is left of the question.
        const chart = await page.locator('figure.chart').boundingBox();
        const form = await page.locator('form').boundingBox();
        expect(chart!.x + chart!.width).toBeLessThan(form!.x);
        await checkScreen(page, 'kiosk-2-chart');
      }
      await answerCurrentItem(page);
    }
    await waitForHeading(page, en.endHeading);
    await checkScreen(page, 'kiosk-3-end');
    expect(await stored(page, `plotgauge.attempt.${joinCode}`)).not.toBeNull();
    await page.getByRole('button', { name: en.nextVisitor }).click();
    await waitForHeading(page, en.welcomeHeading);
    expect(await stored(page, `plotgauge.attempt.${joinCode}`)).toBeNull();
    expect((await storedResponses(server, cohortId)).length).toBe(total);
    await context.close();
  });

  it('reload mid-attempt resumes at the same chart', async () => {
    const { joinCode } = await createStudyWithCohort(server, settings({ background }));
    const { context, page } = await open(phone, joinCode);
    await startAndConsent(page);
    await answerBackground(page);
    await waitForHeading(page, progress(1, 4));
    await answerCurrentItem(page);
    await waitForHeading(page, progress(2, 4));
    const before = await page.locator('form').getAttribute('data-item-id');
    await page.reload();
    await waitForHeading(page, progress(2, 4));
    expect(await page.locator('form').getAttribute('data-item-id')).toBe(before);
    await context.close();
  });

  it('a kiosk left idle returns to the welcome screen and the old attempt is abandoned', async () => {
    // 15 s is the shortest idle time a study allows (study-settings.ts).
    const { joinCode, cohortId } = await createStudyWithCohort(
      server,
      settings({ kiosk: true, idleSeconds: 15 }),
    );
    const { context, page } = await open(kiosk, joinCode);
    await startAndConsent(page);
    await waitForHeading(page, progress(1, 4));
    await answerCurrentItem(page);
    await waitForHeading(page, progress(2, 4));
    // Nobody touches the screen.
    await waitForHeading(page, en.welcomeHeading, 30_000);
    expect(await stored(page, `plotgauge.attempt.${joinCode}`)).toBeNull();
    await expect
      .poll(async () => (await storedAttempts(server, cohortId)).map((a) => a.status), { timeout: 10_000 })
      .toEqual(['abandoned']);
    // The next visitor starts a fresh attempt.
    await startAndConsent(page);
    await waitForHeading(page, progress(1, 4));
    expect((await storedAttempts(server, cohortId)).map((a) => a.status).sort()).toEqual([
      'abandoned',
      'started',
    ]);
    await context.close();
  });

  it('the network drops mid-answer: the answer waits, is sent once when back, and the attempt goes on', async () => {
    const { joinCode, cohortId } = await createStudyWithCohort(server, settings());
    const { context, page } = await open(phone, joinCode);
    await startAndConsent(page);
    await waitForHeading(page, progress(1, 4));
    await answerCurrentItem(page);
    await waitForHeading(page, progress(2, 4));

    await context.setOffline(true);
    const itemId = await answerCurrentItem(page);
    await expect.poll(() => page.locator('#status').textContent()).toBe(en.savingRetry);
    const submit = page.locator('form button[type="submit"]');
    expect(await submit.isDisabled()).toBe(true);
    await screenshot(page, 'phone-6-offline');
    expect(await stored(page, `plotgauge.pending.${joinCode}`)).toContain(itemId);
    await page.waitForTimeout(2500);
    expect((await storedResponses(server, cohortId)).filter((row) => row.item_id === itemId)).toEqual([]);

    await context.setOffline(false);
    await waitForHeading(page, progress(3, 4), 40_000);
    expect(await stored(page, `plotgauge.pending.${joinCode}`)).toBeNull();
    await answerCurrentItem(page);
    await waitForHeading(page, progress(4, 4));
    await answerCurrentItem(page);
    await waitForHeading(page, en.endHeading);

    const rows = await storedResponses(server, cohortId);
    const perItem = new Map<string, number>();
    for (const row of rows) perItem.set(row.item_id, (perItem.get(row.item_id) ?? 0) + 1);
    expect([...perItem.values()]).toEqual([1, 1, 1, 1]);
    expect(perItem.get(itemId)).toBe(1);
    await context.close();
  });

  it('an answer stored but never acknowledged is sent again and counted once', async () => {
    const { joinCode, cohortId } = await createStudyWithCohort(server, settings());
    const { context, page } = await open(phone, joinCode);
    let lost = 0;
    await page.route('**/api/attempt/responses', async (route) => {
      if (lost === 0) {
        lost += 1;
        // The server commits the answer, then the reply never reaches the browser.
        await route.fetch();
        await route.abort('connectionreset');
        return;
      }
      await route.continue();
    });
    await startAndConsent(page);
    await waitForHeading(page, progress(1, 4));
    const itemId = await answerCurrentItem(page);
    await waitForHeading(page, progress(2, 4), 20_000);
    expect(lost).toBe(1);
    const rows = await storedResponses(server, cohortId);
    expect(rows.filter((row) => row.item_id === itemId).length).toBe(1);
    expect(rows.length).toBe(1);
    await context.close();
  });

  it('declining shows a kind goodbye, stores nothing, and passes axe', async () => {
    const { joinCode, cohortId } = await createStudyWithCohort(server, settings());
    const { context, page } = await open(phone, joinCode);
    await page.getByRole('button', { name: en.startButton }).click();
    await waitForHeading(page, en.consentHeading);
    await page.getByRole('button', { name: en.consentNo }).click();
    await waitForHeading(page, en.declinedHeading);
    await checkScreen(page, 'phone-7-declined');
    expect(await storedResponses(server, cohortId)).toEqual([]);
    await context.close();
  });

  it('an unknown code says so in plain words', async () => {
    const { context, page } = await newPage(phone);
    await page.goto(`${server.baseUrl}/join/ZZZZ-99`);
    await page.getByRole('button', { name: en.startButton }).click();
    await expect.poll(() => page.locator('#status').textContent()).toBe(en.codeNotFound);
    await page.goto(`${server.baseUrl}/`);
    await checkScreen(page, 'phone-0-start');
    await page.getByLabel(en.codeLabel).fill('zzzz 99');
    await page.getByRole('button', { name: en.codeSubmit }).click();
    await page.waitForURL(`${server.baseUrl}/join/ZZZZ-99`);
    await context.close();
  });

  it('the browser reported no Content-Security-Policy violation on any screen', () => {
    expect(cspViolations).toEqual([]);
  });

  it('the policy is really enforced: an inline style attribute is blocked and reported', async () => {
    const { joinCode } = await createStudyWithCohort(server, settings());
    const { context, page } = await open(phone, joinCode);
    const colour = await page.evaluate<string>(`(() => {
      document.body.setAttribute('style', 'color: rgb(255, 0, 0)');
      return getComputedStyle(document.body).color;
    })()`);
    expect(colour).not.toBe('rgb(255, 0, 0)');
    await expect.poll(() => blockedByPolicy(page)).toEqual(['style-src-attr inline']);
    cspViolations.length = 0;
    await context.close();
  });
});
