import type { FastifyInstance } from 'fastify';
import type { BrowserContext, Page } from 'playwright-core';
import { buildApp } from '../../server/app.js';
import type { ItemBank } from '../../server/bank/load-bank.js';
import { loadConfig } from '../../server/config.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { type TestDatabase, testEngines } from './test-databases.js';

/** The app listening on a free local port, over its own migrated SQLite test database. */
export interface ListeningApp {
  app: FastifyInstance;
  database: TestDatabase;
  /** `http://127.0.0.1:<port>`, for a browser to open. */
  baseUrl: string;
  /** Stops the app and removes the database. */
  close(): Promise<void>;
}

/**
 * Opens a migrated SQLite test database, runs `prepare` on it (rows a test needs before the app
 * starts), then builds the app with `bank` (and the admin token, when given) and listens on a free
 * port of 127.0.0.1.
 */
export async function listenOnSqlite(options: {
  bank: ItemBank;
  adminToken?: string;
  prepare?: (database: TestDatabase) => Promise<void>;
}): Promise<ListeningApp> {
  const database = await testEngines()
    .find((engine) => engine.engine === 'sqlite')!
    .open();
  let app: FastifyInstance | undefined;
  try {
    await migrateToLatest(database.db);
    await options.prepare?.(database);
    const config = loadConfig(
      {},
      {
        databaseUrl: database.url,
        ...(options.adminToken === undefined ? {} : { adminToken: options.adminToken }),
      },
    );
    app = await buildApp({ config, db: database.db, bank: options.bank, logger: false });
    await app.listen({ port: 0, host: '127.0.0.1' });
    const address = app.server.address();
    if (address === null || typeof address === 'string') throw new Error('no TCP address');
    const listening = app;
    return {
      app: listening,
      database,
      baseUrl: `http://127.0.0.1:${address.port}`,
      async close() {
        await listening.close();
        await database.cleanup();
      },
    };
  } catch (error) {
    await app?.close();
    await database.cleanup();
    throw error;
  }
}

/**
 * Makes every page of `context` keep its own record of what the Content-Security-Policy blocked, as
 * `window.cspViolations` (the init script comes through the browser's devtools protocol, so the
 * policy does not apply to it). Read it with `cspViolationsOf`.
 */
export async function recordCspViolations(context: BrowserContext): Promise<void> {
  await context.addInitScript(`(() => {
      const record = [];
      Object.defineProperty(window, 'cspViolations', { value: record });
      document.addEventListener('securitypolicyviolation', (event) => {
        record.push(event.effectiveDirective + ' ' + event.blockedURI);
      });
    })()`);
}

/** What the Content-Security-Policy blocked on the page so far (see recordCspViolations). */
export function cspViolationsOf(page: Page): Promise<string[]> {
  return page.evaluate<string[]>('[...window.cspViolations]');
}
