import type { RouteOptions } from 'fastify';
import Fastify from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appPlugin, serverOptions } from '../../server/app.js';
import { loadConfig } from '../../server/config.js';
import { createDatabase } from '../../server/storage/create-database.js';

/**
 * Every route declares a response schema: the schema is what keeps internal columns out of
 * answers and what the OpenAPI document is generated from.
 */
describe('route table', () => {
  const routes: RouteOptions[] = [];
  const url = 'sqlite::memory:';
  const db = createDatabase(url);
  let close: () => Promise<void>;
  beforeAll(async () => {
    const app = Fastify(serverOptions());
    app.addHook('onRoute', (route) => void routes.push(route));
    await app.register(appPlugin, { config: loadConfig({}, { databaseUrl: url }), db });
    await app.ready();
    close = async () => {
      await app.close();
      await db.destroy();
    };
  });
  afterAll(async () => close());

  it('has routes, and every JSON route declares a response schema', () => {
    expect(routes.length).toBeGreaterThan(0);
    const withoutSchema = routes
      .filter((route) => route.method !== 'HEAD' && !String(route.url).endsWith('.svg'))
      .filter((route) => route.schema?.response === undefined)
      .map((route) => `${String(route.method)} ${route.url}`);
    expect(withoutSchema).toEqual([]);
  });
});
