import Fastify, { type FastifyInstance } from 'fastify';
import { serializerCompiler, validatorCompiler } from 'fastify-type-provider-zod';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildBank } from '../../server/bank/load-bank.js';
import { bankRoutes } from '../../server/http/bank-routes.js';
import { registerErrorHandlers } from '../../server/http/error-handler.js';
import { entryOf, scenarios } from '../bank/lint/lint-helpers.js';
import { validItem } from '../bank/valid-item.js';

// A trivial local renderer (tests only): the chart layer's renderer is tested on its own.
const render = (spec: { title: string; type: string }, options: { alt: string; idPrefix: string }) =>
  `<svg xmlns="http://www.w3.org/2000/svg" role="img" viewBox="0 0 600 400" id="${options.idPrefix}svg"><title>${spec.title}</title><desc>${options.alt}</desc><rect class="mark"/></svg>`;

const tricky = {
  ...validItem(),
  id: 'isle-ferry-quietest-day',
  level: 'read' as const,
  prompt: 'On which day did the fewest people take the ferry? <b>not bold</b>',
  key: { by: 'query' as const, query: { op: 'smallest' as const, field: 'passengers', by: 'day' } },
  alt: 'Bar chart of ferry passengers on Monday, Tuesday, Wednesday and Thursday, from 0 to 400 people.',
};
const bank = buildBank({
  entries: [entryOf(validItem()), entryOf(tricky)],
  scenarios,
  maps: new Map(),
  problems: [],
});

const adminToken = 'team-token-for-the-gallery';
let app: FastifyInstance;
/** A request as a signed-in team member (bearer token). */
const get = (path: string) => supertest(app.server).get(path).set('authorization', `Bearer ${adminToken}`);
beforeAll(async () => {
  app = Fastify();
  app.setValidatorCompiler(validatorCompiler);
  app.setSerializerCompiler(serializerCompiler);
  registerErrorHandlers(app);
  await app.register(bankRoutes, { bank, render: render as never, adminToken });
  await app.ready();
});
afterAll(async () => {
  await app.close();
});

describe('who may see the gallery (it shows every key)', () => {
  it('sends a browser without the console cookie or token to the sign-in page', async () => {
    const response = await supertest(app.server).get('/bank?type=bar').expect(303);
    expect(response.headers.location).toBe('/sign-in?next=%2Fbank%3Ftype%3Dbar');
  });

  it('refuses a chart without a token, or with a wrong one, with 401', async () => {
    await supertest(app.server).get('/bank/isle-ferry-busiest-day.svg').expect(401);
    await supertest(app.server)
      .get('/bank/isle-ferry-busiest-day.svg')
      .set('authorization', 'Bearer not-the-team-token')
      .expect(401);
  });
});

describe('GET /bank', () => {
  it("shows every item with its chart, question, I don't know, key and features", async () => {
    const response = await get('/bank').expect(200);
    expect(response.headers['content-type']).toMatch(/^text\/html/);
    expect(response.text.match(/<article class="item"/g)).toHaveLength(2);
    expect(response.text.match(/<svg /g)).toHaveLength(2);
    expect(response.text).toContain('Also offered: "I don\'t know"');
    expect(response.text).toContain('<li class="keyed">Thursday</li>');
    expect(response.text).toContain('<th scope="row">markCount</th><td>4</td>');
    expect(response.text).toContain('&lt;b&gt;not bold&lt;/b&gt;');
    expect(response.text).not.toMatch(/https?:\/\/(?!www\.w3\.org\/2000\/svg)/); // no third-party requests
  });

  it('filters by chart type, level and scenario', async () => {
    const none = await get('/bank?level=envision').expect(200);
    expect(none.text).toContain('No items match these filters.');
    const some = await get('/bank?type=bar&level=read&scenario=isle').expect(200);
    expect(some.text.match(/<article class="item"/g)).toHaveLength(2);
    const blank = await get('/bank?type=&level=&scenario=').expect(200);
    expect(blank.text.match(/<article class="item"/g)).toHaveLength(2);
  });

  it('answers 400 VALIDATION_FAILED for an unknown chart type', async () => {
    const response = await get('/bank?type=radar').expect(400);
    expect(response.body.error.code).toBe('VALIDATION_FAILED');
    expect(response.body.error.details.issues[0].path).toBe('type');
  });

  it('serves its stylesheet', async () => {
    const response = await get('/bank/gallery.css').expect(200);
    expect(response.headers['content-type']).toMatch(/^text\/css/);
    expect(response.text).toContain('@media (min-width:1000px)');
  });
});

describe('GET /bank/:id.svg', () => {
  it('serves one chart as image/svg+xml', async () => {
    const response = await get('/bank/isle-ferry-busiest-day.svg')
      .buffer(true)
      .parse((res, done) => {
        let text = '';
        res.on('data', (chunk: Buffer) => {
          text += chunk.toString('utf8');
        });
        res.on('end', () => done(null, text));
      })
      .expect(200);
    expect(response.headers['content-type']).toMatch(/^image\/svg\+xml/);
    expect(response.body).toContain('<title>Ferry passengers per day</title>');
  });

  it('answers 404 ITEM_NOT_FOUND for an unknown id', async () => {
    const response = await get('/bank/no-such-item.svg').expect(404);
    expect(response.body).toEqual({
      error: {
        code: 'ITEM_NOT_FOUND',
        message: 'no item "no-such-item" in the bank',
        details: { itemId: 'no-such-item' },
      },
    });
  });
});
