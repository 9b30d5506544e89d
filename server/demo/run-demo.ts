import { randomBytes } from 'node:crypto';
import { mkdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import type { FastifyInstance } from 'fastify';
import type { Kysely } from 'kysely';
import { buildApp } from '../app.js';
import type { ItemBank } from '../bank/load-bank.js';
import { openBank, recordItemVersions } from '../cli/open-bank.js';
import { openDatabase } from '../cli/open-database.js';
import { type Config, loadConfig } from '../config.js';
import { buildReport } from '../reports/build-report.js';
import { calibrateStudy } from '../reports/calibrate-study.js';
import { parseFairnessQuery } from '../reports/fairness-service.js';
import { reportToText } from '../reports/report-text.js';
import { seededRandom } from '../scoring/seeded-random.js';
import type { Database } from '../storage/database.js';
import { demoPilotBody, demoPilotDifficulty } from './demo-pilot.js';
import { generatingDifficulty } from './generating-difficulty.js';
import { callApi, simulateRespondent } from './simulate-through-api.js';
import { simulateAbilities } from './simulated-audience.js';
import {
  difficultiesFor,
  injectedDif,
  injectedDifItems,
  simulateWorksWithData,
  worksWithDataQuestion,
} from './simulated-background.js';

export interface DemoOptions {
  /** SQLite file, recreated each run (default ./data/demo.db). */
  readonly databaseFile?: string;
  /** Port to listen on (default PORT or 8080; a busy port falls back to any free one). */
  readonly port?: number;
  /** Seed of the simulated audience (default 2031). */
  readonly seed?: number;
  /** Respondents answering at the same time (default 8). */
  readonly concurrency?: number;
  /** Scale the cohorts down (tests), default 1. */
  readonly sizeFactor?: number;
  /** Where progress and the summary go (default console.log). */
  readonly print?: (line: string) => void;
}

export interface RunningDemo {
  readonly app: FastifyInstance;
  readonly db: Kysely<Database>;
  /** The demo database's URL (`sqlite:<file>`), for commands such as `plotgauge predict --database`. */
  readonly databaseUrl: string;
  readonly bank: ItemBank;
  readonly baseUrl: string;
  readonly studyId: string;
  readonly adminToken: string;
  readonly reportUrl: string;
  /** The report with its Fairness section: "works with data", yes (reference) vs no (focal). */
  readonly fairnessUrl: string;
  /** Join link of the weekend families' cohort, for a person who wants to take the test too. */
  readonly tryUrl: string;
  readonly signInUrl: string;
  readonly seconds: number;
  /** CPU seconds this process spent (server and simulated respondents share it), user + system. */
  readonly cpuSeconds: number;
  close(): Promise<void>;
}

/** The demo's Fairness question: reference "yes", focal the answer given invented DIF. */
const fairnessQuery = `${worksWithDataQuestion.id}:yes,${injectedDif.focalAnswer}`;
const studyTitle = 'Lumen Hall science centre: chart reading (SIMULATED AUDIENCE, demo data)';
const consentText =
  'DEMO: every respondent in this study is simulated by the plotgauge demo; no real person answered. ' +
  'If you try it yourself, your answers are stored without your name in the local demo database, which the next demo run deletes.';

/**
 * The newcomer's demo: recreates a SQLite file, starts the real server on it with a random admin
 * token, creates the Lumen Hall study (simulated audience, marked so in its title and consent text)
 * with four cohorts, has every simulated respondent answer through the real HTTP API with Rasch
 * probabilities, calibrates, and prints the report URL, a sign-in link and a text summary. The server
 * keeps running until `close()` (the command waits for Ctrl+C).
 */
export async function runDemo(options: DemoOptions = {}): Promise<RunningDemo> {
  const started = performance.now();
  const cpuStart = process.cpuUsage();
  const print = options.print ?? ((line: string) => console.log(line));
  const file = path.resolve(options.databaseFile ?? path.join('data', 'demo.db'));
  mkdirSync(path.dirname(file), { recursive: true });
  for (const suffix of ['', '-wal', '-shm', '-journal']) rmSync(`${file}${suffix}`, { force: true });
  const adminToken = randomBytes(18).toString('base64url');
  // Simulated data, deleted by the next run: fewer disk flushes (SQLITE_SYNC=normal; production keeps
  // full), and no per-address rate limits (all 520 simulated respondents come from this process).
  const env = {
    ...process.env,
    ADMIN_TOKEN: adminToken,
    SQLITE_SYNC: 'normal',
    LOG_LEVEL: 'warn',
    RATE_LIMIT_JOIN: '0',
    RATE_LIMIT_ANSWERS: '0',
  };
  const config: Config = loadConfig(env, {
    databaseUrl: `sqlite:${file}`,
    ...(options.port === undefined ? {} : { port: String(options.port) }),
  });
  const bank = await openBank(config.itemsDir);
  const db = await openDatabase(config);
  await recordItemVersions(db, bank);
  const app = await buildApp({ config, db, bank, logger: false });
  let address: string;
  try {
    address = await app.listen({ port: config.port, host: config.host });
  } catch (error) {
    if ((error as { code?: string }).code !== 'EADDRINUSE') throw error;
    address = await app.listen({ port: 0, host: config.host });
  }
  const baseUrl = address.replace('[::1]', 'localhost');
  const close = async () => {
    await app.close();
    await db.destroy();
  };
  try {
    const result = await populate(baseUrl, adminToken, bank, db, options, print);
    const reportUrl = `${baseUrl}/studies/${result.studyId}/report`;
    const fairnessUrl = `${reportUrl}?fairness=${fairnessQuery}`;
    const signInUrl = `${baseUrl}/sign-in?next=${encodeURIComponent(`/studies/${result.studyId}/report`)}#token=${adminToken}`;
    const seconds = (performance.now() - started) / 1000;
    const cpu = process.cpuUsage(cpuStart);
    const cpuSeconds = (cpu.user + cpu.system) / 1e6;
    return {
      app,
      db,
      databaseUrl: config.databaseUrl,
      bank,
      baseUrl,
      studyId: result.studyId,
      tryUrl: result.tryUrl,
      adminToken,
      reportUrl,
      fairnessUrl,
      signInUrl,
      seconds,
      cpuSeconds,
      close,
    };
  } catch (error) {
    await close();
    throw error;
  }
}

async function populate(
  baseUrl: string,
  adminToken: string,
  bank: ItemBank,
  db: Kysely<Database>,
  options: DemoOptions,
  print: (line: string) => void,
): Promise<{ studyId: string; tryUrl: string }> {
  const pool = bank.items.filter((item) => item.status === 'active' && item.response.kind !== 'short-text');
  const difficultyOf = new Map(
    pool.map((item) => [
      item.id,
      generatingDifficulty({
        chartType: item.chart.type,
        level: item.level,
        markCount: item.features.markCount,
        seriesCount: item.features.seriesCount,
        legend: item.features.legend,
        logAxis: item.features.logAxis,
        truncatedAxis: item.features.truncatedAxis,
        multiStep: item.features.multiStep,
      }),
    ]),
  );
  const study = await callApi(
    baseUrl,
    'POST',
    '/api/admin/studies',
    {
      title: studyTitle,
      pool: { itemIds: pool.map((item) => item.id) },
      design: 'rotated',
      maxItems: 12,
      // the two items given invented DIF open every booklet (a common block), so everyone answers them
      // and the report's Fairness section has enough answers in both groups to screen them
      commonItems: injectedDifItems(pool.map((item) => item.id)),
      consentText,
      background: [worksWithDataQuestion],
      endSummary: true,
    },
    adminToken,
  );
  const studyId = study.id as string;
  // One pilot chart in the bank's chart format; every simulated respondent meets it once.
  const pilotBody = demoPilotBody(options.sizeFactor ?? 1);
  const pilot = await callApi(baseUrl, 'POST', `/api/admin/studies/${studyId}/pilots`, pilotBody, adminToken);
  const pilots = new Map([[pilot.id as string, { difficulty: demoPilotDifficulty, key: pilotBody.key }]]);
  const difItems = injectedDifItems(pool.map((item) => item.id));
  const random = seededRandom(options.seed ?? 2031);
  const audience = simulateAbilities(random).map((entry) => ({
    ...entry,
    abilities: entry.abilities.slice(
      0,
      Math.max(1, Math.round(entry.abilities.length * (options.sizeFactor ?? 1))),
    ),
  }));
  const people = audience.reduce((s, a) => s + a.abilities.length, 0);
  print(`plotgauge demo: ${people} simulated respondents answer ${pool.length} items through the HTTP API…`);
  print(
    '  (simulated data: the demo database is written with SQLITE_SYNC=normal; production default is full)',
  );
  let done = 0;
  let tryUrl = baseUrl;
  const began = performance.now();
  for (const { cohort, abilities } of audience) {
    const created = await callApi(
      baseUrl,
      'POST',
      `/api/admin/studies/${studyId}/cohorts`,
      { label: cohort.label },
      adminToken,
    );
    const joinCode = created.joinCode as string;
    if (cohort.label === 'Weekend families') tryUrl = `${baseUrl}/join/${joinCode}`;
    // Each respondent draws from its own seeded stream, so the answers do not depend on scheduling.
    const queue = abilities.map((ability, index) => ({
      ability,
      seed: (options.seed ?? 2031) * 7919 + done + index,
      worksWithData: simulateWorksWithData(random),
    }));
    const workers = Array.from({ length: options.concurrency ?? 8 }, async () => {
      for (let next = queue.shift(); next; next = queue.shift()) {
        await simulateRespondent(
          baseUrl,
          joinCode,
          next.ability,
          difficultiesFor(next.worksWithData, difficultyOf, difItems),
          bank,
          seededRandom(next.seed),
          { [worksWithDataQuestion.id]: next.worksWithData },
          pilots,
        );
      }
    });
    await Promise.all(workers);
    done += abilities.length;
    print(
      `  ${cohort.label}: ${abilities.length} answered (${((performance.now() - began) / 1000).toFixed(1)} s so far)`,
    );
  }
  const answeredAt = performance.now();
  const calibration = await calibrateStudy(db, studyId);
  print(
    `  calibrated ${calibration.items.length} items (${calibration.record.id}) in ${((performance.now() - answeredAt) / 1000).toFixed(1)} s`,
  );
  return { studyId, tryUrl };
}

/** The demo's text summary: the whole study, then the course's before/after comparison. */
export async function demoSummary(demo: RunningDemo): Promise<string> {
  const bank = demo.bank;
  const info = (id: string) => {
    const item = bank.byId.get(id);
    return item ? { chartType: item.chart.type, level: item.level } : undefined;
  };
  const whole = await buildReport(demo.db, info, demo.studyId);
  const cohorts = whole.audiences[0]!.cohorts;
  const before = cohorts.find((c) => c.label === 'Course, before');
  const after = cohorts.find((c) => c.label === 'Course, after');
  let text = reportToText(whole);
  const pilot = whole.pilots?.pilots[0];
  if (pilot?.state === 'calibrated') {
    text += `\nThe demo's pilot chart was simulated with an invented difficulty of ${demoPilotDifficulty} logits; the report estimates ${pilot.difficulty!.toFixed(2)} ± ${pilot.standardError!.toFixed(2)}.\n`;
  }
  const fair = await buildReport(demo.db, info, demo.studyId, {
    fairness: parseFairnessQuery(fairnessQuery),
  });
  const injected = injectedDifItems(
    demo.bank.items.filter((i) => i.status === 'active' && i.response.kind !== 'short-text').map((i) => i.id),
  );
  text += `\nFairness (${fairnessQuery}): ${fair.fairness!.sentence} Items given invented DIF: ${injected.join(', ')}.\n`;
  if (before && after) {
    const course = await buildReport(demo.db, info, demo.studyId, { compare: [before.id, after.id] });
    const cmp = course.comparison!;
    text += `\nThe course: ${cmp.to.label} vs ${cmp.from.label}, +${cmp.meanDifference.toFixed(2)} logits (d = ${cmp.effectSize.toFixed(2)}).\n`;
  }
  return text;
}
