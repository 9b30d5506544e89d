import { describe, expect, it } from 'vitest';
import { selectResponseMatrix } from '../../../server/scoring/build-response-matrix.js';
import { calibrateCml } from '../../../server/scoring/rasch/calibrate-cml.js';
import { MISSING, type ResponseMatrix } from '../../../server/scoring/response-matrix.js';
import { fixtureMatrix, fixtureNames, loadFixture, maxAbsDifference } from './erm-fixtures.js';

/** LSAT-6 (Bock & Lieberman 1970), pattern frequencies in binary order 00000..11111 (check-values 3a). */
function lsat6(): ResponseMatrix {
  const counts = [
    3, 6, 2, 11, 1, 1, 3, 4, 1, 8, 0, 16, 0, 3, 2, 15, 10, 29, 14, 81, 3, 28, 15, 80, 16, 56, 21, 173, 11, 61,
    28, 298,
  ];
  const scores: number[] = [];
  counts.forEach((count, pattern) => {
    for (let k = 0; k < count; k++) for (let i = 4; i >= 0; i--) scores.push((pattern >> i) & 1);
  });
  return {
    personIds: Array.from({ length: 1000 }, (_, p) => `p${p}`),
    itemIds: ['i1', 'i2', 'i3', 'i4', 'i5'],
    scores: Uint8Array.from(scores),
  };
}

describe('calibrateCml against eRm and a fully converged psychotools reference', () => {
  for (const name of fixtureNames) {
    const fixture = loadFixture(name);
    const cal = calibrateCml(fixtureMatrix(fixture));

    it(`${name}: difficulties within 1e-4 of psychotools raschmodel (reltol 1e-16)`, () => {
      // psychotools 0.7-2 raschmodel, centred; its max |gradient| is stored in the fixture
      expect(fixture.converged.maxAbsGradient).toBeLessThan(1e-5);
      expect(cal.converged).toBe(true);
      expect(cal.itemIds).toEqual(fixture.itemIds);
      expect(maxAbsDifference(cal.difficulty, fixture.converged.difficulty)).toBeLessThan(1e-4);
      expect(cal.logLikelihood).toBeCloseTo(fixture.converged.logLikelihood, 5);
    });

    it(`${name}: difficulties within 5e-4 and SE within 1e-3 of eRm RM`, () => {
      // eRm 1.0-2 RM reports easiness with sum zero; the fixture stores −betapar
      expect(maxAbsDifference(cal.difficulty, fixture.erm.difficulty)).toBeLessThan(5e-4);
      expect(maxAbsDifference(cal.standardError, fixture.erm.standardError)).toBeLessThan(1e-3);
      expect(maxAbsDifference(cal.standardError, fixture.converged.standardError)).toBeLessThan(1e-4);
    });
  }
});

