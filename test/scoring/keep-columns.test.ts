import { describe, expect, it } from 'vitest';
import { keepColumns, MISSING } from '../../server/scoring/response-matrix.js';

describe('keepColumns', () => {
  it('keeps the named columns in the named order, row by row, missing cells included', () => {
    const matrix = {
      personIds: ['p1', 'p2'],
      itemIds: ['a', 'b', 'c'],
      scores: Uint8Array.from([1, 0, MISSING, 0, 1, 1]),
    };
    const kept = keepColumns(matrix, [2, 0]);
    expect(kept.itemIds).toEqual(['c', 'a']);
    expect(kept.personIds).toEqual(['p1', 'p2']);
    expect([...kept.scores]).toEqual([MISSING, 1, 1, 0]);
  });
});
