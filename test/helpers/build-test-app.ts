import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.js';
import type { ItemBank } from '../../server/bank/load-bank.js';
import { loadConfig } from '../../server/config.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import type { TestDatabase } from './test-databases.js';

/**
 * The app exactly as production builds it, minus `listen`, on a test database migrated to latest.
 * Extra routes (for exercising the error handler) may be added before `app.ready()`.
 * `bank`: a small bank built by the test (test/helpers/test-bank.ts), or the real `items/` bank
 * (loadBank('items')); none for tests that deliver nothing. `env`: extra configuration
 * (e.g. ADMIN_TOKEN).
 */
export async function buildTestApp(
  database: TestDatabase,
  options: { migrate?: boolean; ready?: boolean; bank?: ItemBank; env?: Record<string, string> } = {},
): Promise<FastifyInstance> {
  if (options.migrate !== false) await migrateToLatest(database.db);
  const config = loadConfig(options.env ?? {}, { databaseUrl: database.url });
  const app = await buildApp({
    config,
    db: database.db,
    ...(options.bank === undefined ? {} : { bank: options.bank }),
  });
  if (options.ready !== false) await app.ready();
  return app;
}
