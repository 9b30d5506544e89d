import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createAccessToken } from '../../server/storage/token-repository.js';
import { csrfOf, signInToConsole } from '../helpers/console-session.js';
import {
  adminToken,
  bearer,
  correctAnswers,
  deliveryApp,
  joinAndConsent,
  storedState,
} from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** A urlencoded body; arrays become repeated fields (checkboxes). */
function form(fields: Record<string, string | string[]>): string {
  const params = new URLSearchParams();
  for (const [name, value] of Object.entries(fields)) {
    for (const v of Array.isArray(value) ? value : [value]) params.append(name, v);
  }
  return params.toString();
}

const validStudy = {
  title: 'Lumen Hall, spring visitors',
  chartTypes: ['bar'],
  levels: ['read', 'interpret'],
  design: 'rotated',
  maxItems: '2',
  timeLimitSeconds: '',
  consentText: 'A short activity about charts at Lumen Hall. No names are stored. Stop whenever you like.',
  background:
    'visits: How often do you visit Lumen Hall?\n- first: This is my first visit\n- often: I come often',
  kiosk: 'on',
  idleSeconds: '60',
  seTarget: '0.45',
  minItems: '5',
};

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: console routes`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let adminCookie: string;
    let analystCookie: string;
    let analystToken: string;
    let csrf: string;
    let studyId: string;
    let cohortId: string;
    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database);
      analystToken = (await createAccessToken(database.db, 'analyst', 'report reader')).token;
      adminCookie = await signInToConsole(app, adminToken);
      analystCookie = await signInToConsole(app, analystToken);
      const page = await request(app.server).get('/console/studies/new').set('Cookie', adminCookie);
      csrf = csrfOf(page.text);
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    const post = (url: string, cookie: string, fields: Record<string, string | string[]>) =>
      request(app.server).post(url).set('Cookie', cookie).type('form').send(form(fields));

    it('sends a signed-out browser to the sign-in page, for pages and for form posts', async () => {
      const page = await request(app.server).get('/console');
      expect(page.status).toBe(303);
      expect(page.headers.location).toBe(`/sign-in?next=${encodeURIComponent('/console')}`);
      const posted = await request(app.server)
        .post('/console/studies/new')
        .type('form')
        .send(form(validStudy));
      expect(posted.status).toBe(303);
      expect(posted.headers.location).toBe(`/sign-in?next=${encodeURIComponent('/console/studies/new')}`);
      expect(await database.db.selectFrom('studies').selectAll().execute()).toEqual([]);
    });

    it('shows the study list with a New study button to an admin, and the shell with all sections', async () => {
      const page = await request(app.server).get('/console').set('Cookie', adminCookie);
      expect(page.status).toBe(200);
      expect(page.headers['content-type']).toMatch(/text\/html/);
      expect(page.text).toContain('<h1>Studies</h1>');
      expect(page.text).toContain('href="/console/studies/new"');
      for (const href of ['/console', '/console/bank', '/console/scoring'])
        expect(page.text).toContain(`href="${href}"`);
      expect(page.text).toMatch(/<form method="post" action="\/sign-out"[\s\S]*name="csrf" value="[^"]+"/);
      expect(page.text).toContain('admin-token (admin)');
    });

    it('refuses a form post without the CSRF token, or from another origin, and stores nothing', async () => {
      const before = await storedState(database);
      const none = await post('/console/studies/new', adminCookie, validStudy);
      expect(none.status).toBe(403);
      expect(none.body.error.code).toBe('FORBIDDEN');
      const wrong = await post('/console/studies/new', adminCookie, { ...validStudy, csrf: `${csrf}x` });
      expect(wrong.status).toBe(403);
      const foreign = await request(app.server)
        .post('/console/studies/new')
        .set('Cookie', adminCookie)
        .set('Origin', 'https://elsewhere.example')
        .type('form')
        .send(form({ ...validStudy, csrf }));
      expect(foreign.status).toBe(403);
      // The analyst's token is not the admin's: a token from one session does not open another.
      const analystPage = await request(app.server).get('/console').set('Cookie', analystCookie);
      expect(csrfOf(analystPage.text)).not.toBe(csrf);
      expect(await storedState(database)).toEqual(before);
    });

    it('refuses a change to the JSON API made with the console cookie unless it carries the CSRF header', async () => {
      const before = await storedState(database);
      const send = (headers: Record<string, string>) =>
        request(app.server)
          .post('/api/admin/studies')
          .set('Cookie', adminCookie)
          .set(headers)
          .send({ title: 'Forged through the cookie' });
      expect((await send({})).status).toBe(403);
      // A form-encoded body (what another site's form can send) is refused just the same, before parsing.
      const form = await request(app.server)
        .post(`/api/admin/studies/nope/calibrations`)
        .set('Cookie', adminCookie)
        .type('form')
        .send('x=1');
      expect(form.status).toBe(403);
      expect((await send({ 'x-csrf-token': csrf, Origin: 'https://elsewhere.example' })).status).toBe(403);
      expect(await storedState(database)).toEqual(before);
      // The session's own header passes (a script of this server could send it), and so does a bearer token.
      const allowed = await send({ 'x-csrf-token': csrf });
      expect(allowed.status).toBe(201);
      await request(app.server).get('/api/admin/studies').set('Cookie', adminCookie).expect(200);
      await database.db.deleteFrom('audit_log').execute();
      await database.db.deleteFrom('studies').where('id', '=', allowed.body.id).execute();
    });

    it('shows an invalid form again with each field marked and the values kept, storing nothing', async () => {
      const before = await storedState(database);
      const reply = await post('/console/studies/new', adminCookie, {
        ...validStudy,
        csrf,
        title: 'Kept title <b>',
        maxItems: 'twelve',
        timeLimitSeconds: '10',
        background: 'visits: How often?\nthis line has no colon',
        chartTypes: ['bar', 'not-a-chart'],
      });
      expect(reply.status).toBe(400);
      expect(reply.text).toContain('value="Kept title &lt;b&gt;"');
      for (const field of ['maxItems', 'timeLimitSeconds', 'background']) {
        expect(reply.text).toMatch(
          new RegExp(`id="${field}"[^>]*aria-invalid="true"[^>]*aria-describedby="[^"]*${field}-error`),
        );
        expect(reply.text).toContain(`id="${field}-error"`);
      }
      expect(reply.text).toContain('must be a whole number');
      expect(reply.text).toContain('line 2: write');
      expect(reply.text).toMatch(/id="pool"[^>]*aria-invalid="true"/);
      expect(reply.text).toContain('value="bar" checked');
      expect(reply.text).toContain('data-has-problems="true"');
      expect(await storedState(database)).toEqual(before);
    });

    it('creates a study from the form with the shared schema, and audits it as the signed-in token', async () => {
      const reply = await post('/console/studies/new', adminCookie, { ...validStudy, csrf });
      expect(reply.status).toBe(303);
      const match = /^\/console\/studies\/([^?]+)\?notice=created$/.exec(String(reply.headers.location));
      expect(match).not.toBeNull();
      studyId = decodeURIComponent(match![1]!);
      const row = await database.db
        .selectFrom('studies')
        .selectAll()
        .where('id', '=', studyId)
        .executeTakeFirstOrThrow();
      const settings = JSON.parse(row.settings);
      expect(settings).toMatchObject({
        title: 'Lumen Hall, spring visitors',
        pool: { chartTypes: ['bar'], levels: ['read', 'interpret'] },
        design: 'rotated',
        maxItems: 2,
        kiosk: true,
        idleSeconds: 60,
        endSummary: false,
        background: [
          {
            id: 'visits',
            prompt: 'How often do you visit Lumen Hall?',
            options: [
              { id: 'first', text: 'This is my first visit' },
              { id: 'often', text: 'I come often' },
            ],
          },
        ],
      });
      expect(settings.timeLimitSeconds).toBeUndefined();
      expect(settings.adaptive).toBeUndefined();
      const audit = await database.db.selectFrom('audit_log').selectAll().execute();
      expect(audit.map((a) => [a.actor, a.action])).toEqual([['admin-token', 'study.create']]);
      const page = await request(app.server).get(String(reply.headers.location)).set('Cookie', adminCookie);
      expect(page.text).toContain('Study created.');
      expect(page.text).toContain('data-forget="new-study"');
      // The form shows the stored background questions in their text format.
      expect(page.text).toContain(
        'visits: How often do you visit Lumen Hall?\n- first: This is my first visit',
      );
    });

    it('refuses an adaptive design before a calibration, next to the design field', async () => {
      const before = await storedState(database);
      const reply = await post(`/console/studies/${studyId}`, adminCookie, {
        ...validStudy,
        csrf,
        design: 'adaptive',
        status: 'open',
      });
      expect(reply.status).toBe(409);
      expect(reply.text).toMatch(/id="design"[^>]*aria-invalid="true"/);
      expect(reply.text).toContain('id="design-error"');
      expect(reply.text).toContain('value="adaptive" checked');
      expect(await storedState(database)).toEqual(before);
    });

    it('saves edited settings and the status, keeping what the form does not edit', async () => {
      const reply = await post(`/console/studies/${studyId}`, adminCookie, {
        ...validStudy,
        csrf,
        title: 'Lumen Hall, spring visitors (v2)',
        levels: ['read'],
        design: 'fixed',
        maxItems: '3',
        timeLimitSeconds: '600',
        kiosk: [],
        status: 'closed',
      });
      expect(reply.status).toBe(303);
      expect(reply.headers.location).toBe(`/console/studies/${studyId}?notice=saved`);
      const row = await database.db
        .selectFrom('studies')
        .selectAll()
        .where('id', '=', studyId)
        .executeTakeFirstOrThrow();
      expect(row.status).toBe('closed');
      expect(row.title).toBe('Lumen Hall, spring visitors (v2)');
      expect(JSON.parse(row.settings)).toMatchObject({
        pool: { chartTypes: ['bar'], levels: ['read'] },
        design: 'fixed',
        maxItems: 3,
        timeLimitSeconds: 600,
        kiosk: false,
      });
      // Open again for the attempts below.
      await post(`/console/studies/${studyId}`, adminCookie, {
        ...validStudy,
        csrf,
        design: 'fixed',
        maxItems: '3',
        status: 'open',
      });
    });

    it('adds cohorts; an empty label is marked; each cohort shows join code, link, QR code and sign link', async () => {
      const before = await storedState(database);
      const empty = await post(`/console/studies/${studyId}/cohorts`, adminCookie, { csrf, label: '   ' });
      expect(empty.status).toBe(400);
      expect(empty.text).toMatch(/id="label"[^>]*aria-invalid="true" aria-describedby="label-error"/);
      expect(await storedState(database)).toEqual(before);
      for (const label of ['Saturday visitors', 'School groups']) {
        const added = await post(`/console/studies/${studyId}/cohorts`, adminCookie, { csrf, label });
        expect(added.status).toBe(303);
      }
      const cohorts = await database.db
        .selectFrom('cohorts')
        .selectAll()
        .orderBy('created_at')
        .orderBy('id')
        .execute();
      expect(cohorts).toHaveLength(2);
      cohortId = cohorts.find((c) => c.label === 'Saturday visitors')!.id;
      const page = await request(app.server).get(`/console/studies/${studyId}`).set('Cookie', adminCookie);
      for (const c of cohorts) {
        expect(page.text).toContain(c.join_code);
        expect(page.text).toContain(`href="https://gauge.example.test/join/${c.join_code}"`);
        expect(page.text).toContain(`/console/studies/${studyId}/cohorts/${c.id}/sign`);
        expect(page.text).toContain(`/studies/${studyId}/report?cohort=${c.id}`);
      }
      expect(page.text.match(/<svg role="img" aria-label="QR code of the join link/g)).toHaveLength(2);
      expect(page.text).toContain(`action="/console/studies/${studyId}/compare"`);
    });

    it('prints a kiosk sign with the join code, the QR code and the first sentence of the consent text', async () => {
      const page = await request(app.server)
        .get(`/console/studies/${studyId}/cohorts/${cohortId}/sign`)
        .set('Cookie', analystCookie);
      expect(page.status).toBe(200);
      const code = (
        await database.db
          .selectFrom('cohorts')
          .select('join_code')
          .where('id', '=', cohortId)
          .executeTakeFirstOrThrow()
      ).join_code;
      expect(page.text).toContain(`<p class="sign-code">${code}</p>`);
      expect(page.text).toContain('<p class="sign-consent">A short activity about charts at Lumen Hall.</p>');
      expect(page.text).toMatch(/<div class="sign-qr"><svg role="img"/);
      const other = await request(app.server)
        .get(`/console/studies/${studyId}/cohorts/nope/sign`)
        .set('Cookie', analystCookie);
      expect(other.status).toBe(404);
      expect(other.headers['content-type']).toMatch(/text\/html/);
      expect(other.text).toContain('<h1>Not found</h1>');
      expect(other.text).toContain('No cohort nope in this study.');
      // The JSON a script polls stays JSON.
      const json = await request(app.server)
        .get('/console/studies/nope/progress.json')
        .set('Cookie', analystCookie);
      expect(json.status).toBe(404);
      expect(json.body.error.code).toBe('STUDY_NOT_FOUND');
    });

    it('opens a comparison in the report, and refuses the same cohort twice', async () => {
      const cohorts = await database.db
        .selectFrom('cohorts')
        .select('id')
        .orderBy('created_at')
        .orderBy('id')
        .execute();
      const [a, b] = cohorts.map((c) => c.id);
      const reply = await request(app.server)
        .get(`/console/studies/${studyId}/compare?from=${a}&to=${b}`)
        .set('Cookie', analystCookie);
      expect(reply.status).toBe(303);
      expect(reply.headers.location).toBe(`/studies/${studyId}/report?compare=${a},${b}`);
      const same = await request(app.server)
        .get(`/console/studies/${studyId}/compare?from=${a}&to=${a}`)
        .set('Cookie', analystCookie);
      expect(same.status).toBe(400);
      expect(same.body.error.message).toMatch(/^query\.to:/);
    });

    it('gives an analyst the study and progress without forms, and refuses an analyst post with 403', async () => {
      const list = await request(app.server).get('/console').set('Cookie', analystCookie);
      expect(list.status).toBe(200);
      expect(list.text).not.toContain('/console/studies/new');
      const page = await request(app.server).get(`/console/studies/${studyId}`).set('Cookie', analystCookie);
      expect(page.status).toBe(200);
      expect(page.text).not.toMatch(/<form method="post" action="\/console/);
      expect(page.text).toContain('Only an admin can change these settings.');
      const before = await storedState(database);
      const analystCsrf = csrfOf(page.text);
      const refused = await post(`/console/studies/${studyId}/cohorts`, analystCookie, {
        csrf: analystCsrf,
        label: 'X',
      });
      expect(refused.status).toBe(403);
      const refusedEdit = await post(`/console/studies/${studyId}`, analystCookie, {
        ...validStudy,
        csrf: analystCsrf,
      });
      expect(refusedEdit.status).toBe(403);
      expect(await storedState(database)).toEqual(before);
    });

    it('counts the items a pool selects, and names a bad filter', async () => {
      const count = (query: string) =>
        request(app.server).get(`/console/item-count?${query}`).set('Cookie', analystCookie);
      // The test bank: 5 bar-chart items, 3 of them read, 4 in scenario isle.
      expect((await count('')).body).toEqual({ count: 5, sentence: '5 items match these filters.' });
      expect((await count('levels=read')).body.count).toBe(3);
      expect((await count('levels=read&levels=interpret&scenarios=town')).body.count).toBe(1);
      expect((await count('chartTypes=pie')).body).toEqual({
        count: 0,
        sentence: 'No item matches these filters: widen them.',
      });
      // A study listing item ids: the filters narrow its list.
      const listed = await request(app.server)
        .post('/api/admin/studies')
        .set(bearer(adminToken))
        .send({ title: 'Listed', pool: { itemIds: ['isle-ferry-busiest-day', 'isle-ferry-quiet-days'] } });
      expect((await count(`study=${listed.body.id}`)).body.count).toBe(2);
      expect((await count(`study=${listed.body.id}&levels=read`)).body.count).toBe(1);
      expect((await count('study=nope')).status).toBe(404);
      await database.db.deleteFrom('audit_log').where('subject', '=', listed.body.id).execute();
      await database.db.deleteFrom('studies').where('id', '=', listed.body.id).execute();
      // An item the team retired since (item_status_changes) no longer counts, as delivery leaves it out.
      await database.db
        .insertInto('item_status_changes')
        .values({
          id: 'retire-1',
          item_id: 'town-ferry-quietest-day',
          item_version: 1,
          change_number: 1,
          status: 'retired',
          reason: 'test',
          actor: 'admin-token',
          changed_at: '2031-05-04T10:00:00.000Z',
        })
        .execute();
      expect((await count('levels=read')).body.count).toBe(2);
      await database.db.deleteFrom('item_status_changes').execute();
      const bad = await count('levels=read&levels=skim');
      expect(bad.status).toBe(400);
      expect(bad.body.error.message).toMatch(/^query\.levels\.1:/);
      expect((await request(app.server).get('/console/item-count')).status).toBe(401);
    });

    it('reports live progress per cohort, with median time and pilot counts, as a page and as JSON', async () => {
      const code = (
        await database.db
          .selectFrom('cohorts')
          .select('join_code')
          .where('id', '=', cohortId)
          .executeTakeFirstOrThrow()
      ).join_code;
      // One finished attempt (3 items), one that answered one item, one that left.
      const finished = await joinAndConsent(app, code);
      for (let i = 0; i < 3; i++) {
        const state = await request(app.server).get('/api/attempt').set(bearer(finished));
        const itemId = state.body.item.itemId as string;
        await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(finished))
          .send({ itemId, answer: correctAnswers[itemId] });
      }
      const partial = await joinAndConsent(app, code);
      const state = await request(app.server).get('/api/attempt').set(bearer(partial));
      await request(app.server)
        .post('/api/attempt/responses')
        .set(bearer(partial))
        .send({ itemId: state.body.item.itemId, answer: correctAnswers[state.body.item.itemId] });
      const left = await joinAndConsent(app, code);
      await request(app.server).post('/api/attempt/leave').set(bearer(left)).send({});

      const json = await request(app.server)
        .get(`/console/studies/${studyId}/progress.json`)
        .set('Cookie', analystCookie);
      expect(json.status).toBe(200);
      const p = json.body.progress;
      expect(p.totals).toEqual({ started: 3, inProgress: 1, finished: 1, abandoned: 1 });
      expect(p.cohorts.map((c: { label: string; started: number }) => [c.label, c.started])).toEqual([
        ['Saturday visitors', 3],
        ['School groups', 0],
      ]);
      expect(p.attemptsWithAnswers).toBe(2);
      const answered = p.items.filter((i: { answers: number }) => i.answers > 0);
      expect(answered.reduce((n: number, i: { answers: number }) => n + i.answers, 0)).toBe(4);
      for (const item of answered) expect(item.medianSeconds).not.toBeNull();
      expect(p.exposure.applies).toBe(false);
      expect(json.body.html).toContain('<table id="attempts-table">');
      const page = await request(app.server)
        .get(`/console/studies/${studyId}/progress`)
        .set('Cookie', analystCookie);
      expect(page.status).toBe(200);
      expect(page.text).toContain(`data-url="/console/studies/${studyId}/progress.json"`);
      expect(page.text).toContain('<th scope="row">Saturday visitors</th><td class="number">3</td>');
    });

    it('serves the console assets, and nothing else from the folder', async () => {
      const css = await request(app.server).get('/console-assets/console.css');
      expect(css.status).toBe(200);
      expect(css.headers['content-type']).toMatch(/text\/css/);
      const js = await request(app.server).get('/console-assets/console.js');
      expect(js.headers['content-type']).toMatch(/javascript/);
      expect((await request(app.server).get('/console-assets/respondent.js')).status).toBe(404);
      expect((await request(app.server).get('/console-assets/..%2Fconsole.css')).status).toBe(404);
    });
  });
}
