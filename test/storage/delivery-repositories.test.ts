import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  countAttemptsInStudy,
  findAttemptByTokenHash,
  insertAttempt,
  lockAttemptByTokenHash,
  updateAttempt,
} from '../../server/storage/attempt-repository.js';
import { insertAuditEntry, listAuditEntries } from '../../server/storage/audit-repository.js';
import {
  findCohortByJoinCode,
  insertCohort,
  joinCodeExists,
  listCohorts,
} from '../../server/storage/cohort-repository.js';
import { isUniqueViolation } from '../../server/storage/db-handle.js';
import { listItemVersions, syncItemVersions } from '../../server/storage/item-version-repository.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import {
  countAttemptResponses,
  findResponse,
  insertResponse,
  listStudyResponses,
} from '../../server/storage/response-repository.js';
import {
  findStudyById,
  insertStudy,
  listStudies,
  updateStudy,
} from '../../server/storage/study-repository.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const at = '2031-05-04T10:15:00.000Z';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: delivery repositories`, () => {
    let database: TestDatabase;
    beforeAll(async () => {
      database = await engine.open();
      await migrateToLatest(database.db);
    });
    afterAll(async () => {
      await database?.cleanup();
    });

    it('item versions: a new content hash of an id is its next version; a known one keeps its own', async () => {
      const db = database.db;
      const first = await syncItemVersions(
        db,
        [
          { id: 'a', contentHash: 'h1', status: 'active' },
          { id: 'b', contentHash: 'k1', status: 'draft' },
        ],
        at,
      );
      expect([...first]).toEqual([
        ['a', 1],
        ['b', 1],
      ]);
      const second = await syncItemVersions(
        db,
        [
          { id: 'a', contentHash: 'h2', status: 'active' },
          { id: 'b', contentHash: 'k1', status: 'active' },
        ],
        at,
      );
      expect([...second]).toEqual([
        ['a', 2],
        ['b', 1],
      ]);
      // Going back to old content finds its old version rather than inventing a third.
      const back = await syncItemVersions(db, [{ id: 'a', contentHash: 'h1', status: 'active' }], at);
      expect(back.get('a')).toBe(1);
      expect((await listItemVersions(db, 'a')).map((v) => [v.version, v.contentHash])).toEqual([
        [1, 'h1'],
        [2, 'h2'],
      ]);
      expect((await listItemVersions(db, 'b'))[0]!.status).toBe('active');
    });

    it('studies, cohorts, attempts and responses round-trip, and exports join them in order', async () => {
      const db = database.db;
      await insertStudy(db, {
        id: 's1',
        title: 'T',
        settings: { title: 'T', kiosk: true },
        status: 'open',
        at,
      });
      await updateStudy(db, 's1', { title: 'T2', settings: { title: 'T2' }, status: 'closed', at });
      expect(await findStudyById(db, 's1')).toMatchObject({
        title: 'T2',
        status: 'closed',
        settings: { title: 'T2' },
      });
      expect((await listStudies(db)).map((s) => s.id)).toEqual(['s1']);

      await insertCohort(db, {
        id: 'c1',
        studyId: 's1',
        label: 'Walk-ups',
        joinCode: 'KELP-42',
        createdAt: at,
      });
      await insertCohort(db, {
        id: 'c2',
        studyId: 's1',
        label: 'Course',
        joinCode: 'WAKT-47',
        createdAt: '2031-05-05T00:00:00.000Z',
      });
      expect((await findCohortByJoinCode(db, 'KELP-42'))?.id).toBe('c1');
      expect(await joinCodeExists(db, 'ZZZZ-99')).toBe(false);
      expect((await listCohorts(db, 's1')).map((c) => c.id)).toEqual(['c1', 'c2']);
      // A join code is unique.
      const clash = await insertCohort(db, {
        id: 'c3',
        studyId: 's1',
        label: 'X',
        joinCode: 'KELP-42',
        createdAt: at,
      }).catch((e) => e);
      expect(isUniqueViolation(clash)).toBe(true);

      await insertAttempt(db, { id: 'a1', cohortId: 'c1', tokenHash: 'hash-1', form: { items: [] }, at });
      await insertAttempt(db, { id: 'a2', cohortId: 'c2', tokenHash: 'hash-2', form: { items: [] }, at });
      await lockAttemptByTokenHash(db, 'hash-1');
      await updateAttempt(db, 'a1', {
        status: 'finished',
        background: { 'age-band': '12-17' },
        consentedAt: at,
      });
      expect(await findAttemptByTokenHash(db, 'hash-1')).toMatchObject({
        id: 'a1',
        status: 'finished',
        background: { 'age-band': '12-17' },
        consentedAt: at,
        lastSeenAt: at,
      });
      expect(await countAttemptsInStudy(db, 's1')).toBe(2);

      const base = { itemVersion: 1, serverMs: 900, clientMs: 850, receivedAt: at };
      await insertResponse(db, {
        ...base,
        id: 'r2',
        attemptId: 'a2',
        itemId: 'x',
        position: 0,
        answerKind: 'answer',
        answer: { kind: 'number', value: 3 },
        score: 1,
      });
      await insertResponse(db, {
        ...base,
        id: 'r1',
        attemptId: 'a1',
        itemId: 'y',
        position: 1,
        answerKind: 'dont-know',
        answer: null,
        score: 0,
      });
      await insertResponse(db, {
        ...base,
        id: 'r0',
        attemptId: 'a1',
        itemId: 'x',
        position: 0,
        answerKind: 'answer',
        answer: { kind: 'choice', optionIds: ['b'] },
        score: 1,
      });
      const twice = await insertResponse(db, {
        ...base,
        id: 'r9',
        attemptId: 'a1',
        itemId: 'x',
        position: 0,
        answerKind: 'answer',
        answer: null,
        score: 0,
      }).catch((e) => e);
      expect(isUniqueViolation(twice)).toBe(true);
      expect(await findResponse(db, 'a1', 'y')).toMatchObject({
        answerKind: 'dont-know',
        answer: null,
        score: 0,
        serverMs: 900,
      });
      expect(await countAttemptResponses(db, 'a1')).toEqual({ answered: 2, correct: 1 });

      const exported = await listStudyResponses(db, 's1');
      expect(exported.map((r) => [r.cohortLabel, r.attemptId, r.position])).toEqual([
        ['Walk-ups', 'a1', 0],
        ['Walk-ups', 'a1', 1],
        ['Course', 'a2', 0],
      ]);
      expect(exported[0]!.background).toEqual({ 'age-band': '12-17' });
      expect((await listStudyResponses(db, 's1', 'c2')).map((r) => r.id)).toEqual(['r2']);
    });

    it('audit entries keep their details', async () => {
      await insertAuditEntry(database.db, {
        id: 'e1',
        at,
        actor: 'cli',
        action: 'study.create',
        subject: 's1',
        details: { title: 'T' },
      });
      expect(await listAuditEntries(database.db, 's1')).toEqual([
        { id: 'e1', at, actor: 'cli', action: 'study.create', subject: 's1', details: { title: 'T' } },
      ]);
    });
  });
}
