import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.js';
import { loadConfig } from '../../server/config.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import type { TestDatabase } from './test-databases.js';

/**
 * The app exactly as production builds it, minus `listen`, on a test database migrated to latest.
 * Extra routes (for exercising the error handler) may be added before `app.ready()`.
 */
export async function buildTestApp(
  database: TestDatabase,
  options: { migrate?: boolean; ready?: boolean } = {},
): Promise<FastifyInstance> {
  if (options.migrate !== false) await migrateToLatest(database.db);
  const config = loadConfig({}, { databaseUrl: database.url });
  const app = await buildApp({ config, db: database.db });
  if (options.ready !== false) await app.ready();
  return app;
}
