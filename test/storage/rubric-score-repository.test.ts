import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eraseAttempt } from '../../server/storage/erasure-repository.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import {
  findRubricAnswer,
  insertRubricScore,
  listAnswersToScore,
  listDoubleScores,
  listRubricScoredItemIds,
  setFinalScore,
} from '../../server/storage/rubric-score-repository.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const now = '2031-05-04T10:15:00.000Z';

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: rubric score storage`, () => {
    let database: TestDatabase;

    beforeAll(async () => {
      database = await engine.open();
      await migrateToLatest(database.db);
      const db = database.db;
      await db
        .insertInto('studies')
        .values({
          id: 's1',
          title: 'Garden notes',
          settings: '{}',
          status: 'open',
          created_at: now,
          updated_at: now,
        })
        .execute();
      await db
        .insertInto('cohorts')
        .values({ id: 'c1', study_id: 's1', label: 'Volunteers', join_code: 'SPRT42', created_at: now })
        .execute();
      for (const a of ['a1', 'a2']) {
        await db
          .insertInto('attempts')
          .values({
            id: a,
            cohort_id: 'c1',
            token_hash: `h-${a}`,
            status: 'finished',
            form: '[]',
            background: '{}',
            started_at: now,
            last_seen_at: now,
          })
          .execute();
      }
      const base = { item_version: 1, position: 0, answer_kind: 'answer' as const, received_at: now };
      await db
        .insertInto('responses')
        .values([
          {
            id: 'r1',
            attempt_id: 'a1',
            item_id: 'text-item',
            answer: '{"kind":"text","text":"More beds"}',
            score: null,
            ...base,
          },
          {
            id: 'r2',
            attempt_id: 'a2',
            item_id: 'text-item',
            answer: '{"kind":"text","text":"Ask"}',
            score: null,
            ...base,
          },
          {
            id: 'r3',
            attempt_id: 'a1',
            item_id: 'choice-item',
            answer: '{"kind":"choice","optionIds":["b"]}',
            score: 1,
            ...base,
            position: 1,
          },
        ])
        .execute();
    });

    afterAll(async () => {
      await database?.cleanup();
    });

    it('queues only text answers, and only those this rater has not scored and that still need scores', async () => {
      const db = database.db;
      expect(await findRubricAnswer(db, 'r3')).toBeUndefined();
      expect((await listAnswersToScore(db, 's1', 'ann', 2, 10)).answers.map((a) => a.responseId)).toEqual([
        'r1',
        'r2',
      ]);
      await insertRubricScore(db, { id: 'x1', responseId: 'r1', rater: 'ann', score: 2, scoredAt: now });
      expect((await listAnswersToScore(db, 's1', 'ann', 2, 10)).answers.map((a) => a.responseId)).toEqual([
        'r2',
      ]);
      expect((await listAnswersToScore(db, 's1', 'bo', 2, 10)).answers.map((a) => a.responseId)).toEqual([
        'r1',
        'r2',
      ]);
      // With one rater asked for, an answer with a score is out of everyone's queue.
      expect((await listAnswersToScore(db, 's1', 'bo', 1, 10)).answers.map((a) => a.responseId)).toEqual([
        'r2',
      ]);
      await insertRubricScore(db, { id: 'x2', responseId: 'r1', rater: 'bo', score: 1, scoredAt: now });
      await setFinalScore(db, 'r1', 1);
      expect((await listAnswersToScore(db, 's1', 'cy', 2, 10)).answers.map((a) => a.responseId)).toEqual([
        'r2',
      ]);
      expect(await findRubricAnswer(db, 'r1')).toMatchObject({
        text: 'More beds',
        finalScore: 1,
        studyId: 's1',
      });
      expect(await listDoubleScores(db, 's1')).toEqual([{ itemId: 'text-item', first: 2, second: 1 }]);
      expect(await listRubricScoredItemIds(db, 's1')).toEqual(['text-item']);
    });

    it('refuses a second score by the same rater and a score outside 0..2 in the database itself', async () => {
      const db = database.db;
      await expect(
        insertRubricScore(db, { id: 'x3', responseId: 'r1', rater: 'ann', score: 0, scoredAt: now }),
      ).rejects.toThrow();
      await expect(
        insertRubricScore(db, { id: 'x4', responseId: 'r2', rater: 'ann', score: 3, scoredAt: now }),
      ).rejects.toThrow();
      const rows = await db.selectFrom('rubric_scores').select(['id']).orderBy('id').execute();
      expect(rows.map((r) => r.id)).toEqual(['x1', 'x2']);
    });

    it('erasing an attempt removes its answers and their rubric scores (ON DELETE CASCADE)', async () => {
      const db = database.db;
      await eraseAttempt(db, 'a1', 'cli');
      expect(await db.selectFrom('rubric_scores').selectAll().execute()).toEqual([]);
      expect((await db.selectFrom('responses').select('id').execute()).map((r) => r.id)).toEqual(['r2']);
    });
  });
}
