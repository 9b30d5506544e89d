import type { FastifyInstance } from 'fastify';
import type { ZodTypeProvider } from 'fastify-type-provider-zod';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { defaultBodyLimit } from '../../server/app.js';
import { AppError } from '../../server/errors.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** Routes added only in this test, to exercise the one error handler through real requests (public: no token). */
function addProbeRoutes(app: FastifyInstance) {
  const typed = app.withTypeProvider<ZodTypeProvider>();
  typed.post(
    '/probe/:count',
    {
      config: { access: 'public' },
      schema: {
        params: z.object({ count: z.coerce.number().int().min(1) }),
        body: z.object({ title: z.string().min(1), size: z.number().max(10) }),
        response: { 200: z.object({ ok: z.boolean() }) },
      },
    },
    async () => ({ ok: true }),
  );
  typed.get('/probe-conflict', { config: { access: 'public' } }, async () => {
    throw new AppError('CONFLICT', 'That answer differs from the one already stored.', { item: 'x' });
  });
  typed.get('/probe-crash', { config: { access: 'public' } }, async () => {
    throw new Error('SELECT secret FROM table -- internal detail');
  });
  typed.get(
    '/probe-bad-output',
    { config: { access: 'public' }, schema: { response: { 200: z.object({ n: z.number() }) } } },
    async () => {
      return { n: 'not a number' } as unknown as { n: number };
    },
  );
}

const [sqlite] = testEngines();

describe('error handler: every failure is { error: { code, message, details } }', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  beforeAll(async () => {
    database = await sqlite!.open();
    app = await buildTestApp(database, { ready: false });
    addProbeRoutes(app);
    await app.ready();
  });
  afterAll(async () => {
    await app.close();
    await database.cleanup();
  });

  it('a body field of the wrong type: 400 VALIDATION_FAILED naming the field', async () => {
    const response = await request(app.server)
      .post('/probe/1')
      .send({ title: 'Ferries', size: 'big' })
      .expect(400);
    expect(response.body.error.code).toBe('VALIDATION_FAILED');
    expect(response.body.error.message).toMatch(/^body\.size: /);
    expect(response.body.error.details.problems).toEqual([
      { field: 'body.size', problem: expect.any(String) },
    ]);
  });

  it('a missing field and a bad path parameter are both named', async () => {
    const missing = await request(app.server).post('/probe/1').send({ size: 1 }).expect(400);
    expect(missing.body.error.details.problems[0].field).toBe('body.title');
    const param = await request(app.server).post('/probe/zero').send({ title: 'a', size: 1 }).expect(400);
    expect(param.body.error.message).toMatch(/^params\.count: /);
  });

  it('invalid JSON: 400 INVALID_JSON', async () => {
    const response = await request(app.server)
      .post('/probe/1')
      .set('content-type', 'application/json')
      .send('{"title": "Ferries",')
      .expect(400);
    expect(response.body.error.code).toBe('INVALID_JSON');
  });

  it('an empty JSON body: 400 EMPTY_BODY', async () => {
    const response = await request(app.server)
      .post('/probe/1')
      .set('content-type', 'application/json')
      .expect(400);
    expect(response.body.error.code).toBe('EMPTY_BODY');
  });

  it('a wrong content type: 415 UNSUPPORTED_MEDIA_TYPE', async () => {
    const response = await request(app.server)
      .post('/probe/1')
      .set('content-type', 'application/xml')
      .send('<title>Ferries</title>')
      .expect(415);
    expect(response.body.error.code).toBe('UNSUPPORTED_MEDIA_TYPE');
  });

  it('an oversized body: 413 BODY_TOO_LARGE', async () => {
    const response = await request(app.server)
      .post('/probe/1')
      .send({ title: 'x'.repeat(defaultBodyLimit + 1), size: 1 })
      .expect(413);
    expect(response.body.error.code).toBe('BODY_TOO_LARGE');
  });

  it('an unknown route: 404 NOT_FOUND naming method and path, without the query string', async () => {
    const response = await request(app.server).get('/no/such/place?code=SECRET').expect(404);
    expect(response.body).toEqual({
      error: { code: 'NOT_FOUND', message: 'No route GET /no/such/place.', details: {} },
    });
  });

  it('an AppError keeps its code, status, message and details', async () => {
    const response = await request(app.server).get('/probe-conflict').expect(409);
    expect(response.body).toEqual({
      error: {
        code: 'CONFLICT',
        message: 'That answer differs from the one already stored.',
        details: { item: 'x' },
      },
    });
  });

  it('an unexpected fault: 500 INTERNAL_ERROR without its message, stack or SQL', async () => {
    const response = await request(app.server).get('/probe-crash').expect(500);
    expect(response.body.error.code).toBe('INTERNAL_ERROR');
    expect(JSON.stringify(response.body)).not.toMatch(/SELECT|secret|at .*\.ts/);
  });

  it('a response that breaks its own schema is a 500, never sent half-checked', async () => {
    const response = await request(app.server).get('/probe-bad-output').expect(500);
    expect(response.body.error.code).toBe('INTERNAL_ERROR');
  });
});
