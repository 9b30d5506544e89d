import { standardNormalCdf } from './standard-normal-cdf.js';

/** A normal ability distribution on the logit scale. */
export interface AbilityDistribution {
  readonly mean: number;
  readonly sd: number;
}

/**
 * Share of a normal ability distribution at or above a location: 1 − Φ((θ₀ − μ)/σ).
 * With θ₀ an item's RP location, this is the share of the audience whose chance of success on
 * that item is at least RP.
 *
 * @see Abramowitz, M., & Stegun, I. A. (1964), eq. 26.2.29 (Φ via erf).
 * @param location θ₀ in logits
 * @param distribution mean and SD in logits; SD 0 is a point mass
 * @returns share in [0, 1]
 * @example
 * shareAtOrAbove(0, { mean: 0, sd: 1 }); // 0.5
 */
export function shareAtOrAbove(location: number, distribution: AbilityDistribution): number {
  if (!(distribution.sd >= 0)) throw new Error('shareAtOrAbove requires a non-negative SD');
  if (distribution.sd === 0) return distribution.mean >= location ? 1 : 0;
  return 1 - standardNormalCdf((location - distribution.mean) / distribution.sd);
}
