import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { AxeBuilder } from '@axe-core/playwright';
import type { FastifyInstance } from 'fastify';
import { type Browser, chromium, type Page } from 'playwright-core';
import { buildApp } from '../../server/app.js';
import { type ItemBank, loadBank } from '../../server/bank/load-bank.js';
import { loadConfig } from '../../server/config.js';
import type { StudySettingsInput } from '../../server/delivery/study-settings.js';
import { pageRoutes } from '../../server/http/page-routes.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

export const chromiumPath = '/usr/bin/chromium';
const repository = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
export const artifactsFolder = path.join(repository, 'test-artifacts', 'browser');
const adminToken = 'browser-tests-admin-token';

/**
 * Whether the browser suite can run. Without Debian's chromium it is skipped with a visible
 * message; with REQUIRE_ALL=1 (CI) a missing browser fails the run instead.
 */
export function browserAvailable(): boolean {
  if (existsSync(chromiumPath)) return true;
  const reason = `${chromiumPath} is missing (apt-get install chromium)`;
  if (process.env.REQUIRE_ALL === '1')
    throw new Error(`REQUIRE_ALL=1 but the browser tests cannot run: ${reason}`);
  console.warn(`[plotgauge tests] skipping browser tests: ${reason}`);
  return false;
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: chromiumPath,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
}

/**
 * The real item bank plus three invented items of the kinds the bank does not have yet
 * (choose-all, number, short text; test/browser/fixtures), loaded from a temporary copy.
 */
async function loadTestBank(): Promise<{ bank: ItemBank; folder: string }> {
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-bank-'));
  cpSync(path.join(repository, 'items'), folder, { recursive: true });
  const fixtures = path.join(repository, 'test', 'browser', 'fixtures');
  for (const name of readdirSync(fixtures))
    cpSync(path.join(fixtures, name), path.join(folder, 'isle', name));
  return { bank: await loadBank(folder), folder };
}

export interface RunningServer {
  readonly baseUrl: string;
  readonly app: FastifyInstance;
  readonly database: TestDatabase;
  /** Item ids of a four-item form: one of each response kind, choice first. */
  readonly itemIds: readonly string[];
  close(): Promise<void>;
}

