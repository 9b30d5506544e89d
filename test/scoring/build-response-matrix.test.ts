import { describe, expect, it } from 'vitest';
import {
  buildResponseMatrix,
  buildResponseMatrixFromWide,
  findEmptyPersonsAndItems,
  ResponseDataError,
  selectResponseMatrix,
} from '../../server/scoring/build-response-matrix.js';
import { MISSING } from '../../server/scoring/response-matrix.js';

describe('buildResponseMatrix (long rows)', () => {
  it('matches its doc example: first-appearance order, unseen cells missing', () => {
    const m = buildResponseMatrix([
      { person: 'a', item: 'x', score: 1 },
      { person: 'b', item: 'y', score: 0 },
    ]);
    expect(m.personIds).toEqual(['a', 'b']);
    expect(m.itemIds).toEqual(['x', 'y']);
    expect(Array.from(m.scores)).toEqual([1, MISSING, MISSING, 0]);
  });

  it('names the row of a duplicate person-item pair and of its first occurrence', () => {
    const rows = [
      { person: 'a', item: 'x', score: 1 },
      { person: 'a', item: 'y', score: 0 },
      { person: 'a', item: 'x', score: 0 },
    ];
    expect(() => buildResponseMatrix(rows, { firstRowNumber: 2 })).toThrow(
      'row 4: person a, item x already answered in row 2',
    );
    try {
      buildResponseMatrix(rows);
    } catch (error) {
      expect(error).toBeInstanceOf(ResponseDataError);
      expect((error as ResponseDataError).row).toBe(3);
    }
  });

  it('rejects scores outside the allowed set, naming the row', () => {
    expect(() => buildResponseMatrix([{ person: 'a', item: 'x', score: 2 }])).toThrow(
      'row 1: score 2 for person a, item x is not one of 0, 1',
    );
    const m = buildResponseMatrix([{ person: 'a', item: 'x', score: 2 }], { allowedScores: [0, 1, 2] });
    expect(m.scores[0]).toBe(2);
    expect(() => buildResponseMatrix([{ person: '', item: 'x', score: 1 }])).toThrow(
      'row 1: empty person id',
    );
  });
});

describe('buildResponseMatrixFromWide', () => {
  it('matches its doc example and checks row lengths and repeated persons', () => {
    expect(
      Array.from(
        buildResponseMatrixFromWide(
          ['a', 'b'],
          ['x', 'y'],
          [
            [1, null],
            [0, 1],
          ],
        ).scores,
      ),
    ).toEqual([1, MISSING, 0, 1]);
    expect(() => buildResponseMatrixFromWide(['a', 'b'], ['x', 'y'], [[1, 0], [1]])).toThrow(
      'row 2: 1 scores for 2 items',
    );
    expect(() => buildResponseMatrixFromWide(['a', 'a'], ['x'], [[1], [0]])).toThrow(
      'row 2: person a already given in row 1',
    );
    expect(() => buildResponseMatrixFromWide(['a'], ['x'], [[7]], { firstRowNumber: 2 })).toThrow(
      'row 2: score 7 for person a, item x is not one of 0, 1',
    );
  });
});

describe('findEmptyPersonsAndItems and selectResponseMatrix', () => {
  it('lists persons and items with no responses', () => {
    expect(
      findEmptyPersonsAndItems({
        personIds: ['a', 'b'],
        itemIds: ['x', 'y'],
        scores: Uint8Array.of(1, 255, 255, 255),
      }),
    ).toEqual({ personsWithoutResponses: ['b'], itemsWithoutResponses: ['y'] });
  });

  it('selects rows and columns in the order given', () => {
    const m = { personIds: ['a', 'b'], itemIds: ['x', 'y'], scores: Uint8Array.of(1, 0, 0, 1) };
    const s = selectResponseMatrix(m, [1, 0], [1]);
    expect(s.personIds).toEqual(['b', 'a']);
    expect(s.itemIds).toEqual(['y']);
    expect(Array.from(s.scores)).toEqual([1, 0]);
  });
});
