import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrateToLatest } from '../../server/storage/migrate.js';
import {
  countAnswersByItem,
  countAttemptsByCohort,
  countAttemptsWithAnswers,
  countCohortsByStudy,
  countPilotAnswers,
  listAnswerTimes,
} from '../../server/storage/progress-repository.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const at = (minute: number) => `2031-05-04T10:${String(minute).padStart(2, '0')}:00.000Z`;

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: progress repository`, () => {
    let database: TestDatabase;
    beforeAll(async () => {
      database = await engine.open();
      await migrateToLatest(database.db);
      const db = database.db;
      for (const id of ['study-a', 'study-b'])
        await db
          .insertInto('studies')
          .values({
            id,
            title: id,
            settings: '{"title":"x"}',
            status: 'open',
            created_at: at(0),
            updated_at: at(0),
          })
          .execute();
      await db
        .insertInto('cohorts')
        .values([
          {
            id: 'c-morning',
            study_id: 'study-a',
            label: 'Mornings',
            join_code: 'AAAA-11',
            created_at: at(1),
          },
          {
            id: 'c-evening',
            study_id: 'study-a',
            label: 'Evenings',
            join_code: 'BBBB-22',
            created_at: at(2),
          },
          {
            id: 'c-other',
            study_id: 'study-b',
            label: 'Other study',
            join_code: 'CCCC-33',
            created_at: at(3),
          },
        ])
        .execute();
      const attempt = (
        id: string,
        cohort: string,
        status: 'started' | 'finished' | 'abandoned',
        seen: number,
      ) => ({
        id,
        cohort_id: cohort,
        token_hash: `hash-${id}`,
        status,
        form: '{}',
        background: '{}',
        consented_at: at(5),
        started_at: at(5),
        last_seen_at: at(seen),
        finished_at: status === 'finished' ? at(seen) : null,
      });
      await db
        .insertInto('attempts')
        .values([
          attempt('t1', 'c-morning', 'finished', 20),
          attempt('t2', 'c-morning', 'started', 31),
          attempt('t3', 'c-morning', 'abandoned', 12),
          attempt('t4', 'c-morning', 'started', 9),
          attempt('t5', 'c-other', 'finished', 40),
        ])
        .execute();
      const response = (
        id: string,
        attemptId: string,
        itemId: string,
        position: number,
        ms: number | null,
      ) => ({
        id,
        attempt_id: attemptId,
        item_id: itemId,
        item_version: 1,
        position,
        answer_kind: 'answer' as const,
        answer: '{}',
        score: 1,
        server_ms: ms,
        client_ms: null,
        received_at: at(10 + position),
      });
      await db
        .insertInto('responses')
        .values([
          response('r1', 't1', 'item-a', 0, 4000),
          response('r2', 't1', 'item-b', 1, 1500),
          response('r3', 't2', 'item-a', 0, 2000),
          response('r4', 't3', 'item-b', 0, null),
          response('r5', 't5', 'item-a', 0, 9999),
        ])
        .execute();
      await db
        .insertInto('pilot_items')
        .values(
          ['pilot-1', 'pilot-2'].map((id, i) => ({
            id,
            study_id: 'study-a',
            prompt: `Pilot ${i + 1}`,
            alt: 'A chart',
            options: '[]',
            key: '"a"',
            media_type: 'image/svg+xml' as const,
            image: '',
            min_responses: 100,
            status: 'active' as const,
            created_at: at(i),
          })),
        )
        .execute();
      await db
        .insertInto('pilot_responses')
        .values(
          ['t1', 't2', 't3'].map((attemptId, i) => ({
            id: `pr-${i}`,
            attempt_id: attemptId,
            pilot_id: 'pilot-1',
            position: 2,
            answer_kind: 'answer' as const,
            answer: '["a"]',
            score: 1,
            server_ms: 1000,
            received_at: at(30),
          })),
        )
        .execute();
    });
    afterAll(async () => database?.cleanup());

    it('counts attempts per cohort and status, with cohorts nobody joined, and only this study', async () => {
      expect(await countAttemptsByCohort(database.db, 'study-a')).toEqual([
        {
          cohortId: 'c-morning',
          label: 'Mornings',
          joinCode: 'AAAA-11',
          inProgress: 2,
          finished: 1,
          abandoned: 1,
          lastActivityAt: at(31),
        },
        {
          cohortId: 'c-evening',
          label: 'Evenings',
          joinCode: 'BBBB-22',
          inProgress: 0,
          finished: 0,
          abandoned: 0,
          lastActivityAt: null,
        },
      ]);
    });

    it('counts attempts with answers and answers per item within the study', async () => {
      expect(await countAttemptsWithAnswers(database.db, 'study-a')).toBe(3);
      expect(await countAnswersByItem(database.db, 'study-a')).toEqual([
        { itemId: 'item-a', attempts: 2 },
        { itemId: 'item-b', attempts: 2 },
      ]);
    });

    it('lists the server-measured times, leaving out answers without one', async () => {
      const times = await listAnswerTimes(database.db, 'study-a');
      expect(times.map((t) => [t.itemId, t.serverMs]).sort()).toEqual([
        ['item-a', 2000],
        ['item-a', 4000],
        ['item-b', 1500],
      ]);
    });

    it('counts pilot answers, with pilots nobody answered yet', async () => {
      expect(await countPilotAnswers(database.db, 'study-a')).toEqual([
        { pilotId: 'pilot-1', prompt: 'Pilot 1', status: 'active', minResponses: 100, responses: 3 },
        { pilotId: 'pilot-2', prompt: 'Pilot 2', status: 'active', minResponses: 100, responses: 0 },
      ]);
      expect(await countPilotAnswers(database.db, 'study-b')).toEqual([]);
    });

    it('counts cohorts per study', async () => {
      expect(Object.fromEntries(await countCohortsByStudy(database.db))).toEqual({
        'study-a': 2,
        'study-b': 1,
      });
    });
  });
}
