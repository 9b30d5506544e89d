import { describe, expect, it } from 'vitest';
import { estimateAbilityMle } from '../../../server/scoring/rasch/estimate-ability-mle.js';
import { estimateAbilityWle } from '../../../server/scoring/rasch/estimate-ability-wle.js';

// Fischer, G. H., & Molenaar, I. W. (1995), Rasch Models, Table 4.1 p. 59: five items,
// b = −1.5, −0.75, 0, 0.75, 1.5; printed to 2 d.p., checked here at 0.005.
const fischerMolenaar = Float64Array.of(-1.5, -0.75, 0, 0.75, 1.5);
const publishedMle = [null, -1.7, -0.51, 0.51, 1.7, null] as const;
const publishedWle = [-2.95, -1.45, -0.46, 0.46, 1.45, 2.95] as const;

describe('estimateAbilityMle', () => {
  it.each([1, 2, 3, 4])('reproduces Fischer & Molenaar (1995) Table 4.1 for raw score %i', (score) => {
    const result = estimateAbilityMle(fischerMolenaar, score);
    expect(result.kind).toBe('estimate');
    if (result.kind !== 'estimate') return;
    expect(Math.abs(result.estimate - publishedMle[score]!)).toBeLessThan(0.005);
    expect(result.converged).toBe(true);
  });

  it('matches the 4-d.p. values from check-values section 4 (derived) and its doc example', () => {
    const one = estimateAbilityMle(fischerMolenaar, 1);
    const two = estimateAbilityMle(fischerMolenaar, [0, 1, 0, 0, 1]);
    expect(one.kind === 'estimate' && one.estimate).toBeCloseTo(-1.7031, 4);
    expect(two.kind === 'estimate' && two.estimate).toBeCloseTo(-0.5133, 4);
  });

  it('names the non-estimable extreme scores', () => {
    expect(estimateAbilityMle(fischerMolenaar, 0)).toEqual({ kind: 'all-wrong' });
    expect(estimateAbilityMle(fischerMolenaar, [1, 1, 1, 1, 1])).toEqual({ kind: 'all-correct' });
  });

  it('solves the likelihood equation r = Σ P_i(θ) with SE 1/√I', () => {
    const b = Float64Array.of(-0.3, 0.8, 2.2, -1.9, 0.1, 0.4, 1.1);
    const result = estimateAbilityMle(b, 4);
    if (result.kind !== 'estimate') throw new Error('expected an estimate');
    let expected = 0;
    let information = 0;
    for (const d of b) {
      const p = 1 / (1 + Math.exp(d - result.estimate));
      expected += p;
      information += p * (1 - p);
    }
    expect(expected).toBeCloseTo(4, 9);
    expect(result.standardError).toBeCloseTo(1 / Math.sqrt(information), 12);
  });

  it('reports forced non-convergence with maxIterations 1', () => {
    const result = estimateAbilityMle(fischerMolenaar, 1, { maxIterations: 1 });
    expect(result.kind === 'estimate' && result.converged).toBe(false);
    expect(result.kind === 'estimate' && result.iterations).toBe(1);
  });

  it('rejects programmer errors tersely', () => {
    expect(() => estimateAbilityMle(new Float64Array(0), 0)).toThrow(
      'estimateAbilityMle requires at least one response',
    );
    expect(() => estimateAbilityMle(fischerMolenaar, 6)).toThrow(/raw score between 0/);
    expect(() => estimateAbilityMle(fischerMolenaar, [1, 0])).toThrow(/one response per difficulty/);
    expect(() => estimateAbilityMle(fischerMolenaar, [1, 0, 2, 0, 0])).toThrow(/responses of 0 or 1/);
  });
});

describe('estimateAbilityWle', () => {
  it.each([0, 1, 2, 3, 4, 5])('reproduces Fischer & Molenaar (1995) Table 4.1 for raw score %i', (score) => {
    const result = estimateAbilityWle(fischerMolenaar, score);
    expect(Math.abs(result.estimate - publishedWle[score]!)).toBeLessThan(0.005);
    expect(result.converged).toBe(true);
  });

  it('matches the 4-d.p. values in check-values section 4 (derived) and its doc example', () => {
    expect(estimateAbilityWle(fischerMolenaar, 0).estimate).toBeCloseTo(-2.9541, 4);
    expect(estimateAbilityWle(fischerMolenaar, 4).estimate).toBeCloseTo(1.4515, 4);
    expect(estimateAbilityWle(fischerMolenaar, [1, 1, 0, 1, 0]).estimate).toBeCloseTo(0.4574, 4);
  });

  it('is finite for extremes, moves from the MLE by J/(2I), and has SE 1/√I(θ̂)', () => {
    const b = Float64Array.of(-1, -0.2, 0.5, 1.3, 2.4, -2.2);
    let previous = Number.NEGATIVE_INFINITY;
    for (let r = 0; r <= b.length; r++) {
      const wle = estimateAbilityWle(b, r);
      expect(Number.isFinite(wle.estimate)).toBe(true);
      expect(wle.estimate).toBeGreaterThan(previous); // rises with the raw score
      previous = wle.estimate;
      const mle = estimateAbilityMle(b, r);
      if (mle.kind === 'estimate') {
        // Warm (1989), eq. 11: the WLE moves from the MLE in the direction of J(θ̂_MLE) / (2 I)
        let skew = 0;
        for (const d of b) {
          const p = 1 / (1 + Math.exp(d - mle.estimate));
          skew += p * (1 - p) * (1 - 2 * p);
        }
        expect(Math.sign(wle.estimate - mle.estimate)).toBe(Math.sign(skew));
      }
      let information = 0;
      for (const d of b) {
        const p = 1 / (1 + Math.exp(d - wle.estimate));
        information += p * (1 - p);
      }
      expect(wle.standardError).toBeCloseTo(1 / Math.sqrt(information), 12);
    }
  });

  it('reports forced non-convergence with maxIterations 1', () => {
    const result = estimateAbilityWle(fischerMolenaar, 2, { maxIterations: 1 });
    expect(result.converged).toBe(false);
    expect(result.iterations).toBe(1);
  });

  it('rejects an empty item set', () => {
    expect(() => estimateAbilityWle(new Float64Array(0), 0)).toThrow(
      'estimateAbilityWle requires at least one response',
    );
  });
});
