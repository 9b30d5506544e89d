/**
 * A simulated study written straight through the repositories (no HTTP), for report tests that need
 * hundreds of respondents quickly. Invented data: Rasch answers from given abilities and difficulties.
 */
import { randomUUID } from 'node:crypto';
import { seededRandom } from '../../server/scoring/seeded-random.js';
import { insertAttempt, updateAttempt } from '../../server/storage/attempt-repository.js';
import { insertCohort } from '../../server/storage/cohort-repository.js';
import type { DbHandle } from '../../server/storage/db-handle.js';
import { insertResponse } from '../../server/storage/response-repository.js';
import { insertStudy } from '../../server/storage/study-repository.js';

export interface SimulatedCohortSpec {
  readonly label: string;
  readonly abilities: readonly number[];
}

export interface SimulatedStudySpec {
  readonly items: readonly { readonly id: string; readonly difficulty: number }[];
  readonly cohorts: readonly SimulatedCohortSpec[];
  readonly seed: number;
  /** Items each person answers, a contiguous ring slice starting at a rotating offset (default all). */
  readonly itemsPerPerson?: number;
  /** Share of wrong answers stored as "I don't know" (default 0.25). */
  readonly dontKnowShare?: number;
  /** Leave attempts unfinished (status started). */
  readonly unfinished?: boolean;
}

let clock = Date.parse('2031-05-04T10:00:00.000Z');
const tick = () => {
  clock += 1000;
  return new Date(clock).toISOString();
};

/** Inserts the study; returns its id and the cohort ids in spec order. */
export async function insertSimulatedStudy(
  db: DbHandle,
  spec: SimulatedStudySpec,
): Promise<{ studyId: string; cohortIds: string[] }> {
  const random = seededRandom(spec.seed);
  const studyId = `study-${randomUUID().slice(0, 8)}`;
  const title = 'Simulated test study';
  await insertStudy(db, { id: studyId, title, settings: { title }, status: 'open', at: tick() });
  const cohortIds: string[] = [];
  const perPerson = spec.itemsPerPerson ?? spec.items.length;
  let person = 0;
  for (const cohort of spec.cohorts) {
    const cohortId = `cohort-${randomUUID().slice(0, 8)}`;
    cohortIds.push(cohortId);
    await insertCohort(db, {
      id: cohortId,
      studyId,
      label: cohort.label,
      joinCode: randomUUID().slice(0, 8).toUpperCase(),
      createdAt: tick(),
    });
    for (const ability of cohort.abilities) {
      // Ids in insertion order, so the response matrix (ordered by attempt id) and the seeded bootstrap
      // over it are the same on every run.
      const attemptId = `${studyId}-a${String(person).padStart(6, '0')}`;
      await insertAttempt(db, { id: attemptId, cohortId, tokenHash: randomUUID(), form: {}, at: tick() });
      const start = (person++ * Math.max(1, Math.floor(perPerson / 2))) % spec.items.length;
      for (let k = 0; k < perPerson; k++) {
        const item = spec.items[(start + k) % spec.items.length]!;
        const right = random.uniform() < 1 / (1 + Math.exp(-(ability - item.difficulty)));
        const dontKnow = !right && random.uniform() < (spec.dontKnowShare ?? 0.25);
        await insertResponse(db, {
          id: randomUUID(),
          attemptId,
          itemId: item.id,
          itemVersion: 1,
          position: k,
          answerKind: dontKnow ? 'dont-know' : 'answer',
          answer: dontKnow ? null : { kind: 'choice', optionIds: [right ? 'a' : 'b'] },
          score: right ? 1 : 0,
          serverMs: 1000,
          clientMs: 1000,
          receivedAt: tick(),
        });
      }
      const at = tick();
      await updateAttempt(db, attemptId, {
        consentedAt: at,
        ...(spec.unfinished ? {} : { status: 'finished', finishedAt: at }),
      });
    }
  }
  return { studyId, cohortIds };
}

/** `n` normal draws with the given mean and SD from a seeded stream. */
export function normalDraws(seed: number, n: number, mean: number, sd: number): number[] {
  const random = seededRandom(seed);
  return Array.from({ length: n }, () => mean + sd * random.normal());
}
