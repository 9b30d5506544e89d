import { describe, expect, it } from 'vitest';
import { composeStudyProgress, type ProgressInput } from '../../server/reports/study-progress.js';

const base: ProgressInput = {
  study: { id: 's1', title: 'Sprout Lane Garden visitors', design: 'adaptive', status: 'open' },
  poolItemIds: ['b-item', 'a-item', 'c-item'],
  cohorts: [
    {
      cohortId: 'c1',
      label: 'Mornings',
      joinCode: 'AAAA-11',
      inProgress: 2,
      finished: 5,
      abandoned: 1,
      lastActivityAt: '2031-05-04T10:15:00.000Z',
    },
    {
      cohortId: 'c2',
      label: 'Evenings',
      joinCode: 'BBBB-22',
      inProgress: 0,
      finished: 0,
      abandoned: 0,
      lastActivityAt: null,
    },
  ],
  attemptsWithAnswers: 40,
  answersByItem: [
    { itemId: 'a-item', attempts: 12 },
    { itemId: 'b-item', attempts: 9 },
    { itemId: 'gone-item', attempts: 30 },
  ],
  answerTimes: [
    { itemId: 'a-item', serverMs: 4000 },
    { itemId: 'a-item', serverMs: 1000 },
    { itemId: 'a-item', serverMs: 3000 },
    { itemId: 'b-item', serverMs: 2000 },
    { itemId: 'b-item', serverMs: 10_000 },
    { itemId: 'b-item', serverMs: 1000 },
    { itemId: 'b-item', serverMs: 3000 },
  ],
  pilots: [
    { pilotId: 'p1', prompt: 'Which bed grew most?', status: 'active', minResponses: 100, responses: 37 },
  ],
  at: '2031-05-04T10:16:00.000Z',
};

describe('composeStudyProgress', () => {
  it('adds attempts per cohort and in total; started counts every attempt', () => {
    const p = composeStudyProgress(base);
    expect(p.cohorts.map((c) => [c.label, c.started, c.inProgress, c.finished, c.abandoned])).toEqual([
      ['Mornings', 8, 2, 5, 1],
      ['Evenings', 0, 0, 0, 0],
    ]);
    expect(p.totals).toEqual({ started: 8, inProgress: 2, finished: 5, abandoned: 1 });
  });

  it('gives the median time per item (middle value; mean of the two middle values for an even count)', () => {
    // Median of an even count = mean of the two middle values: common practice, no source.
    const items = new Map(composeStudyProgress(base).items.map((i) => [i.itemId, i]));
    expect(items.get('a-item')!.medianSeconds).toBe(3);
    expect(items.get('b-item')!.medianSeconds).toBe(2.5);
    expect(items.get('c-item')!.medianSeconds).toBeNull();
  });

  it('lists pool items nobody answered and answered items that left the pool, in id order', () => {
    const p = composeStudyProgress(base);
    expect(p.items.map((i) => [i.itemId, i.answers, i.inPool])).toEqual([
      ['a-item', 12, true],
      ['b-item', 9, true],
      ['c-item', 0, true],
      ['gone-item', 30, false],
    ]);
    expect(p.items.map((i) => i.exposure)).toEqual([0.3, 0.225, null, 0.75]);
  });

  it('warns on adaptive items at 80% of the 0.3 limit or more, highest first, once 20 attempts have answers', () => {
    const p = composeStudyProgress(base);
    expect(p.exposure.warnAt).toBe(0.24);
    expect(p.exposure.nearing).toEqual([
      { itemId: 'gone-item', exposure: 0.75 },
      { itemId: 'a-item', exposure: 0.3 },
    ]);
    // 0.225 is below 0.24: not listed.
    expect(p.exposure.nearing.some((i) => i.itemId === 'b-item')).toBe(false);
    const few = composeStudyProgress({
      ...base,
      attemptsWithAnswers: 19,
      answersByItem: [{ itemId: 'a-item', attempts: 19 }],
    });
    expect(few.exposure.enoughAttempts).toBe(false);
    expect(few.exposure.nearing).toEqual([]);
    const fixed = composeStudyProgress({ ...base, study: { ...base.study, design: 'fixed' } });
    expect(fixed.exposure.applies).toBe(false);
    expect(fixed.exposure.nearing).toEqual([]);
  });

  it("takes the limit from the study's tuned exposure control when it has one", () => {
    expect(composeStudyProgress(base).exposure).toMatchObject({ limit: 0.3, limitFrom: 'default' });
    // Tuned for 0.2: warn at 80% of it, 0.16; b-item's 0.225 is now listed too.
    const tuned = composeStudyProgress({ ...base, tunedExposureLimit: 0.2 });
    expect(tuned.exposure).toMatchObject({ limit: 0.2, warnAt: 0.16, limitFrom: 'exposure-control' });
    expect(tuned.exposure.nearing.map((i) => i.itemId)).toEqual(['gone-item', 'a-item', 'b-item']);
  });

  it('says how many answers each pilot still needs, never below zero', () => {
    const p = composeStudyProgress({
      ...base,
      pilots: [
        ...base.pilots,
        { pilotId: 'p2', prompt: 'Done', status: 'retired', minResponses: 50, responses: 64 },
      ],
    });
    expect(p.pilots.map((x) => [x.pilotId, x.responses, x.remaining])).toEqual([
      ['p1', 37, 63],
      ['p2', 64, 0],
    ]);
  });

  it('has no exposure before any attempt answered', () => {
    const p = composeStudyProgress({ ...base, attemptsWithAnswers: 0, answersByItem: [], answerTimes: [] });
    expect(p.items.every((i) => i.exposure === null && i.answers === 0)).toBe(true);
  });
});
