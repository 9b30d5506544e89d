/**
 * A rotated study's common block (`commonItems`): every booklet opens with those items and the rest
 * rotates; items outside the pool, or a block leaving fewer than 2 places to rotate, are refused with
 * the field named and nothing stored.
 */
import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { admin, bearer, deliveryApp, joinAndConsent, studyWithCohort } from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

describe('rotated studies with a common block', () => {
  const sqlite = testEngines()[0]!;
  let database: TestDatabase;
  let app: FastifyInstance;
  beforeAll(async () => {
    database = await sqlite.open();
    app = await deliveryApp(database);
  });
  afterAll(async () => {
    await app.close();
    await database.cleanup();
  });

  it('opens every booklet with the common items and rotates the others', async () => {
    const common = 'town-ferry-quietest-day';
    const { joinCode } = await studyWithCohort(app, {
      design: 'rotated',
      maxItems: 3,
      commonItems: [common],
    });
    const seen = new Set<string>();
    for (let k = 0; k < 4; k++) {
      const token = await joinAndConsent(app, joinCode);
      const state = await request(app.server).get('/api/attempt').set(bearer(token));
      expect(state.body.item.itemId).toBe(common);
      expect(state.body.progress.total).toBe(3);
      const answered = await request(app.server)
        .post('/api/attempt/responses')
        .set(bearer(token))
        .send({ itemId: common, answer: { kind: 'dont-know' } });
      seen.add(answered.body.attempt.item.itemId as string);
    }
    // 4 other items, 2 places, blocks of 1: four booklets start their rotation on four different items
    expect(seen.size).toBe(4);
    expect(seen.has(common)).toBe(false);
  });

  it('refuses common items outside the pool or leaving too few places, naming the field', async () => {
    const before = await request(app.server).get('/api/admin/studies').set(admin);
    const outside = await request(app.server)
      .post('/api/admin/studies')
      .set(admin)
      .send({
        title: 'x',
        design: 'rotated',
        maxItems: 3,
        pool: { levels: ['read'] },
        commonItems: ['isle-ferry-why-tuesday'],
      });
    expect(outside.status).toBe(400);
    expect(outside.body.error.message).toContain('body.commonItems: not items of the study');
    const crowded = await request(app.server)
      .post('/api/admin/studies')
      .set(admin)
      .send({
        title: 'x',
        design: 'rotated',
        maxItems: 3,
        commonItems: ['isle-ferry-busiest-day', 'town-ferry-quietest-day'],
      });
    expect(crowded.status).toBe(400);
    expect(crowded.body.error.message).toContain(
      'body.commonItems: common items must leave at least 2 places',
    );
    const after = await request(app.server).get('/api/admin/studies').set(admin);
    expect(after.body).toEqual(before.body);
  });
});
