import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { calibratePcm } from '../../../server/scoring/rasch/calibrate-pcm.js';
import { estimateAbilityMle } from '../../../server/scoring/rasch/estimate-ability-mle.js';
import { estimateAbilityPcm } from '../../../server/scoring/rasch/estimate-ability-pcm.js';
import { estimateAbilityWle } from '../../../server/scoring/rasch/estimate-ability-wle.js';

const estimate = (result: ReturnType<typeof estimateAbilityPcm>) => {
  if (result.kind !== 'estimate') throw new Error(`expected an estimate, got ${result.kind}`);
  return result;
};

describe('estimateAbilityPcm', () => {
  it('matches its doc example: one symmetric 0-1-2 item scored 1', () => {
    // de Ayala (2009) example probabilities (check-values §10): Var(X | θ = 0) = 2 · 0.2119416
    const result = estimate(estimateAbilityPcm([Float64Array.of(-1, 1)], [1]));
    expect(result.estimate).toBeCloseTo(0, 10);
    expect(result.standardError).toBeCloseTo(1 / Math.sqrt(2 * 0.2119416), 6);
  });

  it('equals the Rasch WLE and MLE for right/wrong items (Fischer & Molenaar 1995, Table 4.1)', () => {
    // check-values §4: five items −1.5..1.5, score 0 gives WLE −2.9541; MLE at score 1 −1.7031
    const b = [-1.5, -0.75, 0, 0.75, 1.5];
    const items = b.map((v) => [v]);
    expect(estimate(estimateAbilityPcm(items, [0, 0, 0, 0, 0])).estimate).toBeCloseTo(-2.9541, 4);
    expect(estimate(estimateAbilityPcm(items, [1, 0, 0, 0, 0], { method: 'mle' })).estimate).toBeCloseTo(
      -1.7031,
      4,
    );
    for (let score = 0; score <= 5; score++) {
      const responses = b.map((_, i) => (i < score ? 1 : 0));
      const wle = estimateAbilityWle(Float64Array.from(b), score);
      expect(estimate(estimateAbilityPcm(items, responses)).estimate).toBeCloseTo(wle.estimate, 9);
      const mle = estimateAbilityMle(Float64Array.from(b), score);
      const ours = estimateAbilityPcm(items, responses, { method: 'mle' });
      expect(ours.kind).toBe(mle.kind);
      if (mle.kind === 'estimate' && ours.kind === 'estimate')
        expect(ours.estimate).toBeCloseTo(mle.estimate, 9);
    }
  });

  it('reproduces eRm person.parameter MLEs for a mixed test within 2e-3 (eRm 1.0-2)', () => {
    // scripts/reference/lltm-pcm-erm.R; eRm's thetas sit on eRm's item parameters, ours on our
    // calibration: after the common shift of the step scale (see calibrate-pcm.test.ts) they agree
    for (const name of ['pcmdat2', 'simulated-mixed']) {
      const fixture = JSON.parse(
        readFileSync(new URL(`../../reference/pcm-${name}.json`, import.meta.url), 'utf8'),
      );
      const rows: string[] = fixture.rows;
      const nItems = rows[0]!.length;
      const cal = calibratePcm({
        personIds: rows.map((_, p) => `P${p}`),
        itemIds: Array.from({ length: nItems }, (_, i) => `I${i + 1}`),
        scores: Uint8Array.from(rows.flatMap((row) => [...row].map(Number))),
      });
      const ours = cal.items.flatMap((item) => Array.from(item.steps));
      const theirs: number[] = fixture.erm.steps.flat();
      const shift = theirs.reduce((sum, v, k) => sum + v - ours[k]!, 0) / theirs.length;
      const steps = cal.items.map((item) => item.steps);
      fixture.persons.rawScore.forEach((score: number, k: number) => {
        // any response vector with this total: fill items from the first
        const responses = steps.map(() => 0);
        let left = score;
        steps.forEach((s, i) => {
          responses[i] = Math.min(left, s.length);
          left -= responses[i]!;
        });
        const theta = estimate(estimateAbilityPcm(steps, responses, { method: 'mle' })).estimate + shift;
        expect(Math.abs(theta - fixture.persons.theta[k])).toBeLessThan(2e-3);
      });
    }
  });

  it('gives finite WLEs at both extremes of a mixed test, and rejects bad scores', () => {
    const items = [[-0.5], [0.3], [-1, 0.5]];
    const low = estimate(estimateAbilityPcm(items, [0, 0, 0]));
    const high = estimate(estimateAbilityPcm(items, [1, 1, 2]));
    expect(low.estimate).toBeLessThan(-2);
    expect(high.estimate).toBeGreaterThan(2);
    expect(estimateAbilityPcm(items, [1, 1, 2], { method: 'mle' }).kind).toBe('all-correct');
    expect(() => estimateAbilityPcm(items, [0, 0, 3])).toThrow('between 0 and each item maximum');
    expect(() => estimateAbilityPcm([], [])).toThrow('at least one response');
  });
});
