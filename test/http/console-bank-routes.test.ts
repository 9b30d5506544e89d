import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { calibrateStudy } from '../../server/reports/calibrate-study.js';
import { insertCalibration } from '../../server/storage/calibration-repository.js';
import { createAccessToken } from '../../server/storage/token-repository.js';
import { csrfOf, signInToConsole } from '../helpers/console-session.js';
import {
  adminToken,
  bearer,
  correctAnswers,
  deliveryApp,
  joinAndConsent,
  studyWithCohort,
} from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';
import { insertSimulatedStudy, normalDraws } from '../reports/simulated-study.js';

/** Item ids shown on a bank page, in order (each card's heading). */
function shownItems(page: string): string[] {
  return [...page.matchAll(/<h2 id="item-([^"]+)">/g)].map((m) => m[1]!);
}

const drawing =
  '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 120 60"><script>alert(1)</script>' +
  '<rect x="10" y="10" width="40" height="40" fill="#2a6f97"/><text x="60" y="30">Orchard crates</text></svg>';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: console bank pages`, () => {
    let database: TestDatabase;
    let app: FastifyInstance;
    let adminCookie: string;
    let analystCookie: string;
    let studyId: string;
    beforeAll(async () => {
      database = await engine.open();
      app = await deliveryApp(database);
      const analyst = (await createAccessToken(database.db, 'analyst', 'report reader')).token;
      adminCookie = await signInToConsole(app, adminToken);
      analystCookie = await signInToConsole(app, analyst);
      ({ studyId } = await studyWithCohort(app, { maxItems: 5 }));
    });
    afterAll(async () => {
      await app?.close();
      await database?.cleanup();
    });

    const pilots = () => database.db.selectFrom('pilot_items').selectAll().execute();

    it('sends a signed-out browser to the sign-in page', async () => {
      for (const url of [
        '/console/bank',
        '/console/bank/isle-ferry-busiest-day',
        `/console/studies/${studyId}/pilots/new`,
      ]) {
        const reply = await request(app.server).get(url);
        expect([url, reply.status, String(reply.headers.location).startsWith('/sign-in?next=')]).toEqual([
          url,
          303,
          true,
        ]);
      }
      // A signed-out form post goes to the sign-in page, which then returns to the form's page.
      const post = await request(app.server)
        .post('/console/bank/isle-ferry-busiest-day/retire')
        .type('form')
        .send({ reason: 'lost sign-in' });
      expect(post.status).toBe(303);
      const next = decodeURIComponent(String(post.headers.location).replace('/sign-in?next=', ''));
      expect(next).toBe('/console/bank/isle-ferry-busiest-day/retire');
      const back = await request(app.server).get(next).set('Cookie', adminCookie);
      expect([back.status, back.headers.location]).toEqual([303, '/console/bank/isle-ferry-busiest-day']);
      const pilotBack = await request(app.server)
        .get(`/console/studies/${studyId}/pilots`)
        .set('Cookie', adminCookie);
      expect([pilotBack.status, pilotBack.headers.location]).toEqual([
        303,
        `/console/studies/${studyId}/pilots/new`,
      ]);
    });

    it('shows every item as respondents see it, never the key or rationale, and filters without script', async () => {
      const page = await request(app.server).get('/console/bank').set('Cookie', analystCookie);
      expect(page.status).toBe(200);
      expect(page.headers['content-type']).toContain('text/html');
      expect(shownItems(page.text)).toEqual([
        'isle-ferry-busiest-day',
        'isle-ferry-monday-count',
        'isle-ferry-quiet-days',
        'isle-ferry-why-tuesday',
        'town-ferry-quietest-day',
      ]);
      expect(page.text).toContain('5 of 5 items shown');
      expect((page.text.match(/<svg /g) ?? []).length).toBe(5);
      expect(page.text).toContain('not calibrated yet');
      expect(page.text).toContain('not checked');
      expect(page.text).toContain('no attempts yet');
      // The team's key material stays in the gallery: no rationale, no option values.
      expect(page.text).not.toContain('The Monday bar reaches 120');
      expect(page.text).not.toContain('value="Tue"');
      expect(page.text).not.toMatch(/<script(?! type="module")/);

      const interpret = await request(app.server)
        .get('/console/bank?type=&level=interpret&scenario=&status=')
        .set('Cookie', analystCookie);
      expect(shownItems(interpret.text)).toEqual(['isle-ferry-quiet-days']);
      expect(interpret.text).toMatch(/<option value="interpret" selected>/);
      const town = await request(app.server).get('/console/bank?scenario=town').set('Cookie', analystCookie);
      expect(shownItems(town.text)).toEqual(['town-ferry-quietest-day']);
      const retired = await request(app.server)
        .get('/console/bank?status=retired')
        .set('Cookie', analystCookie);
      expect(shownItems(retired.text)).toEqual([]);
      expect(retired.text).toContain('No items match these filters.');

      const bad = await request(app.server).get('/console/bank?level=expert').set('Cookie', analystCookie);
      expect(bad.status).toBe(400);
      expect(bad.body.error.code).toBe('VALIDATION_FAILED');
      expect(bad.body.error.message).toContain('querystring.level');
      const unknownItem = await request(app.server)
        .get('/console/bank/no-such-item')
        .set('Cookie', analystCookie);
      expect([unknownItem.status, unknownItem.body.error.code]).toEqual([404, 'ITEM_NOT_FOUND']);
    });

    it('shows difficulty ± SE, flags unusual fit, and counts exposure', async () => {
      const { joinCode } = await studyWithCohort(app, { maxItems: 5 });
      const token = await joinAndConsent(app, joinCode);
      await joinAndConsent(app, joinCode); // a second attempt that answers nothing
      const answered = await request(app.server)
        .post('/api/attempt/responses')
        .set(bearer(token))
        .send({ itemId: 'isle-ferry-busiest-day', answer: correctAnswers['isle-ferry-busiest-day'] });
      expect(answered.status).toBe(201);
      const item = (itemId: string, difficulty: number, infit: number, outfit: number) => ({
        itemId,
        itemVersion: 1,
        difficulty,
        standardError: 0.183,
        infit,
        outfit,
        anchored: false,
      });
      await insertCalibration(
        database.db,
        {
          id: 'cal-bank-1',
          studyId,
          method: 'mml',
          settings: {},
          converged: true,
          iterations: 9,
          logLikelihood: -40,
          responseCount: 100,
          responsesUntil: null,
          createdAt: '2031-06-01T10:00:00.000Z',
        },
        [
          item('isle-ferry-busiest-day', 0.4243, 1.02, 0.97),
          item('isle-ferry-monday-count', -1.2, 1.45, 1.1),
        ],
      );
      const page = await request(app.server).get('/console/bank').set('Cookie', analystCookie);
      const card = (id: string) => {
        const start = page.text.indexOf(`<h2 id="item-${id}">`);
        return page.text.slice(start, page.text.indexOf('</article>', start));
      };
      expect(card('isle-ferry-busiest-day')).toContain('0.42 ± 0.18 logits');
      expect(card('isle-ferry-busiest-day')).toContain('infit 1.02, outfit 0.97');
      expect(card('isle-ferry-busiest-day')).not.toContain('outside 0.7 to 1.3');
      // Infit 1.45 is above 1.3: flagged (fitRange in server/reports/compose-report.ts).
      expect(card('isle-ferry-monday-count')).toContain('-1.20 ± 0.18 logits');
      expect(card('isle-ferry-monday-count')).toContain('outside 0.7 to 1.3');
      // One attempt with an answer (the other answered nothing and does not count): 1 / 1.
      expect(card('isle-ferry-busiest-day')).toContain('1 answer in 1 attempt (100%)');
      expect(card('isle-ferry-quiet-days')).toContain('0 answers in 1 attempt (0%)');
      expect(card('isle-ferry-quiet-days')).toContain('not calibrated yet');

      const one = await request(app.server)
        .get('/console/bank/isle-ferry-busiest-day')
        .set('Cookie', analystCookie);
      expect(one.status).toBe(200);
      expect(one.text).toContain('From calibration <code>cal-bank</code>');
      expect(one.text).toMatch(/<td>1<\/td><td><code>[0-9a-f]{12}<\/code><\/td>/);
      expect(one.text).toContain('The team has not retired or reinstated this item.');
    });

    it('shows the DIF class of the calibration the difficulty comes from, as the report computes it', {
      timeout: 60_000,
    }, async () => {
      const { studyId: simulated, cohortIds } = await insertSimulatedStudy(database.db, {
        items: [
          { id: 'isle-ferry-quiet-days', difficulty: -0.6 },
          { id: 'town-ferry-quietest-day', difficulty: 0.7 },
          { id: 'isle-ferry-monday-count', difficulty: 0 },
        ],
        seed: 7,
        cohorts: [
          { label: 'Harbour school', abilities: normalDraws(3, 150, 0, 1) },
          { label: 'Hill school', abilities: normalDraws(4, 150, 0.3, 1) },
        ],
      });
      const calibration = await calibrateStudy(database.db, simulated, { replicates: 2 });
      expect(calibration.record.converged).toBe(true);
      const report = await request(app.server)
        .get(`/api/admin/studies/${simulated}/report?fairness=cohorts:${cohortIds[0]},${cohortIds[1]}`)
        .set(bearer(adminToken));
      expect(report.status).toBe(200);
      const classes = new Map<string, string | null>(
        report.body.fairness.items.map((i: { itemId: string; etsClass: string | null }) => [
          i.itemId,
          i.etsClass,
        ]),
      );
      const page = await request(app.server).get('/console/bank').set('Cookie', analystCookie);
      const card = (id: string) => {
        const start = page.text.indexOf(`<h2 id="item-${id}">`);
        return page.text.slice(start, page.text.indexOf('</article>', start));
      };
      for (const id of ['isle-ferry-quiet-days', 'town-ferry-quietest-day']) {
        const etsClass = classes.get(id);
        expect(etsClass, id).toBeTypeOf('string');
        expect(card(id)).toContain(`class ${etsClass} (cohorts Harbour school vs Hill school)`);
      }
      // Monday's difficulty comes from the newer hand-made calibration, which has no cohorts: not checked.
      expect(card('isle-ferry-monday-count')).toContain('not checked');
    });

    it('adds a pilot chart from the multipart form, with the API’s checks', async () => {
      const form = await request(app.server)
        .get(`/console/studies/${studyId}/pilots/new`)
        .set('Cookie', adminCookie);
      expect(form.status).toBe(200);
      expect(form.text).toContain('enctype="multipart/form-data"');
      const csrf = csrfOf(form.text);
      const analystForm = await request(app.server)
        .get(`/console/studies/${studyId}/pilots/new`)
        .set('Cookie', analystCookie);
      expect(analystForm.status).toBe(403);

      const post = (fields: Record<string, string>, file?: { data: Buffer; name: string; type: string }) => {
        let r = request(app.server).post(`/console/studies/${studyId}/pilots`).set('Cookie', adminCookie);
        for (const [name, value] of Object.entries(fields)) r = r.field(name, value);
        if (file) r = r.attach('image', file.data, { filename: file.name, contentType: file.type });
        return r;
      };
      const good = {
        csrf,
        prompt: 'Which crate holds the most apples?',
        alt: 'A bar chart of apple crates by orchard row.',
        'option-a': 'Row one',
        'option-b': 'Row two',
        'option-c': '',
        key: 'b',
        'min-responses': '60',
      };
      const svg = { data: Buffer.from(drawing), name: 'crates.svg', type: 'image/svg+xml' };

      // Problems are listed and linked to their fields; the form comes back filled in; nothing is stored.
      const missing = await post(
        { ...good, 'option-b': '', key: 'b', prompt: '', 'min-responses': 'ten' },
        svg,
      );
      expect(missing.status).toBe(400);
      expect(missing.text).toContain('The pilot was not added');
      expect(missing.text).toContain('href="#prompt"');
      expect(missing.text).toContain('Right answer: choose which filled-in option is right');
      expect(missing.text).toContain(
        'Answers needed before it is calibrated: a whole number from 30 to 5000',
      );
      expect(missing.text).toMatch(/id="min-responses"[^>]*value="ten"[^>]*aria-invalid="true"/);
      expect(missing.text).toContain('value="Row one"');
      const noFile = await post(good);
      expect(noFile.status).toBe(400);
      expect(noFile.text).toContain('Chart image: choose an SVG or PNG file');
      const wrongType = await post(good, {
        data: Buffer.from('hello'),
        name: 'notes.txt',
        type: 'text/plain',
      });
      expect(wrongType.status).toBe(415);
      expect(wrongType.text).toContain('must be image/svg+xml or image/png');
      const notPng = await post(good, {
        data: Buffer.from('not a png at all'),
        name: 'x.png',
        type: 'image/png',
      });
      expect(notPng.status).toBe(400);
      const huge = await post(good, {
        data: Buffer.from(
          `<svg xmlns="http://www.w3.org/2000/svg"><desc>${'x'.repeat(300 * 1024)}</desc></svg>`,
        ),
        name: 'big.svg',
        type: 'image/svg+xml',
      });
      expect(huge.status).toBe(413);
      expect(huge.text).toContain('at most 262144 bytes');
      const forged = await post({ ...good, csrf: 'wrong' }, svg);
      expect([forged.status, forged.body.error.code]).toEqual([403, 'FORBIDDEN']);
      const json = await request(app.server)
        .post(`/console/studies/${studyId}/pilots`)
        .set('Cookie', adminCookie)
        .send({ prompt: 'x' });
      expect([json.status, json.body.error.code]).toEqual([415, 'UNSUPPORTED_MEDIA_TYPE']);
      const broken = await request(app.server)
        .post(`/console/studies/${studyId}/pilots`)
        .set('Cookie', adminCookie)
        .set('content-type', 'multipart/form-data; boundary=zz')
        .send('--zz\r\nno headers here');
      expect([broken.status, broken.body.error.code]).toEqual([400, 'VALIDATION_FAILED']);
      expect(await pilots()).toEqual([]);

      const added = await post(good, svg);
      expect(added.status).toBe(303);
      expect(added.headers.location).toBe(`/console/studies/${studyId}/pilots/new?added=1`);
      const stored = await pilots();
      expect(stored).toHaveLength(1);
      expect(stored[0]).toMatchObject({
        study_id: studyId,
        prompt: good.prompt,
        key: JSON.stringify('b'),
        min_responses: 60,
        media_type: 'image/svg+xml',
      });
      expect(JSON.parse(stored[0]!.options)).toEqual([
        { id: 'a', text: 'Row one' },
        { id: 'b', text: 'Row two' },
      ]);
      // Sanitized like the API's uploads: the script is gone.
      expect(Buffer.from(stored[0]!.image, 'base64').toString('utf8')).not.toContain('script');
      const audit = await database.db
        .selectFrom('audit_log')
        .selectAll()
        .where('action', '=', 'pilot.add')
        .execute();
      expect(audit.map((a) => a.actor)).toEqual(['admin-token']);
      const after = await request(app.server).get(added.headers.location!).set('Cookie', adminCookie);
      expect(after.text).toContain('Pilot chart added.');
      expect(after.text).toContain(`/api/admin/studies/${studyId}/pilots/${stored[0]!.id}/image`);

      // Stop giving it to new attempts: a form per active pilot, CSRF-checked.
      const retireAction = `/console/studies/${studyId}/pilots/${stored[0]!.id}/retire`;
      expect(after.text).toContain(`action="${retireAction}"`);
      const forgedRetire = await request(app.server)
        .post(retireAction)
        .set('Cookie', adminCookie)
        .type('form')
        .send({ csrf: 'forged' });
      expect(forgedRetire.status).toBe(403);
      expect((await pilots())[0]!.status).toBe('active');
      const retired = await request(app.server)
        .post(retireAction)
        .set('Cookie', adminCookie)
        .type('form')
        .send({ csrf: csrfOf(after.text) });
      expect(retired.status).toBe(303);
      expect(retired.headers.location).toBe(`/console/studies/${studyId}/pilots/new?retired=1`);
      expect((await pilots())[0]!.status).toBe('retired');
      const listed = await request(app.server).get(retired.headers.location!).set('Cookie', adminCookie);
      expect(listed.text).toContain('New attempts no longer get that pilot chart.');
      expect(listed.text).toContain('no longer given to new attempts');
      expect(listed.text).not.toContain(`action="${retireAction}"`);
    });

    it('calibrates from the console, or says why it cannot', async () => {
      const page = await request(app.server)
        .get(`/console/studies/${studyId}/calibrate`)
        .set('Cookie', adminCookie);
      expect(page.status).toBe(200);
      const refused = await request(app.server)
        .post(`/console/studies/${studyId}/calibrate`)
        .set('Cookie', adminCookie)
        .type('form')
        .send({ csrf: csrfOf(page.text) });
      expect(refused.status).toBe(409);
      expect(refused.text).toContain('role="alert"');
      expect(refused.text).toContain('has no scored responses yet');
      const forged = await request(app.server)
        .post(`/console/studies/${studyId}/calibrate`)
        .set('Cookie', adminCookie)
        .type('form')
        .send({});
      expect(forged.status).toBe(403);
    });
  });
}
