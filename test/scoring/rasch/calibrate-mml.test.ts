import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { normalQuadrature } from '../../../server/scoring/quadrature/gauss-hermite.js';
import { calibrateMml } from '../../../server/scoring/rasch/calibrate-mml.js';
import { evaluateMmlMarginal } from '../../../server/scoring/rasch/mml-marginal.js';
import { collectMmlScoreGroups } from '../../../server/scoring/rasch/mml-score-groups.js';
import { MISSING, type ResponseMatrix } from '../../../server/scoring/response-matrix.js';
import {
  createRandom,
  normalSample,
  rotatedBookletDesign,
  simulateRasch,
  spacedDifficulties,
} from '../../helpers/random.js';

/**
 * LSAT-6 (Bock & Lieberman, 1970, Psychometrika 35, 179–197): 1000 examinees, 5 items,
 * frequencies of the 32 response patterns in binary order 00000 … 11111 (check-values.md 3a).
 */
const LSAT6_FREQUENCIES = [
  3, 6, 2, 11, 1, 1, 3, 4, 1, 8, 0, 16, 0, 3, 2, 15, 10, 29, 14, 81, 3, 28, 15, 80, 16, 56, 21, 173, 11, 61,
  28, 298,
];

function lsat6(): ResponseMatrix {
  const rows: number[] = [];
  LSAT6_FREQUENCIES.forEach((count, pattern) => {
    for (let c = 0; c < count; c++) for (let i = 0; i < 5; i++) rows.push((pattern >> (4 - i)) & 1);
  });
  return {
    personIds: Array.from({ length: 1000 }, (_, p) => `examinee${p + 1}`),
    itemIds: ['item1', 'item2', 'item3', 'item4', 'item5'],
    scores: Uint8Array.from(rows),
  };
}

/**
 * Marginal log-likelihood of LSAT-6 computed the slow, independent way: every pattern's
 * probability integrated by the trapezoid rule on a fine θ grid (no Gauss-Hermite, no score
 * collapsing), θ ~ N(0, sd).
 */
function lsat6LogLikelihoodByTrapezoid(difficulty: readonly number[], sd: number): number {
  const step = 0.01;
  let total = 0;
  LSAT6_FREQUENCIES.forEach((count, pattern) => {
    if (count === 0) return;
    let integral = 0;
    for (let t = -9 * sd; t <= 9 * sd + 1e-12; t += step) {
      let likelihood = Math.exp(-0.5 * (t / sd) ** 2) / (sd * Math.sqrt(2 * Math.PI));
      for (let i = 0; i < 5; i++) {
        const p = 1 / (1 + Math.exp(difficulty[i]! - t));
        likelihood *= (pattern >> (4 - i)) & 1 ? p : 1 - p;
      }
      integral += likelihood * step;
    }
    total += count * Math.log(integral);
  });
  return total;
}

