/**
 * Fisher information of Rasch items and of a test, and the standard error it implies.
 *
 * For a dichotomous Rasch item the information at ability θ is I(θ) = P(1 − P), with
 * P = 1 / (1 + e^(−(θ − b))). It is largest, 0.25, when θ = b, and falls off symmetrically with
 * |θ − b|. Test information is the sum over the items given, and the standard error of a
 * maximum-likelihood ability is 1 / √(test information).
 *
 * @see Linacre, J. M. (2006). Computer-adaptive tests (CAT), standard errors and stopping rules.
 *   Rasch Measurement Transactions 20:2, 1062 (I = P(1 − P); SE = 1/√ΣP(1 − P); items needed
 *   for a target SE).
 */

/**
 * Rasch information of one item at ability θ: P(1 − P).
 *
 * Cost O(1).
 *
 * @param ability θ in logits.
 * @param difficulty b in logits.
 * @returns P(1 − P), in (0, 0.25].
 * @example
 * itemInformation(0.5, 0.5); // 0.25
 * itemInformation(0, Math.log(4)); // 0.16 (P = 0.2)
 */
export function itemInformation(ability: number, difficulty: number): number {
  const p = 1 / (1 + Math.exp(difficulty - ability));
  return p * (1 - p);
}

/**
 * Test information at θ: Σ P_i(1 − P_i) over the given difficulties.
 *
 * Cost O(items).
 *
 * @param ability θ in logits.
 * @param difficulties b_i of the items given.
 * @returns the summed information (0 for no items).
 * @example
 * testInformation(0, Float64Array.of(0, 0, 0, 0)); // 1
 */
export function testInformation(ability: number, difficulties: Float64Array): number {
  let total = 0;
  for (let i = 0; i < difficulties.length; i++) {
    const p = 1 / (1 + Math.exp(difficulties[i]! - ability));
    total += p * (1 - p);
  }
  return total;
}

/**
 * Standard error implied by an amount of information: 1/√I (Infinity for no information).
 *
 * @param information test information (plus prior precision 1/σ² for a posterior), ≥ 0.
 * @returns the standard error in logits.
 * @throws when information is negative or not a number.
 * @example
 * standardErrorFromInformation(4); // 0.5
 */
export function standardErrorFromInformation(information: number): number {
  if (!(information >= 0)) throw new Error('standardErrorFromInformation requires information >= 0');
  return information === 0 ? Number.POSITIVE_INFINITY : 1 / Math.sqrt(information);
}

/**
 * Items needed to reach a target standard error when every item is answered with success
 * probability P: ⌈1 / (P(1 − P)·SE²)⌉ (Linacre 2006's table). A relative slack of 1e-9 keeps
 * exact quotients such as 16 from rounding up to 17 through floating-point error.
 *
 * @param probability the success probability at which items are targeted, in (0, 1).
 * @param targetStandardError the SE to reach, > 0.
 * @returns the number of items.
 * @throws when probability is outside (0, 1) or the target is not positive.
 * @example
 * itemsNeededForStandardError(0.5, 0.3); // 45
 * itemsNeededForStandardError(0.8, 0.4); // 40
 */
export function itemsNeededForStandardError(probability: number, targetStandardError: number): number {
  if (!(probability > 0 && probability < 1)) {
    throw new Error('itemsNeededForStandardError requires a probability in (0, 1)');
  }
  if (!(targetStandardError > 0) || !Number.isFinite(targetStandardError)) {
    throw new Error('itemsNeededForStandardError requires a positive target standard error');
  }
  const exact = 1 / (probability * (1 - probability) * targetStandardError * targetStandardError);
  return Math.ceil(exact * (1 - 1e-9));
}