describe('calibrateCml', () => {
  it('matches its doc example: two items give ∓ ln(3)/2 from 3 vs 1 discordant answers', () => {
    // For two items the conditional estimate is the log-odds of the discordant pairs
    // (Rasch 1960, ch. 5; common practice, no source for the number itself)
    const cal = calibrateCml({
      personIds: ['a', 'b', 'c', 'd'],
      itemIds: ['x', 'y'],
      scores: Uint8Array.of(1, 0, 1, 0, 1, 0, 0, 1),
    });
    expect(cal.difficulty[0]).toBeCloseTo(-Math.log(3) / 2, 10);
    expect(cal.difficulty[1]).toBeCloseTo(Math.log(3) / 2, 10);
    // SE: information of b_x − b_y is n π(1 − π) = 4 · 0.75 · 0.25; each b_i is half the difference
    expect(cal.standardError[0]).toBeCloseTo(0.5 / Math.sqrt(0.75), 9);
  });

  it('reproduces the LSAT-6 CML regression values (check-values 3a, derived)', () => {
    const cal = calibrateCml(lsat6());
    [-1.2561, 0.4749, 1.236, 0.1684, -0.6232].forEach((b, i) => {
      expect(cal.difficulty[i]).toBeCloseTo(b, 4);
    });
  });

  it('holds the mean-zero identification and is unchanged by reordering persons', () => {
    const matrix = fixtureMatrix(loadFixture('simulated-booklets'));
    const cal = calibrateCml(matrix);
    expect(cal.difficulty.reduce((a, b) => a + b, 0)).toBeCloseTo(0, 12);
    const reversed = selectResponseMatrix(
      matrix,
      matrix.personIds.map((_, p) => matrix.personIds.length - 1 - p),
    );
    expect(maxAbsDifference(calibrateCml(reversed).difficulty, cal.difficulty)).toBeLessThan(1e-10);
  });

  it('keeps anchored items at their values and shifts the rest by the same constant', () => {
    // CML identifies only differences (Andersen 1973), so one anchor only moves the origin
    const matrix = fixtureMatrix(loadFixture('raschdat1'));
    const free = calibrateCml(matrix);
    const one = calibrateCml(matrix, { anchors: new Map([['I05', 0.8]]) });
    expect(one.difficulty[4]).toBe(0.8);
    expect(one.standardError[4]).toBe(0);
    const shift = 0.8 - free.difficulty[4]!;
    expect(
      maxAbsDifference(
        one.difficulty.map((b) => b - shift),
        free.difficulty,
      ),
    ).toBeLessThan(1e-8);
    // two anchors pin the scale: the others move, the anchors do not
    const two = calibrateCml(matrix, {
      anchors: new Map([
        ['I01', -1],
        ['I30', 1],
      ]),
    });
    expect([two.difficulty[0], two.difficulty[29]]).toEqual([-1, 1]);
    expect(two.converged).toBe(true);
    expect(() => calibrateCml(matrix, { anchors: new Map([['nope', 0]]) })).toThrow(
      /anchor nope is not an item/,
    );
  });

  it('excludes and reports extreme persons, empty persons and constant items', () => {
    const X = MISSING;
    const matrix: ResponseMatrix = {
      personIds: ['all-right', 'all-wrong', 'empty', 'p1', 'p2', 'p3', 'p4'],
      itemIds: ['easy', 'a', 'b', 'c', 'unseen'],
      scores: Uint8Array.of(
        ...[1, 1, 1, 1, X],
        ...[0, 0, 0, 0, X],
        ...[X, X, X, X, X],
        ...[1, 1, 0, 0, X],
        ...[1, 0, 1, 0, X],
        ...[1, 0, 0, 1, X],
        ...[1, 1, 1, 0, X],
      ),
    };
    const cal = calibrateCml(matrix);
    expect(cal.itemIds).toEqual(['a', 'b', 'c']);
    expect(cal.excludedItems).toEqual([
      { id: 'easy', reason: 'all-correct' },
      { id: 'unseen', reason: 'no-responses' },
    ]);
    expect(cal.excludedPersons).toEqual([
      { id: 'all-right', reason: 'all-correct' },
      { id: 'all-wrong', reason: 'all-wrong' },
      { id: 'empty', reason: 'no-responses' },
    ]);
    expect(cal.difficulty.every(Number.isFinite)).toBe(true);
  });

  it('reports forced non-convergence with maxIterations 1', () => {
    const cal = calibrateCml(fixtureMatrix(loadFixture('raschdat1')), { maxIterations: 1 });
    expect(cal.converged).toBe(false);
    expect(cal.iterations).toBe(1);
    expect(cal.difficulty.every(Number.isFinite)).toBe(true);
  });

  it('refuses a design whose booklets share no item', () => {
    const X = MISSING;
    const matrix: ResponseMatrix = {
      personIds: ['p1', 'p2', 'p3', 'p4'],
      itemIds: ['a', 'b', 'c', 'd'],
      scores: Uint8Array.of(1, 0, X, X, 0, 1, X, X, X, X, 1, 0, X, X, 0, 1),
    };
    expect(() => calibrateCml(matrix)).toThrow(
      'calibrateCml requires a connected design (information is singular)',
    );
  });
});
