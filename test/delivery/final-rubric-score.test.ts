import { describe, expect, it } from 'vitest';
import { finalRubricScore } from '../../server/delivery/final-rubric-score.js';

describe('finalRubricScore', () => {
  it('takes one rater as given, and two raters as their mean rounded down (common practice, no source)', () => {
    expect([0, 1, 2].map((s) => finalRubricScore([s]))).toEqual([0, 1, 2]);
    expect(finalRubricScore([2, 2])).toBe(2);
    expect(finalRubricScore([1, 2])).toBe(1);
    expect(finalRubricScore([2, 1])).toBe(1);
    expect(finalRubricScore([0, 1])).toBe(0);
    expect(finalRubricScore([0, 2])).toBe(1);
  });

  it('refuses no score and scores outside the rubric', () => {
    expect(() => finalRubricScore([])).toThrow('at least one score');
    expect(() => finalRubricScore([3])).toThrow('3 is outside 0..2');
    expect(() => finalRubricScore([1, 0.5])).toThrow('0.5 is outside 0..2');
  });
});
