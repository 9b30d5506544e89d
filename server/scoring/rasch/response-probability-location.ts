/**
 * Response-probability (RP) location of an item: the ability at which a person answers it
 * correctly with probability `rp`. Under the Rasch model θ_RP = b + ln(rp / (1 − rp)).
 *
 * Reports place chart types and task levels on the ability scale at RP = 0.67 by default, the
 * "two-thirds probability of a correct response" convention of bookmark standard setting, close
 * to the 0.65 that NAEP item maps use for constructed-response items.
 *
 * @see Lewis, Mitzel & Green (1996) and Mitzel, Lewis, Patz & Green (2001), the bookmark
 *   procedure, as summarised in Beretvas, S. N. (2004), Applied Psychological Measurement 28.
 * @see NCES, NAEP technical documentation, "Item mapping procedures" (RP 0.65 / 0.72 / 0.74).
 * @param difficulty b in logits
 * @param rp response probability in (0, 1)
 * @returns θ_RP in logits
 * @throws when rp is not strictly between 0 and 1
 * @example
 * responseProbabilityLocation(0, 0.8); // 1.3862943611198908
 */
export function responseProbabilityLocation(difficulty: number, rp: number): number {
  if (!(rp > 0 && rp < 1))
    throw new Error('responseProbabilityLocation requires rp strictly between 0 and 1');
  return difficulty + Math.log(rp / (1 - rp));
}
