import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pilotImageMaxBytes } from '../../server/delivery/pilots/check-pilot-image.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { admin, adminToken, bearer, studyWithCohort } from '../helpers/delivery-fixture.js';
import { loadTestBank } from '../helpers/test-bank.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const b64 = (text: string) => Buffer.from(text, 'utf8').toString('base64');
const drawing =
  '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 120 60" onload="alert(1)"><script>alert(2)</script>' +
  '<rect x="10" y="10" width="40" height="40" fill="#2a6f97"/><text x="60" y="30">Harbour crates</text></svg>';
const pilotBody = (overrides: Record<string, unknown> = {}) => ({
  prompt: 'Which pier unloaded the most crates?',
  alt: 'Bar chart of crates unloaded at two invented piers.',
  options: [
    { id: 'north', text: 'North pier' },
    { id: 'south', text: 'South pier' },
  ],
  key: 'north',
  image: { type: 'image/svg+xml', base64: b64(drawing) },
  ...overrides,
});

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: pilot routes`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let study: { studyId: string; cohortId: string; joinCode: string };
    beforeAll(async () => {
      database = await engine.open();
      app = await buildTestApp(database, {
        bank: await loadTestBank(),
        env: { ADMIN_TOKEN: adminToken, PUBLIC_URL: 'https://gauge.example.test' },
      });
      study = await studyWithCohort(app);
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    it('adds an SVG pilot with the script stripped and serves it with a restrictive type and CSP', async () => {
      const added = await request(app.server)
        .post(`/api/admin/studies/${study.studyId}/pilots`)
        .set(admin)
        .send(pilotBody());
      expect(added.status).toBe(201);
      expect(added.body).toMatchObject({
        mediaType: 'image/svg+xml',
        key: 'north',
        minResponses: 100,
        sanitized: true,
      });
      const image = await request(app.server)
        .get(`/api/admin/studies/${study.studyId}/pilots/${added.body.id}/image`)
        .set(admin)
        .buffer(true)
        .parse((res, done) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => done(null, Buffer.concat(chunks)));
        });
      expect(image.status).toBe(200);
      expect(image.headers['content-type']).toMatch(/^image\/svg\+xml/);
      expect(image.headers['content-security-policy']).toBe("default-src 'none'; style-src 'unsafe-inline'");
      expect(image.headers['x-content-type-options']).toBe('nosniff');
      const text = (image.body as Buffer).toString('utf8');
      expect(text).toContain('Harbour crates');
      expect(text).not.toMatch(/script|onload|alert/i);

      // A respondent of the study gets it with the attempt token; without one, 401.
      const joined = await request(app.server).post('/api/join').send({ code: study.joinCode });
      const own = await request(app.server)
        .get(`/api/attempt/pilots/${added.body.id}/image`)
        .set(bearer(joined.body.token));
      expect(own.status).toBe(200);
      expect(own.headers['content-security-policy']).toBe("default-src 'none'; style-src 'unsafe-inline'");
      expect((await request(app.server).get(`/api/attempt/pilots/${added.body.id}/image`)).status).toBe(401);

      const list = await request(app.server).get(`/api/admin/studies/${study.studyId}/pilots`).set(admin);
      expect(list.body.map((p: { id: string }) => p.id)).toEqual([added.body.id]);
    });

    it('a PNG is served as image/png', async () => {
      const png = Buffer.from([
        137, 80, 78, 71, 13, 10, 26, 10, 0, 0, 0, 13, 73, 72, 68, 82, 0, 0, 0, 1, 0, 0, 0, 1, 8, 6, 0, 0, 0,
      ]);
      const added = await request(app.server)
        .post(`/api/admin/studies/${study.studyId}/pilots`)
        .set(admin)
        .send(pilotBody({ image: { type: 'image/png', base64: png.toString('base64') }, minResponses: 60 }));
      expect(added.status).toBe(201);
      const image = await request(app.server)
        .get(`/api/admin/studies/${study.studyId}/pilots/${added.body.id}/image`)
        .set(admin);
      expect(image.headers['content-type']).toBe('image/png');
      expect(image.headers['x-content-type-options']).toBe('nosniff');
    });

    it('bad input: no key, key not an option, not SVG/PNG, malformed, too large, no token → clear 4xx', async () => {
      const post = (body: unknown) =>
        request(app.server)
          .post(`/api/admin/studies/${study.studyId}/pilots`)
          .set(admin)
          .send(body as object);
      const { key: _key, ...noKey } = pilotBody();
      const missingKey = await post(noKey);
      expect(missingKey.status).toBe(400);
      expect(JSON.stringify(missingKey.body.error)).toContain('key');
      expect((await post(pilotBody({ key: 'east' }))).body.error.code).toBe('VALIDATION_FAILED');
      expect(
        (await post(pilotBody({ image: { type: 'image/gif', base64: 'R0lGODlhAQABAAAAACw=' } }))).status,
      ).toBe(415);
      const malformed = await post(
        pilotBody({ image: { type: 'image/svg+xml', base64: b64('<svg><g></svg>') } }),
      );
      expect(malformed.status).toBe(400);
      expect(malformed.body.error.message).toMatch(/well-formed/);
      const notPng = await post(pilotBody({ image: { type: 'image/png', base64: b64(drawing) } }));
      expect(notPng.status).toBe(400);
      const big = await post(
        pilotBody({
          image: { type: 'image/svg+xml', base64: b64(`<svg>${'x'.repeat(pilotImageMaxBytes + 10)}</svg>`) },
        }),
      );
      expect(big.status).toBe(413);
      expect(big.body.error.code).toBe('BODY_TOO_LARGE');
      expect(
        (await request(app.server).post(`/api/admin/studies/${study.studyId}/pilots`).send(pilotBody()))
          .status,
      ).toBe(401);
      expect(
        (
          await request(app.server)
            .post('/api/admin/studies/no-such-study/pilots')
            .set(admin)
            .send(pilotBody())
        ).status,
      ).toBe(404);
      expect(
        (await request(app.server).get(`/api/admin/studies/${study.studyId}/pilots/nope/image`).set(admin))
          .body.error.code,
      ).toBe('PILOT_NOT_FOUND');
    });
  });
}
