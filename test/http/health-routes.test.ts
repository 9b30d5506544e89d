import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.js';
import { loadConfig } from '../../server/config.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: /health and /ready`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    beforeAll(async () => {
      database = await engine.open();
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    it('/ready answers 503 MIGRATIONS_PENDING before migrating, naming the pending migrations', async () => {
      app = await buildTestApp(database, { migrate: false });
      const response = await request(app.server).get('/ready').expect(503);
      expect(response.body.error.code).toBe('MIGRATIONS_PENDING');
      expect(response.body.error.details.pending[0]).toMatch(/create-core-tables/);
      await app.close();
    });

    it('/health and /ready answer 200 once migrated', async () => {
      app = await buildTestApp(database);
      await request(app.server).get('/health').expect(200, { status: 'alive' });
      await request(app.server).get('/ready').expect(200, { status: 'ready', engine: engine.engine });
    });
  });
}

describe('/ready with an unreachable database', () => {
  it('answers 503 DATABASE_UNAVAILABLE, while /health still answers 200', async () => {
    // Port 1 on loopback: nothing listens there, so the connection is refused at once.
    const url = 'postgres://postgres@127.0.0.1:1/none';
    const db = createDatabase(url);
    const app = await buildApp({ config: loadConfig({}, { databaseUrl: url }), db });
    await app.ready();
    try {
      await request(app.server).get('/health').expect(200);
      const response = await request(app.server).get('/ready').expect(503);
      expect(response.body.error).toMatchObject({
        code: 'DATABASE_UNAVAILABLE',
        details: { reason: 'ECONNREFUSED' },
      });
    } finally {
      await app.close();
      await db.destroy();
    }
  });
});