describe('calibrateMml on LSAT-6', () => {
  it('reproduces the published Rasch estimates with θ ~ N(0, 1)', () => {
    const fit = calibrateMml(lsat6(), { fixedSd: 1 });
    // Rasch with discrimination fixed at 1 and θ ~ N(0,1); b printed to 2 d.p. in an R package
    // vignette, 4 d.p. independently reproduced (check-values.md section 3a). Tolerance 5e-4.
    const published = [-2.872, -1.063, -0.2576, -1.3881, -2.2188];
    published.forEach((b, i) => {
      expect(Math.abs(fit.difficulty[i]! - b)).toBeLessThan(5e-4);
    });
    // Same source: log L = −2473.054, tolerance 1e-3.
    expect(Math.abs(fit.logLikelihood - -2473.054)).toBeLessThan(1e-3);
    expect(fit.converged).toBe(true);
    expect(fit.method).toBe('mml');
    expect(fit.groups[0]).toMatchObject({ mean: 0, sd: 1, meanStandardError: 0, sdStandardError: 0 });
    expect(fit.groups[0]!.persons).toBe(1000);
  });

  it('reproduces Rizopoulos (2006) with a free SD, converted to unit discrimination', () => {
    const fit = calibrateMml(lsat6());
    // Rizopoulos (2006), J. Stat. Softw. 17(5): Rasch with a common free discrimination,
    // θ ~ N(0,1): a = 0.7551, b = −3.6153, −1.3224, −0.3176, −1.7301, −2.7802, log L = −2466.938.
    // With a = 1 and θ ~ N(0, sd) the same model has sd = a and b_rasch = a·b.
    const a = 0.7551;
    const published = [-3.6153, -1.3224, -0.3176, -1.7301, -2.7802];
    published.forEach((b, i) => {
      expect(Math.abs(fit.difficulty[i]! - a * b)).toBeLessThan(5e-4);
    });
    expect(Math.abs(fit.groups[0]!.sd - a)).toBeLessThan(5e-4);
    expect(Math.abs(fit.logLikelihood - -2466.938)).toBeLessThan(1e-3);
    expect(fit.converged).toBe(true);
  });

  it('reports the marginal log-likelihood and SEs that an independent integration gives', () => {
    const fit = calibrateMml(lsat6(), { fixedSd: 1 });
    const b = Array.from(fit.difficulty);
    // The log-likelihood at the solution, recomputed pattern by pattern on a fine grid.
    expect(Math.abs(fit.logLikelihood - lsat6LogLikelihoodByTrapezoid(b, 1))).toBeLessThan(1e-6);
    // Observed information by central second differences of that independent log-likelihood
    // (common practice, no source); SE = √diag(I⁻¹). Only the diagonal of I⁻¹ is needed, so
    // invert the 5×5 matrix by Gauss-Jordan here.
    const h = 1e-3;
    const f = (shift: number[]) =>
      lsat6LogLikelihoodByTrapezoid(
        b.map((v, i) => v + shift[i]!),
        1,
      );
    const info: number[][] = [];
    for (let i = 0; i < 5; i++) info.push([]);
    for (let i = 0; i < 5; i++) {
      for (let j = i; j < 5; j++) {
        const e = (a: number, c: number) =>
          Array.from({ length: 5 }, (_, k) => (k === i ? a : 0) + (k === j ? c : 0));
        const second = (f(e(h, h)) - f(e(h, -h)) - f(e(-h, h)) + f(e(-h, -h))) / (4 * h * h);
        info[i]![j] = -second;
        info[j]![i] = -second;
      }
    }
    const inverse = invert(info);
    for (let i = 0; i < 5; i++) {
      expect(Math.abs(fit.standardError[i]! - Math.sqrt(inverse[i]![i]!))).toBeLessThan(2e-5);
    }
  }, 30_000);
});

describe('calibrateMml against lme4::glmer', () => {
  // Fixture from scripts/reference/rasch-lme4.R: R 4.2.2 with Debian's r-cran-lme4 1.1-31,
  // glmer(score ~ 0 + item + (1 | person), family = binomial, nAGQ = 20), bobyqa.
  const fixture = JSON.parse(
    readFileSync(new URL('../../reference/lme4-rasch-complete.json', import.meta.url), 'utf8'),
  ) as {
    itemIds: string[];
    responses: string[];
    difficulty: number[];
    personSd: number;
    lme4Version: string;
  };

  it('matches glmer item difficulties and the person SD within 2e-3', () => {
    const matrix: ResponseMatrix = {
      personIds: fixture.responses.map((_, p) => `p${p + 1}`),
      itemIds: fixture.itemIds,
      scores: Uint8Array.from(fixture.responses.join(''), (c) => Number(c)),
    };
    const fit = calibrateMml(matrix);
    // Tolerance 2e-3: both sides maximise the same marginal likelihood, but glmer integrates with
    // 20-point adaptive quadrature per person (Laplace-centred) and we with 41 fixed
    // Gauss-Hermite nodes, and glmer's derivative-free optimiser stops on its own criteria
    // (with its default Nelder_Mead second stage the item effects land about 1.5e-3 short).
    // Measured agreement with the bobyqa fixture is below 1e-6.
    fixture.difficulty.forEach((b, i) => {
      expect(Math.abs(fit.difficulty[i]! - b)).toBeLessThan(2e-3);
    });
    expect(Math.abs(fit.groups[0]!.sd - fixture.personSd)).toBeLessThan(2e-3);
  });
});

