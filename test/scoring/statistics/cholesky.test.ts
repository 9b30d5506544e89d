import { describe, expect, it } from 'vitest';
import {
  choleskyDecompose,
  choleskyInverse,
  choleskySolve,
} from '../../../server/scoring/statistics/cholesky.js';
import { findRootSafeguarded } from '../../../server/scoring/statistics/find-root-safeguarded.js';

describe('cholesky', () => {
  it('matches its doc example and inverts a symmetric positive-definite matrix', () => {
    // [[4, 2], [2, 5]] = L Lᵀ with L = [[2, 0], [1, 2]] (Golub & Van Loan 2013, §4.2; checked by hand)
    const l = choleskyDecompose(Float64Array.of(4, 2, 2, 5), 2)!;
    expect(Array.from(l)).toEqual([2, 0, 1, 2]);
    expect(Array.from(choleskySolve(l, 2, Float64Array.of(6, 7)))).toEqual([1, 1]);
    const inverse = choleskyInverse(l, 2); // (1/16)[[5, −2], [−2, 4]]
    [5 / 16, -2 / 16, -2 / 16, 4 / 16].forEach((v, k) => {
      expect(inverse[k]).toBeCloseTo(v, 15);
    });
  });

  it('returns null for a singular matrix', () => {
    expect(choleskyDecompose(Float64Array.of(1, 1, 1, 1), 2)).toBeNull();
  });
});

describe('findRootSafeguarded', () => {
  it('matches its doc example and reports forced non-convergence', () => {
    expect(findRootSafeguarded((x) => [x * x - 2, 2 * x], 0, 2, 1, 50, 1e-12).root).toBeCloseTo(
      Math.SQRT2,
      15,
    );
    const once = findRootSafeguarded((x) => [x * x - 2, 2 * x], 0, 2, 1, 1, 1e-12);
    expect(once.converged).toBe(false);
    expect(() => findRootSafeguarded((x) => [x * x + 1, 2 * x], 0, 2, 1, 50, 1e-12)).toThrow(
      'findRootSafeguarded requires a sign change',
    );
  });
});
