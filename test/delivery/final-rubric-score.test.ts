import { describe, expect, it } from 'vitest';
import { finalRubricScore, scoresNeeded } from '../../server/delivery/final-rubric-score.js';

describe('finalRubricScore', () => {
  it('takes one rater as given, and two raters as their mean rounded down (common practice, no source)', () => {
    expect([0, 1, 2].map((s) => finalRubricScore([s]))).toEqual([0, 1, 2]);
    expect(finalRubricScore([2, 2])).toBe(2);
    expect(finalRubricScore([1, 2])).toBe(1);
    expect(finalRubricScore([2, 1])).toBe(1);
    expect(finalRubricScore([0, 1])).toBe(0);
  });

  it('takes the median of a third read, so the third rater decides (common practice, no source)', () => {
    expect(finalRubricScore([0, 2, 0])).toBe(0);
    expect(finalRubricScore([0, 2, 1])).toBe(1);
    expect(finalRubricScore([2, 0, 2])).toBe(2);
  });

  it('refuses no score, more than three, and scores outside the rubric', () => {
    expect(() => finalRubricScore([])).toThrow('at least one score');
    expect(() => finalRubricScore([0, 2, 1, 1])).toThrow('at most three');
    expect(() => finalRubricScore([3])).toThrow('3 is outside 0..2');
    expect(() => finalRubricScore([1, 0.5])).toThrow('0.5 is outside 0..2');
  });
});

describe('scoresNeeded', () => {
  it('asks for a third read only when two raters are a whole rubric apart', () => {
    expect(scoresNeeded(1, [])).toBe(1);
    expect(scoresNeeded(1, [2])).toBe(1);
    expect(scoresNeeded(2, [0])).toBe(2);
    expect(scoresNeeded(2, [0, 1])).toBe(2);
    expect(scoresNeeded(2, [2, 1])).toBe(2);
    expect(scoresNeeded(2, [0, 2])).toBe(3);
    expect(scoresNeeded(2, [2, 0])).toBe(3);
    expect(scoresNeeded(2, [2, 0, 1])).toBe(3);
  });
});