/** Starts the real app on a random loopback port with a temporary SQLite database. */
export async function startServer(): Promise<RunningServer> {
  const sqlite = testEngines().find((engine) => engine.engine === 'sqlite')!;
  const database = await sqlite.open();
  await migrateToLatest(database.db);
  const { bank, folder } = await loadTestBank();
  const config = loadConfig({}, { databaseUrl: database.url, adminToken });
  const app = await buildApp({ config, db: database.db, bank });
  // Until server/app.ts registers the pages itself.
  if (!app.hasRoute({ method: 'GET', url: '/join/:code' })) await app.register(pageRoutes);
  await app.listen({ port: 0, host: '127.0.0.1' });
  const address = app.server.address();
  if (address === null || typeof address === 'string') throw new Error('no TCP address');
  const choice = bank.items.find(
    (item) => item.status === 'active' && item.chart.type === 'bar' && item.response.kind === 'single-choice',
  );
  if (!choice) throw new Error('the bank has no single-choice bar chart item');
  return {
    baseUrl: `http://127.0.0.1:${address.port}`,
    app,
    database,
    itemIds: [
      choice.id,
      'isle-test-crossings-multiple-choice',
      'isle-test-crossings-numeric',
      'isle-test-crossings-short-text',
    ],
    async close() {
      await app.close();
      await database.cleanup();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}

/** Creates a study through the admin API and one cohort; returns the cohort's join code and id. */
export async function createStudyWithCohort(
  server: RunningServer,
  settings: StudySettingsInput,
): Promise<{ joinCode: string; cohortId: string }> {
  const headers = { authorization: `Bearer ${adminToken}` };
  const study = await server.app.inject({
    method: 'POST',
    url: '/api/admin/studies',
    headers,
    payload: settings,
  });
  if (study.statusCode !== 201) throw new Error(`creating the study failed: ${study.body}`);
  const cohort = await server.app.inject({
    method: 'POST',
    url: `/api/admin/studies/${study.json().id}/cohorts`,
    headers,
    payload: { label: 'Browser test visitors' },
  });
  if (cohort.statusCode !== 201) throw new Error(`creating the cohort failed: ${cohort.body}`);
  return { joinCode: cohort.json().joinCode, cohortId: cohort.json().id };
}

/** Stored responses of a cohort, one row per response. */
export async function storedResponses(server: RunningServer, cohortId: string) {
  return server.database.db
    .selectFrom('responses')
    .innerJoin('attempts', 'attempts.id', 'responses.attempt_id')
    .select(['responses.item_id', 'responses.answer_kind', 'responses.answer', 'responses.attempt_id'])
    .where('attempts.cohort_id', '=', cohortId)
    .execute();
}

export async function storedAttempts(server: RunningServer, cohortId: string) {
  return server.database.db
    .selectFrom('attempts')
    .select(['id', 'status'])
    .where('cohort_id', '=', cohortId)
    .execute();
}

/**
 * axe-core with the WCAG 2.0/2.1 A and AA rule tags; returns the serious and critical violations
 * as `rule: target` lines (empty when the screen passes).
 */
export async function seriousViolations(page: Page): Promise<string[]> {
  // Tags as axe-core documents them for WCAG 2.1 level A and AA (axe-core API docs, "runOnly" tags).
  const result = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
    .analyze();
  return result.violations
    .filter((violation) => violation.impact === 'serious' || violation.impact === 'critical')
    .flatMap((violation) => violation.nodes.map((node) => `${violation.id}: ${node.target.join(' ')}`));
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(artifactsFolder, { recursive: true });
  await page.screenshot({ path: path.join(artifactsFolder, `${name}.png`), fullPage: true });
}

/**
 * Interactive things smaller than 44 by 44 CSS pixels (WCAG 2.1 SC 2.5.5 Target Size asks 44 px).
 * Radio buttons and checkboxes count through their label, which is the real target.
 */
export async function smallTargets(page: Page): Promise<string[]> {
  // Runs in the page (plain browser JavaScript; this project's TypeScript has no DOM types).
  return page.evaluate<string[]>(`(() => {
    const small = [];
    const selector = 'button, a[href], label, input:not([type="radio"]):not([type="checkbox"]), textarea';
    for (const element of document.querySelectorAll(selector)) {
      const box = element.getBoundingClientRect();
      if (box.width === 0 && box.height === 0) continue;
      if (element.tagName === 'LABEL' && !element.closest('.choice')) continue;
      if (box.height < 44 || box.width < 44) {
        const text = (element.textContent || '').trim().slice(0, 30);
        small.push(element.tagName.toLowerCase() + ' "' + text + '" ' + Math.round(box.width) + 'x' + Math.round(box.height));
      }
    }
    return small;
  })()`);
}

/** The element that has keyboard focus: its tag name and text. */
export function focused(page: Page): Promise<{ tag: string; text: string }> {
  return page.evaluate<{ tag: string; text: string }>(
    '({ tag: document.activeElement?.tagName ?? "", text: document.activeElement?.textContent ?? "" })',
  );
}

/** A value in the page's localStorage, or null. */
export function stored(page: Page, key: string): Promise<string | null> {
  return page.evaluate<string | null>(`localStorage.getItem(${JSON.stringify(key)})`);
}

/** Answers the item on screen with a plausible answer of its kind and presses the button. */
export async function answerCurrentItem(page: Page): Promise<string> {
  const form = page.locator('form[data-item-id]');
  const itemId = (await form.getAttribute('data-item-id')) ?? '';
  const kind = await form.getAttribute('data-kind');
  if (kind === 'single-choice') await page.locator('.choice label').first().click();
  else if (kind === 'multiple-choice') {
    await page.getByLabel('Tuesday', { exact: true }).check();
    await page.getByLabel('Thursday', { exact: true }).check();
  } else if (kind === 'numeric') await page.getByLabel('Your answer').fill('12');
  else await page.getByLabel('Your answer').fill('It drops on Wednesday and is highest on Friday.');
  await page.locator('form[data-item-id] button[type="submit"]').click();
  return itemId;
}

/** Waits for the screen whose main heading has this text. */
export async function waitForHeading(page: Page, text: string, timeout = 10_000): Promise<void> {
  await page.getByRole('heading', { level: 1, name: text, exact: true }).waitFor({ timeout });
}