describe('calibrateMml parameter recovery', () => {
  it('recovers difficulties, group means and SDs within 3 estimated SEs from rotated booklets', () => {
    // Invented truth; the bound is 3 of the calibration's own standard errors. With 19 estimates
    // each inside 3 SEs with probability 0.997, a correct implementation passes for about 95% of
    // seeds (a Monte Carlo of 150 replications gave z-score SDs of 0.93–1.11); seed 2 is one.
    const random = createRandom(2);
    const difficulty = spacedDifficulties(16, -1.6, 1.9);
    const groupA = normalSample(random, 1500, 0, 1);
    const groupB = normalSample(random, 1500, 0.6, 1.3);
    const abilities = new Float64Array(3000);
    abilities.set(groupA);
    abilities.set(groupB, 1500);
    const presented = rotatedBookletDesign(3000, 16, 4, 8);
    const matrix = simulateRasch({ difficulty, abilities, random, presented });
    const index = new Int32Array(3000);
    index.fill(1, 1500);
    const fit = calibrateMml(matrix, { groups: { index, labels: ['north', 'south'] } });
    expect(fit.converged).toBe(true);
    for (let i = 0; i < 16; i++) {
      const se = fit.standardError[i]!;
      expect(se).toBeGreaterThan(0.03);
      expect(se).toBeLessThan(0.12);
      expect(Math.abs(fit.difficulty[i]! - difficulty[i]!)).toBeLessThan(3 * se);
    }
    const [north, south] = fit.groups;
    expect(north).toMatchObject({ label: 'north', mean: 0, meanStandardError: 0, persons: 1500 });
    expect(Math.abs(north!.sd - 1)).toBeLessThan(3 * north!.sdStandardError);
    expect(south!.label).toBe('south');
    expect(Math.abs(south!.mean - 0.6)).toBeLessThan(3 * south!.meanStandardError);
    expect(Math.abs(south!.sd - 1.3)).toBeLessThan(3 * south!.sdStandardError);
    // The group difference is a real finding here, not noise.
    expect(south!.mean / south!.meanStandardError).toBeGreaterThan(5);
  });

  it('frees every group mean when items are anchored, and keeps the anchors', () => {
    const random = createRandom(99);
    const difficulty = spacedDifficulties(12, -1.5, 1.5);
    const abilities = normalSample(random, 2500, -0.4, 1.1);
    const matrix = simulateRasch({ difficulty, abilities, random });
    const anchors = new Map([
      ['i1', difficulty[0]!],
      ['i6', difficulty[5]!],
      ['i12', difficulty[11]!],
    ]);
    const fit = calibrateMml(matrix, { anchors });
    expect(fit.difficulty[0]).toBe(difficulty[0]);
    expect(fit.standardError[0]).toBe(0);
    expect(fit.standardError[5]).toBe(0);
    const group = fit.groups[0]!;
    expect(group.meanStandardError).toBeGreaterThan(0);
    expect(Math.abs(group.mean - -0.4)).toBeLessThan(3 * group.meanStandardError);
    expect(Math.abs(group.sd - 1.1)).toBeLessThan(3 * group.sdStandardError);
    for (let i = 0; i < 12; i++) {
      if (fit.standardError[i] === 0) continue;
      expect(Math.abs(fit.difficulty[i]! - difficulty[i]!)).toBeLessThan(3 * fit.standardError[i]!);
    }
  });
});

