import { describe, expect, it } from 'vitest';
import { estimateAbilityEap } from '../../../server/scoring/rasch/estimate-ability-eap.js';
import { MISSING } from '../../../server/scoring/response-matrix.js';

/**
 * Independent check: posterior mean and SD by the trapezoid rule on a fine θ grid
 * (step 0.001 over the prior mean ± 25 logits), the likelihood multiplied out item by item.
 */
function posteriorByTrapezoid(
  difficulty: Float64Array,
  scores: Uint8Array,
  mean: number,
  sd: number,
): { mean: number; sd: number } {
  let z0 = 0;
  let z1 = 0;
  let z2 = 0;
  for (let t = mean - 25; t <= mean + 25; t += 0.001) {
    let logDensity = -0.5 * ((t - mean) / sd) ** 2;
    for (let i = 0; i < difficulty.length; i++) {
      const x = scores[i]!;
      if (x === MISSING) continue;
      const p = 1 / (1 + Math.exp(difficulty[i]! - t));
      logDensity += Math.log(x === 1 ? p : 1 - p);
    }
    const w = Math.exp(logDensity);
    z0 += w;
    z1 += w * t;
    z2 += w * t * t;
  }
  const m = z1 / z0;
  return { mean: m, sd: Math.sqrt(z2 / z0 - m * m) };
}

// Fischer & Molenaar (1995), Table 4.1: five items at b = −1.5, −0.75, 0, 0.75, 1.5.
const FIVE = Float64Array.of(-1.5, -0.75, 0, 0.75, 1.5);

function firstCorrect(length: number, correct: number): Uint8Array {
  const scores = new Uint8Array(length);
  scores.fill(1, 0, correct);
  return scores;
}

describe('estimateAbilityEap', () => {
  it('matches a fine trapezoid integration of the posterior for every raw score', () => {
    for (let r = 0; r <= 5; r++) {
      const scores = firstCorrect(5, r);
      const eap = estimateAbilityEap(FIVE, scores);
      const check = posteriorByTrapezoid(FIVE, scores, 0, 1);
      expect(Math.abs(eap.ability - check.mean)).toBeLessThan(1e-9);
      expect(Math.abs(eap.standardError - check.sd)).toBeLessThan(1e-9);
      expect(eap.rawScore).toBe(r);
      expect(eap.converged).toBe(true);
    }
  });

  it('is antisymmetric in the raw score for symmetric items and a centred prior', () => {
    // Symmetry of the Rasch likelihood under θ → −θ, b → −b, x → 1 − x (common practice, no source).
    for (let r = 0; r <= 5; r++) {
      const low = estimateAbilityEap(FIVE, firstCorrect(5, r));
      const high = estimateAbilityEap(FIVE, firstCorrect(5, 5 - r));
      expect(low.ability).toBeCloseTo(-high.ability, 12);
      expect(low.standardError).toBeCloseTo(high.standardError, 12);
    }
    // The @example value: raw score 5 on the five items.
    expect(estimateAbilityEap(FIVE, firstCorrect(5, 5)).ability).toBeCloseTo(1.3397039204, 9);
  });

  it('depends on the answered items only through the raw score (sufficiency)', () => {
    const a = estimateAbilityEap(FIVE, Uint8Array.of(1, 1, 0, 0, 0));
    const b = estimateAbilityEap(FIVE, Uint8Array.of(0, 0, 0, 1, 1));
    expect(a.ability).toBeCloseTo(b.ability, 13);
  });

  it('shrinks towards the prior and is more central than the score suggests', () => {
    const all = estimateAbilityEap(FIVE, firstCorrect(5, 5), { mean: 0.5, sd: 0.8 });
    const check = posteriorByTrapezoid(FIVE, firstCorrect(5, 5), 0.5, 0.8);
    expect(Math.abs(all.ability - check.mean)).toBeLessThan(1e-9);
    expect(Math.abs(all.standardError - check.sd)).toBeLessThan(1e-9);
    expect(all.standardError).toBeLessThan(0.8);
  });

  it('handles a subset of answered items and a long all-correct test', () => {
    // 60 items, every other one not presented, all answered correctly: the posterior sits far
    // from the prior; the adaptive rule still matches the fine integration.
    const difficulty = Float64Array.from({ length: 60 }, (_, i) => -2 + (4 * i) / 59);
    const scores = new Uint8Array(60).fill(1);
    for (let i = 1; i < 60; i += 2) scores[i] = MISSING;
    const eap = estimateAbilityEap(difficulty, scores, { quadraturePoints: 21 });
    const check = posteriorByTrapezoid(difficulty, scores, 0, 1);
    expect(eap.answered).toBe(30);
    expect(eap.rawScore).toBe(30);
    expect(Math.abs(eap.ability - check.mean)).toBeLessThan(1e-6);
    expect(Math.abs(eap.standardError - check.sd)).toBeLessThan(1e-6);
    expect(eap.ability).toBeGreaterThan(2);
  });

  it('returns the prior when nothing was answered', () => {
    const eap = estimateAbilityEap(FIVE, new Uint8Array(5).fill(MISSING), { mean: -0.3, sd: 1.4 });
    expect(eap.ability).toBeCloseTo(-0.3, 12);
    expect(eap.standardError).toBeCloseTo(1.4, 12);
    expect(eap.answered).toBe(0);
  });

  it('rejects bad input with a terse message', () => {
    expect(() => estimateAbilityEap(FIVE, new Uint8Array(4))).toThrow(
      'estimateAbilityEap requires one score',
    );
    expect(() => estimateAbilityEap(FIVE, Uint8Array.of(0, 2, 0, 0, 0))).toThrow('scores 0, 1 or MISSING');
    expect(() => estimateAbilityEap(FIVE, new Uint8Array(5), { sd: 0 })).toThrow('positive prior sd');
  });
});
