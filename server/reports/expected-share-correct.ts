import { gaussHermite } from '../scoring/quadrature/gauss-hermite.js';
import type { AbilityDistribution } from '../scoring/statistics/share-at-or-above.js';

/** Gauss–Hermite rules by number of points, computed once: reports call this thousands of times. */
const rules = new Map<number, { nodes: Float64Array; weights: Float64Array }>();
function ruleFor(points: number) {
  let rule = rules.get(points);
  if (!rule) {
    rule = gaussHermite(points);
    rules.set(points, rule);
  }
  return rule;
}

/** A normal ability distribution on the logit scale (defined beside shareAtOrAbove in server/scoring). */
export type { AbilityDistribution };

/**
 * Expected share of an audience answering items correctly: the Rasch success probability
 * averaged over the audience's ability distribution and over the items,
 * (1/n) Σ_i ∫ 1/(1 + e^−(θ − b_i)) φ(θ; μ, σ) dθ, by Gauss–Hermite quadrature.
 *
 * This is what lets cohorts that saw different items compare fairly: the share refers to the
 * same items for every cohort, not to the raw percent correct on what each happened to see.
 *
 * @see Bock, R. D., & Aitkin, M. (1981). Marginal maximum likelihood estimation of item
 *   parameters: application of an EM algorithm. Psychometrika 46, 443–459 (the marginal model).
 * @param difficulties b_i of the items, logits
 * @param distribution mean and SD of ability, logits (SD >= 0)
 * @param points quadrature points (default 41)
 * @returns share in [0, 1]
 * @throws when there are no items or the SD is negative
 * @example
 * expectedShareCorrect([0], { mean: 0, sd: 1 }); // 0.5
 */
export function expectedShareCorrect(
  difficulties: ArrayLike<number>,
  distribution: AbilityDistribution,
  points = 41,
): number {
  if (difficulties.length === 0) throw new Error('expectedShareCorrect requires at least one item');
  if (!(distribution.sd >= 0)) throw new Error('expectedShareCorrect requires a non-negative SD');
  const { nodes, weights } = ruleFor(points);
  let total = 0;
  for (let i = 0; i < difficulties.length; i++) {
    const b = difficulties[i]!;
    let share = 0;
    for (let q = 0; q < nodes.length; q++) {
      const theta = distribution.mean + Math.SQRT2 * distribution.sd * nodes[q]!;
      share += weights[q]! / Math.sqrt(Math.PI) / (1 + Math.exp(-(theta - b)));
    }
    total += share;
  }
  return total / difficulties.length;
}
