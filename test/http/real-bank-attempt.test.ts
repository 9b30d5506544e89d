import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ItemBank, loadBank } from '../../server/bank/load-bank.js';
import { bookletsAreLinked } from '../../server/delivery/booklets-are-linked.js';
import { buildBooklets } from '../../server/delivery/build-booklets.js';
import { selectItemPool } from '../../server/delivery/select-item-pool.js';
import { admin, bearer, deliveryApp, studyWithCohort } from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** End to end on the real items/ bank: a rotated study, every booklet handed out, attempts answered. */
const [sqlite] = testEngines();
describe('real bank: rotated study end to end (sqlite)', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let bank: ItemBank;
  beforeAll(async () => {
    database = await sqlite!.open();
    bank = await loadBank(new URL('../../items', import.meta.url).pathname);
    app = await deliveryApp(database, bank);
  });
  afterAll(async () => {
    await app?.close();
    await database?.cleanup();
  });

  it('hands out linked booklets in turn and scores key answers as correct', async () => {
    const study = await studyWithCohort(app, {
      title: 'Whole bank',
      design: 'rotated',
      maxItems: 8,
      endSummary: true,
    });
    const pool = selectItemPool(bank.items, {}).itemIds;
    const booklets = buildBooklets(pool, 8);
    expect(booklets.length).toBeGreaterThan(2);
    const forms: string[][] = [];
    for (let b = 0; b < booklets.length; b++) {
      const joined = await request(app.server).post('/api/join').send({ code: study.joinCode });
      expect(joined.status).toBe(201);
      const token = joined.body.token;
      let state = (
        await request(app.server).post('/api/attempt/consent').set(bearer(token)).send({ agree: true })
      ).body;
      const seen: string[] = [];
      let expectedCorrect = 0;
      while (state.step === 'item') {
        const item = bank.byId.get(state.item.itemId)!;
        seen.push(item.id);
        expect(state.item.chartSvg.startsWith('<svg')).toBe(true);
        let answer: object;
        if (item.response.kind === 'numeric') answer = { kind: 'number', value: item.resolvedKey.value };
        else if (item.response.kind === 'short-text')
          answer = { kind: 'text', text: 'I would ask for last year too.' };
        else answer = { kind: 'choice', optionIds: [...item.resolvedKey.optionIds] };
        if (item.response.kind !== 'short-text') expectedCorrect++;
        const reply = await request(app.server)
          .post('/api/attempt/responses')
          .set(bearer(token))
          .send({ itemId: item.id, answer });
        expect(reply.status, JSON.stringify(reply.body)).toBe(201);
        state = reply.body.attempt;
      }
      expect(state.step).toBe('finished');
      expect(state.summary).toEqual({ answered: seen.length, chartsRead: expectedCorrect });
      forms.push(seen);
    }
    // Booklet b went to attempt b; together they cover the pool on one linked design.
    expect(forms).toEqual(booklets);
    expect(bookletsAreLinked(forms)).toBe(true);
    expect(new Set(forms.flat()).size).toBe(pool.length);

    const wide = await request(app.server)
      .get(`/api/admin/studies/${study.studyId}/export?format=wide`)
      .set(admin);
    const lines = wide.text.trim().split('\r\n');
    expect(lines).toHaveLength(booklets.length + 1);
    expect(lines[0]!.split(',').length).toBe(2 + pool.length);
  }, 120_000);
});
