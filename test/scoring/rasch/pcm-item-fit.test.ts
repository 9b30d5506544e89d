import { describe, expect, it } from 'vitest';
import { computeFitStatistics } from '../../../server/scoring/rasch/fit-statistics.js';
import { pcmItemFit } from '../../../server/scoring/rasch/pcm-item-fit.js';
import { MISSING } from '../../../server/scoring/response-matrix.js';

describe('pcmItemFit', () => {
  it('gives the hand-computed mean-squares of a 0-1-2 item (Masters 1982 probabilities)', () => {
    // θ = 0, steps (−1, 1): P = (0.2119416, 0.5761169, 0.2119416), E = 1, W = 0.4238832 (by hand).
    const fit = pcmItemFit(
      { personIds: ['a', 'b', 'c'], itemIds: ['x'], scores: Uint8Array.of(0, 2, 1) },
      [Float64Array.of(-1, 1)],
      new Float64Array(3),
    );
    // (x − E)² = 1, 1, 0: outfit = (1/W + 1/W + 0)/3, infit = 2/(3W).
    expect(fit.outfit[0]).toBeCloseTo(2 / 0.4238832 / 3, 6);
    expect(fit.infit[0]).toBeCloseTo(2 / (3 * 0.4238832), 6);
  });

  it('equals the Rasch mean-squares for right/wrong items, and skips missing cells and columns', () => {
    const scores = Uint8Array.of(1, 0, 1, 0, 1, MISSING, 1, 1, 0, 0, 0, 1);
    const matrix = { personIds: ['a', 'b', 'c', 'd'], itemIds: ['x', 'y', 'z'], scores };
    const b = Float64Array.of(-0.5, 0.2, 0.9);
    const theta = Float64Array.of(-1, 0.3, 1.2, Number.NaN);
    const rasch = computeFitStatistics(matrix, b, theta).items;
    const pcm = pcmItemFit(matrix, [[b[0]!], [b[1]!], undefined], theta);
    for (const i of [0, 1]) {
      expect(pcm.infit[i]).toBeCloseTo(rasch.infit[i]!, 12);
      expect(pcm.outfit[i]).toBeCloseTo(rasch.outfit[i]!, 12);
    }
    expect(Number.isNaN(pcm.infit[2]!)).toBe(true);
  });

  it('refuses a score above the item maximum', () => {
    expect(() =>
      pcmItemFit({ personIds: ['a'], itemIds: ['x'], scores: Uint8Array.of(2) }, [[0]], Float64Array.of(0)),
    ).toThrow('score 2 above the maximum');
  });
});
