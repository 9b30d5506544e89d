import { describe, expect, it } from 'vitest';
import { groupScoreGroups } from '../../../server/scoring/rasch/cml-score-groups.js';
import { MISSING } from '../../../server/scoring/response-matrix.js';

describe('groupScoreGroups', () => {
  it('matches its doc example', () => {
    const groups = groupScoreGroups({
      personIds: ['a', 'b'],
      itemIds: ['x', 'y'],
      scores: Uint8Array.of(1, 0, 0, 1),
    });
    expect(groups.booklets).toHaveLength(1);
    expect(Array.from(groups.booklets[0]!.counts)).toEqual([0, 2, 0]);
  });

  it('forms one booklet per answered-item set and counts raw scores within it', () => {
    const X = MISSING;
    const groups = groupScoreGroups({
      personIds: ['p1', 'p2', 'p3', 'p4', 'p5'],
      itemIds: ['a', 'b', 'c'],
      scores: Uint8Array.of(1, 0, X, 0, 1, X, X, 1, 0, 1, 0, 1, 1, 1, 0),
    });
    expect(groups.booklets.map((b) => Array.from(b.items))).toEqual([
      [0, 1],
      [1, 2],
      [0, 1, 2],
    ]);
    expect(groups.booklets.map((b) => Array.from(b.counts))).toEqual([
      [0, 2, 0],
      [0, 1, 0],
      [0, 0, 2, 0],
    ]);
    expect(Array.from(groups.personBooklet)).toEqual([0, 0, 1, 2, 2]);
    expect(Array.from(groups.itemTotals)).toEqual([3, 3, 1]);
  });

  it('repeats exclusion: dropping an all-correct item can make a person extreme', () => {
    // item a is right for everyone; without it p1 (1,1,0 → 1,0) stays, p2 (1,0,0 → 0,0) becomes all-wrong
    const groups = groupScoreGroups({
      personIds: ['p1', 'p2', 'p3'],
      itemIds: ['a', 'b', 'c'],
      scores: Uint8Array.of(1, 1, 0, 1, 0, 0, 1, 0, 1),
    });
    expect(groups.excludedItems).toEqual([{ id: 'a', reason: 'all-correct' }]);
    expect(groups.excludedPersons).toEqual([{ id: 'p2', reason: 'all-wrong' }]);
  });
});