describe('calibrateMml data handling', () => {
  it('skips missing answers: the marginal likelihood integrates only the answered items', () => {
    const random = createRandom(5);
    const difficulty = spacedDifficulties(6, -1, 1);
    const matrix = simulateRasch({ difficulty, abilities: normalSample(random, 400, 0.2, 1.2), random });
    const withMissing = Uint8Array.from(matrix.scores);
    for (let p = 0; p < 400; p += 2) for (let i = 3; i < 6; i++) withMissing[p * 6 + i] = MISSING;
    for (let p = 1; p < 400; p += 4) withMissing[p * 6] = MISSING;
    const fit = calibrateMml({ ...matrix, scores: withMissing });
    const full = calibrateMml(matrix);
    expect(fit.converged).toBe(true);
    expect(fit.excludedPersons).toEqual([]);
    // Independent check: person by person, ∫ Π_{answered} P^x Q^(1−x) φ(θ; 0, sd) dθ by the
    // trapezoid rule on a fine grid, MISSING cells left out of the product.
    const sd = fit.groups[0]!.sd;
    let independent = 0;
    for (let p = 0; p < 400; p++) {
      let integral = 0;
      for (let t = -9 * sd; t <= 9 * sd + 1e-12; t += 0.01) {
        let likelihood = Math.exp(-0.5 * (t / sd) ** 2) / (sd * Math.sqrt(2 * Math.PI));
        for (let i = 0; i < 6; i++) {
          const x = withMissing[p * 6 + i]!;
          if (x === MISSING) continue;
          const prob = 1 / (1 + Math.exp(fit.difficulty[i]! - t));
          likelihood *= x === 1 ? prob : 1 - prob;
        }
        integral += likelihood * 0.01;
      }
      independent += Math.log(integral);
    }
    expect(Math.abs(fit.logLikelihood - independent)).toBeLessThan(1e-6);
    // Less data on items 4–6: their SEs grow by about √2 against the complete fit.
    expect(fit.standardError[4]! / full.standardError[4]!).toBeGreaterThan(1.25);
    expect(fit.standardError[4]! / full.standardError[4]!).toBeLessThan(1.6);
  });

  it('reports persons and items without information instead of dropping them silently', () => {
    const scores = Uint8Array.from([
      1,
      0,
      1,
      MISSING, // p1
      MISSING,
      MISSING,
      MISSING,
      MISSING, // p2: nothing answered
      0,
      0,
      1,
      MISSING, // p3
      1,
      1,
      1,
      MISSING, // p4
      0,
      1,
      1,
      MISSING, // p5
    ]);
    const fit = calibrateMml(
      {
        personIds: ['p1', 'p2', 'p3', 'p4', 'p5'],
        itemIds: ['a', 'b', 'c', 'd'],
        scores,
      },
      { fixedSd: 1 },
    );
    expect(fit.excludedItems).toEqual([
      { id: 'c', reason: 'all-correct' },
      { id: 'd', reason: 'no-responses' },
    ]);
    expect(fit.excludedPersons).toEqual([{ id: 'p2', reason: 'no-responses' }]);
    expect(fit.itemIds).toEqual(['a', 'b']);
    expect(fit.groups[0]!.persons).toBe(4);
  });

  it('rejects bad input with a terse message', () => {
    const matrix: ResponseMatrix = { personIds: ['p'], itemIds: ['a'], scores: Uint8Array.of(2) };
    expect(() => calibrateMml(matrix)).toThrow('calibrateMml requires dichotomous scores');
    const ok: ResponseMatrix = { personIds: ['p', 'q'], itemIds: ['a'], scores: Uint8Array.of(0, 1) };
    expect(() => calibrateMml(ok, { fixedSd: 0 })).toThrow('calibrateMml requires a positive fixedSd');
    expect(() => calibrateMml(ok, { groups: { index: Int32Array.of(0, 2), labels: ['x', 'y'] } })).toThrow(
      'calibrateMml group index out of range',
    );
    expect(() => calibrateMml(ok, { groups: { index: Int32Array.of(0, 0), labels: ['x', 'y'] } })).toThrow(
      'calibrateMml group y has no responses',
    );
  });

  it('stops at maxIterations and says it did not converge', () => {
    const fit = calibrateMml(lsat6(), { maxIterations: 2 });
    expect(fit.iterations).toBe(2);
    expect(fit.converged).toBe(false);
    expect(Number.isFinite(fit.logLikelihood)).toBe(true);
  });
});

