import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { secretsEqual } from '../../server/http/auth.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { admin, adminToken, ageBand, deliveryApp, storedState } from '../helpers/delivery-fixture.js';
import { loadTestBank } from '../helpers/test-bank.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: admin API`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let studyId: string;
    let cohortId: string;
    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database);
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    it('creates a study with defaults filled in, and records the change in the audit log', async () => {
      const reply = await request(app.server)
        .post('/api/admin/studies')
        .set(admin)
        .send({ title: 'Course, before', pool: { levels: ['read'] }, background: [ageBand] });
      expect(reply.status).toBe(201);
      studyId = reply.body.id;
      expect(reply.body).toMatchObject({
        title: 'Course, before',
        status: 'open',
        poolSize: 3,
        settings: { design: 'fixed', maxItems: 20, kiosk: false, idleSeconds: 90, endSummary: false },
      });
      const audit = await database.db.selectFrom('audit_log').selectAll().execute();
      expect(audit.map((a) => [a.actor, a.action, a.subject])).toEqual([
        ['admin-token', 'study.create', studyId],
      ]);
      expect(audit[0]!.details).not.toContain(adminToken);
    });

    it('adds a cohort with a join code and link, lists it, and serves its QR code', async () => {
      const reply = await request(app.server)
        .post(`/api/admin/studies/${studyId}/cohorts`)
        .set(admin)
        .send({ label: 'Saturday walk-ups' });
      expect(reply.status).toBe(201);
      cohortId = reply.body.id;
      expect(reply.body.joinCode).toMatch(/^[A-HJ-NP-Z]{4}-[2-9]{2}$/);
      expect(reply.body.joinUrl).toBe(`https://gauge.example.test/join/${reply.body.joinCode}`);
      const study = await request(app.server).get(`/api/admin/studies/${studyId}`).set(admin);
      expect(study.body.cohorts.map((c: { id: string }) => c.id)).toEqual([cohortId]);
      const list = await request(app.server).get('/api/admin/studies').set(admin);
      expect(list.body.map((s: { id: string }) => s.id)).toEqual([studyId]);
      const qr = await request(app.server)
        .get(`/api/admin/studies/${studyId}/cohorts/${cohortId}/qr.svg`)
        .set(admin);
      expect(qr.status).toBe(200);
      expect(qr.headers['content-type']).toMatch(/^image\/svg\+xml/);
      expect(String(qr.body ?? qr.text)).toContain('<svg');
    });

    it('changes title and status; a closed study refuses joins', async () => {
      const reply = await request(app.server)
        .patch(`/api/admin/studies/${studyId}`)
        .set(admin)
        .send({ title: 'Course, after', status: 'closed' });
      expect(reply.status).toBe(200);
      expect(reply.body).toMatchObject({ title: 'Course, after', status: 'closed' });
      expect(reply.body.settings.title).toBe('Course, after');
      const actions = await database.db.selectFrom('audit_log').select('action').orderBy('at').execute();
      expect(actions.map((a) => a.action)).toEqual(['study.create', 'cohort.create', 'study.update']);
      await request(app.server).patch(`/api/admin/studies/${studyId}`).set(admin).send({ status: 'open' });
    });

    it('exports CSV (empty study: header only)', async () => {
      const long = await request(app.server)
        .get(`/api/admin/studies/${studyId}/export?format=long`)
        .set(admin);
      expect(long.status).toBe(200);
      expect(long.text).toBe(
        'attempt_id,cohort_id,cohort_label,item_id,item_version,position,answer_kind,answer,score,server_ms,client_ms,received_at,bg_age-band\r\n',
      );
      const wide = await request(app.server)
        .get(`/api/admin/studies/${studyId}/export?format=wide&cohort=${cohortId}`)
        .set(admin);
      expect(wide.text).toBe('attempt_id,cohort_label\r\n');
    });

    const bad: [string, () => request.Test, number, string, RegExp?][] = [
      ['no token', () => request(app.server).get('/api/admin/studies'), 401, 'UNAUTHORIZED', /Bearer/],
      [
        'wrong token',
        () =>
          request(app.server).get('/api/admin/studies').set({ Authorization: 'Bearer nope-nope-nope-nope' }),
        401,
        'UNAUTHORIZED',
      ],
      [
        'respondent-style token',
        () =>
          request(app.server)
            .post('/api/admin/studies')
            .set({ Authorization: `Bearer ${adminToken}x` })
            .send({ title: 'x' }),
        401,
        'UNAUTHORIZED',
      ],
      [
        'empty title',
        () => request(app.server).post('/api/admin/studies').set(admin).send({ title: ' ' }),
        400,
        'VALIDATION_FAILED',
        /body\.title/,
      ],
      [
        'unknown chart type',
        () =>
          request(app.server)
            .post('/api/admin/studies')
            .set(admin)
            .send({ title: 'x', pool: { chartTypes: ['radar'] } }),
        400,
        'VALIDATION_FAILED',
        /body\.pool\.chartTypes/,
      ],
      [
        'pool selects nothing',
        () =>
          request(app.server)
            .post('/api/admin/studies')
            .set(admin)
            .send({ title: 'x', pool: { chartTypes: ['pie'] } }),
        400,
        'VALIDATION_FAILED',
        /body\.pool: selects no active item/,
      ],
      [
        'unknown item id',
        () =>
          request(app.server)
            .post('/api/admin/studies')
            .set(admin)
            .send({ title: 'x', pool: { itemIds: ['isle-nothing'] } }),
        400,
        'VALIDATION_FAILED',
        /isle-nothing/,
      ],
      [
        'prefer-not-to-say listed by the author',
        () =>
          request(app.server)
            .post('/api/admin/studies')
            .set(admin)
            .send({
              title: 'x',
              background: [
                { ...ageBand, options: [...ageBand.options, { id: 'prefer-not-to-say', text: 'No' }] },
              ],
            }),
        400,
        'VALIDATION_FAILED',
        /added by the server/,
      ],
      [
        'rotated with one item per booklet',
        () =>
          request(app.server)
            .post('/api/admin/studies')
            .set(admin)
            .send({ title: 'x', design: 'rotated', maxItems: 1 }),
        400,
        'VALIDATION_FAILED',
        /body\.maxItems/,
      ],
      [
        'unknown study',
        () => request(app.server).get('/api/admin/studies/nope').set(admin),
        404,
        'STUDY_NOT_FOUND',
      ],
      [
        'patch with nothing',
        () => request(app.server).patch(`/api/admin/studies/${studyId}`).set(admin).send({}),
        400,
        'VALIDATION_FAILED',
      ],
      [
        'patch unknown study',
        () => request(app.server).patch('/api/admin/studies/nope').set(admin).send({ status: 'closed' }),
        404,
        'STUDY_NOT_FOUND',
      ],
      [
        'cohort for unknown study',
        () => request(app.server).post('/api/admin/studies/nope/cohorts').set(admin).send({ label: 'A' }),
        404,
        'STUDY_NOT_FOUND',
      ],
      [
        'cohort without label',
        () => request(app.server).post(`/api/admin/studies/${studyId}/cohorts`).set(admin).send({}),
        400,
        'VALIDATION_FAILED',
        /body\.label/,
      ],
      [
        'QR of unknown cohort',
        () => request(app.server).get(`/api/admin/studies/${studyId}/cohorts/nope/qr.svg`).set(admin),
        404,
        'COHORT_NOT_FOUND',
      ],
      [
        'export in an unknown format',
        () => request(app.server).get(`/api/admin/studies/${studyId}/export?format=xlsx`).set(admin),
        400,
        'VALIDATION_FAILED',
        /format/,
      ],
      [
        'export of an unknown cohort',
        () => request(app.server).get(`/api/admin/studies/${studyId}/export?cohort=nope`).set(admin),
        404,
        'COHORT_NOT_FOUND',
      ],
      [
        'body too large',
        () =>
          request(app.server)
            .post('/api/admin/studies')
            .set(admin)
            .send({ title: 'x', consentText: 'y'.repeat(70_000) }),
        413,
        'BODY_TOO_LARGE',
      ],
    ];
    it.each(bad)('%s → %i %s, nothing stored changes', async (_name, send, status, code, message) => {
      const before = await storedState(database);
      const reply = await send();
      expect(reply.status).toBe(status);
      expect(reply.body.error.code).toBe(code);
      if (message) expect(reply.body.error.message).toMatch(message);
      expect(await storedState(database)).toEqual(before);
    });
  });
}

describe('admin API without ADMIN_TOKEN', () => {
  it('answers 401 saying to set ADMIN_TOKEN', async () => {
    const [sqlite] = testEngines();
    const database = await sqlite!.open();
    const app = await buildTestApp(database, { bank: await loadTestBank() });
    const reply = await request(app.server).get('/api/admin/studies').set(admin);
    expect(reply.status).toBe(401);
    expect(reply.body.error.message).toMatch(/set ADMIN_TOKEN/);
    await app.close();
    await database.cleanup();
  });

  it('compares secrets by digest, whatever their lengths', () => {
    expect(secretsEqual('abc', 'abc')).toBe(true);
    expect(secretsEqual('abc', 'abcd')).toBe(false);
    expect(secretsEqual('', 'abc')).toBe(false);
  });
});
