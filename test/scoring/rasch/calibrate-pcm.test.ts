import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { calibrateCml } from '../../../server/scoring/rasch/calibrate-cml.js';
import { calibratePcm } from '../../../server/scoring/rasch/calibrate-pcm.js';
import { pcmCategoryProbabilities } from '../../../server/scoring/rasch/pcm-category-probabilities.js';
import type { ResponseMatrix } from '../../../server/scoring/response-matrix.js';
import { fixtureMatrix, loadFixture, maxAbsDifference } from './erm-fixtures.js';

/** A fixture from scripts/reference/lltm-pcm-erm.R (R 4.2.2, eRm 1.0-2). */
interface PcmFixture {
  readonly rows: string[];
  readonly erm: {
    betapar: number[];
    steps: number[][];
    location: number[];
    logLikelihood: number;
    npar: number;
  };
}

function load(name: string): { fixture: PcmFixture; matrix: ResponseMatrix } {
  const fixture = JSON.parse(
    readFileSync(new URL(`../../reference/pcm-${name}.json`, import.meta.url), 'utf8'),
  ) as PcmFixture;
  const nItems = fixture.rows[0]!.length;
  const matrix: ResponseMatrix = {
    personIds: fixture.rows.map((_, p) => `P${p + 1}`),
    itemIds: Array.from({ length: nItems }, (_, i) => `I${i + 1}`),
    scores: Uint8Array.from(fixture.rows.flatMap((row) => [...row].map(Number))),
  };
  return { fixture, matrix };
}

describe('pcmCategoryProbabilities', () => {
  it('reproduces the de Ayala (2009) worked example', () => {
    // de Ayala (2009), p. 204, via check-values §10 [V+C]: θ = 0, δ = (−1, 1)
    const p = pcmCategoryProbabilities(0, Float64Array.of(-1, 1));
    expect(p[0]).toBeCloseTo(0.2119416, 7);
    expect(p[1]).toBeCloseTo(0.5761169, 7);
    expect(p[2]).toBeCloseTo(0.2119416, 7);
  });

  it('reduces to the Rasch probability for one step and survives extreme abilities', () => {
    // check-values §3: θ − b = 1 gives 0.731059
    expect(pcmCategoryProbabilities(1, [0])[1]).toBeCloseTo(0.731059, 6);
    const extreme = pcmCategoryProbabilities(800, [-1, 1]);
    expect(extreme[2]).toBe(1);
    expect(() => pcmCategoryProbabilities(0, [])).toThrow('at least one step');
  });
});

describe('calibratePcm against eRm PCM', () => {
  for (const name of ['pcmdat', 'pcmdat2', 'simulated-mixed']) {
    it(`${name}: steps within 1e-3 of eRm thresholds() after one common shift, same log-likelihood`, () => {
      // eRm 1.0-2 PCM: betapar are cumulative easinesses under eRm's own sum-zero constraint;
      // thresholds() gives the steps δ_ih. Ours have mean item location 0, so the two differ by a
      // constant c (a shift of the ability origin); c is estimated as the mean difference.
      const { fixture, matrix } = load(name);
      const cal = calibratePcm(matrix);
      expect(cal.converged).toBe(true);
      expect(cal.items.length).toBe(fixture.erm.steps.length);
      const ours = cal.items.flatMap((item) => Array.from(item.steps));
      const theirs = fixture.erm.steps.flat();
      const shift = theirs.reduce((sum, v, k) => sum + v - ours[k]!, 0) / theirs.length;
      expect(
        maxAbsDifference(
          ours.map((v) => v + shift),
          theirs,
        ),
      ).toBeLessThan(1e-3);
      expect(Math.abs(cal.logLikelihood - fixture.erm.logLikelihood)).toBeLessThan(1e-3);
      // eRm's betapar are the cumulative easinesses −(δ_i1 + … + δ_ih) of the same steps
      const cumulative = fixture.erm.steps.flatMap((steps) =>
        steps.map((_, h) => -steps.slice(0, h + 1).reduce((a, b) => a + b, 0)),
      );
      expect(maxAbsDifference(cumulative, fixture.erm.betapar)).toBeLessThan(1e-9);
    });
  }

  it('holds the mean-location identification and gives the Rasch CML for right/wrong items', () => {
    // a dichotomous test is the PCM with m = 1: difficulties and SEs equal calibrateCml's
    const matrix = fixtureMatrix(loadFixture('raschdat1'));
    const pcm = calibratePcm(matrix);
    const rasch = calibrateCml(matrix);
    const steps = pcm.items.map((item) => item.steps[0]!);
    expect(maxAbsDifference(steps, rasch.difficulty)).toBeLessThan(1e-7);
    expect(
      maxAbsDifference(
        pcm.items.map((item) => item.stepStandardErrors[0]!),
        rasch.standardError,
      ),
    ).toBeLessThan(1e-6);
    expect(pcm.logLikelihood).toBeCloseTo(rasch.logLikelihood, 6);
    const { matrix: mixed } = load('simulated-mixed');
    const locations = calibratePcm(mixed).items.map((item) => item.location);
    expect(locations.reduce((a, b) => a + b, 0)).toBeCloseTo(0, 12);
  });

  it('calibrates booklets with missing rubric scores and excludes items with an unobserved category', () => {
    const { matrix } = load('simulated-mixed');
    const scores = Uint8Array.from(matrix.scores);
    for (let p = 0; p < 500; p += 2) scores[p * 11 + 10] = 255; // half the rubric scores of item 11 not yet given
    const cal = calibratePcm({ ...matrix, scores });
    expect(cal.converged).toBe(true);
    const full = calibratePcm(matrix);
    // the item keeps its steps within sampling error (half the data; invented, common practice)
    const gap = Math.abs(cal.items[10]!.location - full.items[10]!.location);
    expect(gap).toBeLessThan(3 * cal.items[10]!.locationStandardError);
    const noMiddle = Uint8Array.from(matrix.scores);
    for (let p = 0; p < 500; p++) if (noMiddle[p * 11 + 8] === 1) noMiddle[p * 11 + 8] = 2;
    const dropped = calibratePcm({ ...matrix, scores: noMiddle });
    expect(dropped.excludedItems).toEqual([{ id: 'I9', reason: 'unobserved-category' }]);
    expect(() => calibratePcm(matrix, { maxScores: new Array(11).fill(1) })).toThrow(
      /score 2 is above the maximum of item I(9|10|11)$/,
    );
  });
});