describe('MML helpers', () => {
  it('collects persons into (group, item set, raw score) cells', () => {
    const cells = collectMmlScoreGroups(
      { personIds: ['p', 'q', 'r'], itemIds: ['a', 'b'], scores: Uint8Array.of(1, 0, 1, 1, 0, 0) },
      new Int32Array(3),
      1,
      new Set(),
    );
    expect(cells.units).toHaveLength(1);
    expect(Array.from(cells.units[0]!.counts)).toEqual([1, 1, 1]);
    // Same items, different groups or different item sets: separate cells.
    const split = collectMmlScoreGroups(
      {
        personIds: ['p', 'q', 'r', 's'],
        itemIds: ['a', 'b'],
        scores: Uint8Array.of(1, 0, 1, 0, 0, MISSING, 1, 1),
      },
      Int32Array.of(0, 1, 0, 0),
      2,
      new Set(),
    );
    expect(split.units.map((u) => [u.group, Array.from(u.items), Array.from(u.counts)])).toEqual([
      [0, [0, 1], [0, 1, 1]],
      [1, [0, 1], [0, 1, 0]],
      [0, [0], [1, 0]],
    ]);
    expect(Array.from(split.itemCorrect)).toEqual([3, 1]);
  });

  it('gives log 1/2 for one right answer to an item at the prior mean', () => {
    // Symmetry of the logistic around θ = b under a symmetric prior (common practice, no source).
    const cells = collectMmlScoreGroups(
      { personIds: ['p'], itemIds: ['a'], scores: Uint8Array.of(1) },
      new Int32Array(1),
      1,
      new Set(['a']),
    );
    const { nodes, weights } = normalQuadrature(41);
    const value = evaluateMmlMarginal(
      cells,
      { difficulty: Float64Array.of(0), mean: Float64Array.of(0), sd: Float64Array.of(1) },
      nodes,
      weights.map(Math.log),
      { hessian: false, em: false },
    ).logLikelihood;
    expect(value).toBeCloseTo(Math.log(0.5), 14);
  });

  it('has a gradient and Hessian equal to finite differences of the log-likelihood', () => {
    // Central differences (common practice, no source) on an incomplete two-group design.
    const random = createRandom(11);
    const matrix = simulateRasch({
      difficulty: spacedDifficulties(12, -2, 2),
      abilities: normalSample(random, 600, 0.2, 1.2),
      random,
      presented: rotatedBookletDesign(600, 12, 3, 8),
    });
    const group = Int32Array.from({ length: 600 }, (_, p) => p % 2);
    const cells = collectMmlScoreGroups(matrix, group, 2, new Set());
    const { nodes, weights } = normalQuadrature(21);
    const logWeight = weights.map(Math.log);
    const parameters = {
      difficulty: spacedDifficulties(12, -1.5, 1.8),
      mean: Float64Array.of(0.1, -0.2),
      sd: Float64Array.of(1.1, 0.8),
    };
    const at = () => evaluateMmlMarginal(cells, parameters, nodes, logWeight, { hessian: true, em: false });
    const exact = at();
    const dim = 16;
    const h = 1e-5;
    for (let d = 0; d < dim; d++) {
      const target = d < 12 ? parameters.difficulty : (d - 12) % 2 === 0 ? parameters.mean : parameters.sd;
      const k = d < 12 ? d : (d - 12) >> 1;
      const old = target[k]!;
      target[k] = old + h;
      const plus = at();
      target[k] = old - h;
      const minus = at();
      target[k] = old;
      expect(
        Math.abs((plus.logLikelihood - minus.logLikelihood) / (2 * h) - exact.gradient[d]!),
      ).toBeLessThan(1e-5);
      for (let c = 0; c < dim; c++) {
        const numeric = (plus.gradient[c]! - minus.gradient[c]!) / (2 * h);
        expect(Math.abs(numeric - exact.hessian![d * dim + c]!)).toBeLessThan(1e-5);
      }
    }
  });
});

function invert(matrix: number[][]): number[][] {
  const n = matrix.length;
  const a = matrix.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let pivot = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(a[r]![c]!) > Math.abs(a[pivot]![c]!)) pivot = r;
    [a[c], a[pivot]] = [a[pivot]!, a[c]!];
    const d = a[c]![c]!;
    for (let k = 0; k < 2 * n; k++) a[c]![k]! /= d;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const m = a[r]![c]!;
      for (let k = 0; k < 2 * n; k++) a[r]![k]! -= m * a[c]![k]!;
    }
  }
  return a.map((row) => row.slice(n));
}
