import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  findAttemptById,
  insertAttempt,
  lockAttemptByTokenHash,
  updateAttempt,
} from '../../server/storage/attempt-repository.js';
import { findCohortWithStudy, insertCohort } from '../../server/storage/cohort-repository.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { preparedQuery } from '../../server/storage/prepared-query.js';
import { insertResponse } from '../../server/storage/response-repository.js';
import { tallyAttemptResponses } from '../../server/storage/response-tally-repository.js';
import { insertStudy, updateStudy } from '../../server/storage/study-repository.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const at = '2031-05-04T10:15:00.000Z';

function response(id: string, attemptId: string, itemId: string, position: number, score: number) {
  return {
    id,
    attemptId,
    itemId,
    itemVersion: 1,
    position,
    answerKind: 'answer' as const,
    answer: { kind: 'choice', optionIds: ['a'] },
    score,
    serverMs: 10,
    clientMs: null,
    receivedAt: at,
  };
}

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: prepared respondent queries`, () => {
    let database: TestDatabase;
    beforeAll(async () => {
      database = await engine.open();
      const db = database.db;
      await migrateToLatest(db);
      await insertStudy(db, {
        id: 's1',
        title: 'Corrowen',
        settings: { title: 'Corrowen' },
        status: 'open',
        at,
      });
      await insertStudy(db, {
        id: 's2',
        title: 'Orbelle',
        settings: { title: 'Orbelle' },
        status: 'open',
        at,
      });
      await insertCohort(db, {
        id: 'c1',
        studyId: 's1',
        label: 'Class A',
        joinCode: 'AAAA-1111',
        createdAt: at,
      });
      await insertCohort(db, {
        id: 'c2',
        studyId: 's2',
        label: 'Class B',
        joinCode: 'BBBB-2222',
        createdAt: at,
      });
      await insertAttempt(db, { id: 'a1', cohortId: 'c1', tokenHash: 'hash-1', form: { items: [] }, at });
      await insertAttempt(db, { id: 'a2', cohortId: 'c2', tokenHash: 'hash-2', form: { items: [] }, at });
      await insertResponse(db, response('r1', 'a1', 'item-x', 0, 1));
      await insertResponse(db, response('r2', 'a1', 'item-y', 1, 0));
      await insertResponse(db, response('r3', 'a1', 'item-z', 2, 1));
      await insertResponse(db, response('r4', 'a2', 'item-x', 0, 0));
    });
    afterAll(async () => {
      await database?.cleanup();
    });

    it('a cohort comes with its own study row, settings as stored text, across repeated calls', async () => {
      const db = database.db;
      const one = await findCohortWithStudy(db, 'c1');
      const two = await findCohortWithStudy(db, 'c2');
      expect(one?.cohort).toEqual({
        id: 'c1',
        studyId: 's1',
        label: 'Class A',
        joinCode: 'AAAA-1111',
        createdAt: at,
      });
      expect(one?.study).toMatchObject({ id: 's1', title: 'Corrowen', status: 'open', updated_at: at });
      expect(JSON.parse(one?.study.settings ?? 'null')).toEqual({ title: 'Corrowen' });
      expect(two?.study.id).toBe('s2');
      expect(await findCohortWithStudy(db, 'no-such-cohort')).toBeUndefined();
      await updateStudy(db, 's1', {
        title: 'Corrowen 2',
        settings: { title: 'Corrowen 2' },
        status: 'closed',
        at,
      });
      expect((await findCohortWithStudy(db, 'c1'))?.study).toMatchObject({
        title: 'Corrowen 2',
        status: 'closed',
      });
    });

    it('the tally counts one attempt only and finds the item among its answers', async () => {
      const db = database.db;
      expect(await tallyAttemptResponses(db, 'a1', 'item-y')).toEqual({
        answered: 3,
        correct: 2,
        itemAnswered: true,
      });
      expect(await tallyAttemptResponses(db, 'a1', 'item-w')).toEqual({
        answered: 3,
        correct: 2,
        itemAnswered: false,
      });
      expect(await tallyAttemptResponses(db, 'a2', 'item-x')).toEqual({
        answered: 1,
        correct: 0,
        itemAnswered: true,
      });
      expect(await tallyAttemptResponses(db, 'a3', 'item-x')).toEqual({
        answered: 0,
        correct: 0,
        itemAnswered: false,
      });
    });

    it('updates write exactly the fields given, whatever set was used before', async () => {
      const db = database.db;
      await updateAttempt(db, 'a1', { lastSeenAt: '2031-05-04T10:16:00.000Z' });
      await updateAttempt(db, 'a2', { status: 'finished', finishedAt: '2031-05-04T10:17:00.000Z' });
      await updateAttempt(db, 'a1', { form: { items: [1] }, background: { 'age-band': '18-plus' } });
      await updateAttempt(db, 'a1', { consentedAt: null, lastSeenAt: '2031-05-04T10:18:00.000Z' });
      const a1 = await findAttemptById(db, 'a1');
      const a2 = await findAttemptById(db, 'a2');
      expect(a1).toMatchObject({
        status: 'started',
        form: { items: [1] },
        background: { 'age-band': '18-plus' },
        consentedAt: null,
        lastSeenAt: '2031-05-04T10:18:00.000Z',
        finishedAt: null,
      });
      expect(a2).toMatchObject({
        status: 'finished',
        finishedAt: '2031-05-04T10:17:00.000Z',
        lastSeenAt: at,
      });
      expect((await lockAttemptByTokenHash(db, 'hash-2'))?.id).toBe('a2');
      expect((await lockAttemptByTokenHash(db, 'hash-1'))?.lastSeenAt).toBe('2031-05-04T10:18:00.000Z');
      expect(await lockAttemptByTokenHash(db, 'hash-none')).toBeUndefined();
    });

    it('inside a transaction too', async () => {
      const counted = await database.db
        .transaction()
        .execute(async (trx) => tallyAttemptResponses(trx, 'a1', 'item-z'));
      expect(counted).toEqual({ answered: 3, correct: 2, itemAnswered: true });
    });

    it('a build that does not bind every slot fails on first use', async () => {
      const inlined = preparedQuery(1, (db, [id]) =>
        db.selectFrom('attempts').select('id').where('id', '=', sql.lit(id!)),
      );
      await expect(inlined(database.db, ['a1'])).rejects.toThrow(/every slot must be a bound parameter/);
      const unused = preparedQuery(1, (db) => db.selectFrom('attempts').select('id'));
      await expect(unused(database.db, ['a1'])).rejects.toThrow(/every slot must be a bound parameter/);
      const wrongCount = preparedQuery(1, (db, [id]) =>
        db.selectFrom('attempts').select('id').where('id', '=', id!),
      );
      await expect(wrongCount(database.db, [])).rejects.toThrow(/1 values expected/);
    });
  });
}
