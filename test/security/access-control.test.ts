import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createAccessToken, hashToken, revokeAccessToken } from '../../server/storage/token-repository.js';
import {
  admin,
  adminToken,
  bearer,
  correctAnswers,
  deliveryApp,
  joinAndConsent,
  studyWithCohort,
} from '../helpers/delivery-fixture.js';
import { runCliCaptured } from '../helpers/run-cli.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const cli = runCliCaptured;

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: roles and team tokens`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let studyId: string;
    let joinCode: string;
    let analyst: string;
    let editor: string;
    let editorId: string;
    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database);
      ({ studyId, joinCode } = await studyWithCohort(app));
      analyst = (await createAccessToken(database.db, 'analyst', 'analysis laptop')).token;
      const made = await createAccessToken(database.db, 'admin', 'study desk');
      editor = made.token;
      editorId = made.summary.id;
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    it('stores only the SHA-256 of a token, never the token', async () => {
      const rows = await database.db.selectFrom('access_tokens').selectAll().execute();
      expect(rows).toHaveLength(2);
      for (const row of rows) {
        expect(JSON.stringify(row)).not.toContain(analyst);
        expect(JSON.stringify(row)).not.toContain(editor);
      }
      // SHA-256 of "abc" is FIPS 180-2, Appendix B.1: ba7816bf…f20015ad.
      expect(hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
      expect(rows.map((r) => r.token_hash).sort()).toEqual([hashToken(analyst), hashToken(editor)].sort());
    });

    it('lets an analyst read reports, exports, the study list and the gallery, and nothing else', async () => {
      await request(app.server).get('/api/admin/studies').set(bearer(analyst)).expect(200);
      await request(app.server).get('/bank').set(bearer(analyst)).expect(200);
      await request(app.server).get('/bank/isle-ferry-busiest-day.svg').set(bearer(analyst)).expect(200);
      await request(app.server).get(`/api/admin/studies/${studyId}/export`).set(bearer(analyst)).expect(200);
      const report = await request(app.server)
        .get(`/api/admin/studies/${studyId}/report`)
        .set(bearer(analyst));
      expect([200, 409]).toContain(report.status); // 409 TOO_FEW_RESPONSES: passed the access check
      expect(report.body.error?.code ?? 'none').not.toMatch(/UNAUTHORIZED|FORBIDDEN/);
      const create = await request(app.server)
        .post('/api/admin/studies')
        .set(bearer(analyst))
        .send({ title: 'Not allowed' });
      expect(create.status).toBe(403);
      expect(create.body.error.code).toBe('FORBIDDEN');
      const change = await request(app.server)
        .patch(`/api/admin/studies/${studyId}`)
        .set(bearer(analyst))
        .send({ status: 'closed' });
      expect(change.status).toBe(403);
    });

    it('records an admin change with the token label as actor, and notes the last use', async () => {
      const reply = await request(app.server)
        .post(`/api/admin/studies/${studyId}/cohorts`)
        .set(bearer(editor))
        .send({ label: 'Evening group' });
      expect(reply.status).toBe(201);
      const entry = await database.db
        .selectFrom('audit_log')
        .selectAll()
        .where('subject', '=', reply.body.id)
        .executeTakeFirstOrThrow();
      expect(entry.actor).toBe('study desk');
      const row = await database.db
        .selectFrom('access_tokens')
        .selectAll()
        .where('id', '=', editorId)
        .executeTakeFirstOrThrow();
      expect(row.last_used_at).not.toBeNull();
    });

    it('keeps ADMIN_TOKEN working as a bootstrap admin labelled admin-token', async () => {
      const reply = await request(app.server)
        .post(`/api/admin/studies/${studyId}/cohorts`)
        .set(admin)
        .send({ label: 'Bootstrap group' });
      expect(reply.status).toBe(201);
      const entry = await database.db
        .selectFrom('audit_log')
        .selectAll()
        .where('subject', '=', reply.body.id)
        .executeTakeFirstOrThrow();
      expect(entry.actor).toBe('admin-token');
    });

    it('signs a browser in with a team token; the cookie holds no token and dies with the token', async () => {
      const made = await createAccessToken(database.db, 'analyst', 'projector');
      const signIn = await request(app.server)
        .post('/sign-in')
        .type('form')
        .send({ token: made.token, next: `/studies/${studyId}/report` });
      expect(signIn.status).toBe(303);
      const cookie = String(signIn.headers['set-cookie']).split(';')[0] as string;
      expect(cookie).not.toContain(made.token);
      expect(cookie).not.toContain(hashToken(made.token));
      await request(app.server).get('/api/admin/studies').set('Cookie', cookie).expect(200);
      // An analyst's cookie does not open admin routes either.
      await request(app.server)
        .post('/api/admin/studies')
        .set('Cookie', cookie)
        .send({ title: 'x' })
        .expect(403);
      // A forged cookie naming the same id fails.
      const forged = cookie.replace(/\.[^.]+$/, `.${'A'.repeat(43)}`);
      await request(app.server).get('/api/admin/studies').set('Cookie', forged).expect(401);
      expect(await revokeAccessToken(database.db, made.summary.id)).toBe(true);
      await request(app.server).get('/api/admin/studies').set('Cookie', cookie).expect(401);
      await request(app.server).get('/api/admin/studies').set(bearer(made.token)).expect(401);
      const page = await request(app.server).get(`/studies/${studyId}/report`).set('Cookie', cookie);
      expect(page.status).toBe(303);
      expect(page.headers.location).toMatch(/^\/sign-in\?next=/);
    });

    it('signs in with ADMIN_TOKEN too, and refuses a wrong token', async () => {
      const ok = await request(app.server).post('/sign-in').type('form').send({ token: adminToken });
      expect(ok.status).toBe(303);
      expect(String(ok.headers['set-cookie'])).not.toContain(adminToken);
      const wrong = await request(app.server)
        .post('/sign-in')
        .type('form')
        .send({ token: `${adminToken}x` });
      expect(wrong.status).toBe(401);
    });

    it('lets a respondent token reach its own attempt only', async () => {
      const first = await joinAndConsent(app, joinCode);
      const second = await joinAndConsent(app, joinCode);
      const state = await request(app.server).get('/api/attempt').set(bearer(first)).expect(200);
      const itemId = state.body.item.itemId as string;
      await request(app.server)
        .post('/api/attempt/responses')
        .set(bearer(first))
        .send({ itemId, answer: correctAnswers[itemId] })
        .expect(201);
      const other = await request(app.server).get('/api/attempt').set(bearer(second)).expect(200);
      expect(other.body.progress.answered).toBe(0);
      const mine = await request(app.server).get('/api/attempt').set(bearer(first)).expect(200);
      expect(mine.body.progress.answered).toBe(1);
      // A respondent token opens no team route, and a team token is no respondent token.
      await request(app.server).get('/api/admin/studies').set(bearer(first)).expect(401);
      const asTeam = await request(app.server).get('/api/attempt').set(bearer(editor));
      expect(asTeam.status).toBe(401);
    });

    it.runIf(engine.engine === 'sqlite')(
      'creates, lists and revokes tokens from the command line',
      async () => {
        const created = await cli([
          'token',
          'create',
          '--role',
          'analyst',
          '--label',
          'night shift',
          '--database',
          database.url,
        ]);
        expect(created.code).toBe(0);
        const token = created.out.find((line) => line.startsWith('pgt_')) as string;
        expect(token).toMatch(/^pgt_[A-Za-z0-9_-]{43}$/);
        await request(app.server).get('/api/admin/studies').set(bearer(token)).expect(200);
        const listed = await cli(['token', 'list', '--database', database.url]);
        const line = listed.out.find((l) => l.includes('"night shift"')) as string;
        expect(line).toMatch(/analyst\s+active/);
        expect(listed.out.join('\n')).not.toContain(hashToken(token));
        const id = line.split(/\s+/)[0] as string;
        expect((await cli(['token', 'revoke', id, '--database', database.url])).code).toBe(0);
        await request(app.server).get('/api/admin/studies').set(bearer(token)).expect(401);
        expect((await cli(['token', 'revoke', id, '--database', database.url])).code).toBe(2);
        expect((await cli(['token', 'create', '--role', 'owner', '--database', database.url])).code).toBe(2);
      },
    );
  });
}
