import { describe, expect, it } from 'vitest';
import {
  calibratePilot,
  pilotCohortShares,
  pilotResponsesNeeded,
  shareLikelyToRead,
} from '../../server/reports/pilot-results.js';
import { MISSING, type ResponseMatrix } from '../../server/scoring/response-matrix.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';

/** Invented bank: 15 items evenly on [−2, 2], anchored at their generating values. */
const bankB = Array.from({ length: 15 }, (_, i) => -2 + (4 * i) / 14);
const bankIds = bankB.map((_, i) => `bank-${i + 1}`);
const anchors = new Map(bankIds.map((id, i) => [id, bankB[i]!]));

/**
 * Simulated study: `persons` people N(0.2, 0.9²) answer every bank item; the first `pilotAnswers`
 * of them also answer the pilot of difficulty `pilotB` (the rest: MISSING).
 */
function simulate(seed: number, pilotB: number, persons = 400, pilotAnswers = 150): ResponseMatrix {
  const random = seededRandom(seed);
  const itemIds = [...bankIds, 'pilot'];
  const n = itemIds.length;
  const scores = new Uint8Array(persons * n);
  for (let p = 0; p < persons; p++) {
    const theta = 0.2 + 0.9 * random.normal();
    for (let i = 0; i < n; i++) {
      if (i === n - 1 && p >= pilotAnswers) {
        scores[p * n + i] = MISSING;
        continue;
      }
      const b = i === n - 1 ? pilotB : bankB[i]!;
      scores[p * n + i] = random.uniform() < 1 / (1 + Math.exp(-(theta - b))) ? 1 : 0;
    }
  }
  return { personIds: Array.from({ length: persons }, (_, p) => `p${p}`), itemIds, scores };
}

describe('calibratePilot: MML with the bank anchored recovers a known difficulty', () => {
  it('within two SEs in at least 36 of 40 seeds (90%), 150 answers to the pilot each', () => {
    // 40 repeats; under a correct estimator about 95% of ±2 SE intervals cover the truth
    // (normal approximation: common practice, no source). Bias or a too-small SE fails this.
    const truth = 0.8;
    let covered = 0;
    let sumSe = 0;
    for (let seed = 1; seed <= 40; seed++) {
      const fit = calibratePilot(simulate(seed, truth), 'pilot', anchors);
      expect(fit.converged).toBe(true);
      expect(fit.responses).toBe(150);
      if (Math.abs(fit.difficulty - truth) <= 2 * fit.standardError) covered++;
      sumSe += fit.standardError;
    }
    expect(covered).toBeGreaterThanOrEqual(36);
    // SE of a Rasch item with 150 answers near the audience: about 1/√(150·0.22) ≈ 0.17.
    expect(sumSe / 40).toBeGreaterThan(0.12);
    expect(sumSe / 40).toBeLessThan(0.25);
  });

  it('recovers an easy pilot too (generating b = −1.2, within ±0.6)', () => {
    const matrix = simulate(3, -1.2);
    const fit = calibratePilot(matrix, 'pilot', anchors);
    expect(fit.difficulty).toBeLessThan(-0.6);
    expect(fit.difficulty).toBeGreaterThan(-1.8);
  });

  it('refuses a pilot without answers or a bank column without an anchor', () => {
    expect(() => calibratePilot(simulate(1, 0, 50, 0), 'pilot', anchors)).toThrow(/at least one answer/);
    const partial = new Map(anchors);
    partial.delete('bank-3');
    expect(() => calibratePilot(simulate(1, 0), 'pilot', partial)).toThrow(/anchor for bank-3/);
  });
});

describe('shareLikelyToRead and cohort shares (RP67)', () => {
  it('matches 1 − Φ((b + ln(0.67/0.33) − μ)/σ) computed with erfc outside the project', () => {
    // Reference values: Python math.erfc, 0.5·erfc(z/√2): z = 0.708185 → 0.239415; z = 1.260231 → 0.103793.
    expect(shareLikelyToRead(0, 0, 1)).toBeCloseTo(0.239415, 5);
    expect(shareLikelyToRead(0.5, 0.2, 0.8)).toBeCloseTo(0.103793, 5);
  });

  it('gives each cohort a share inside its bootstrap interval, and says how many more answers are needed', () => {
    const random = seededRandom(9);
    const draws = Array.from({ length: 200 }, () => [
      [0.2 + 0.08 * random.normal(), 0.9 + 0.05 * random.normal()] as [number, number],
      [-0.5 + 0.1 * random.normal(), 1.1 + 0.05 * random.normal()] as [number, number],
    ]);
    const shares = pilotCohortShares(
      { difficulty: 0.4, standardError: 0.15 },
      [
        { cohortId: 'a', mean: 0.2, sd: 0.9 },
        { cohortId: 'b', mean: -0.5, sd: 1.1 },
      ],
      draws,
    );
    for (const s of shares) {
      expect(s.interval).not.toBeNull();
      expect(s.interval![0]).toBeLessThan(s.share);
      expect(s.interval![1]).toBeGreaterThan(s.share);
    }
    expect(shares[0]!.share).toBeGreaterThan(shares[1]!.share);
    expect(pilotResponsesNeeded(37, 100)).toBe(63);
    expect(pilotResponsesNeeded(140, 100)).toBe(0);
  });
});
