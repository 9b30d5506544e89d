import type { MantelHaenszelResult } from './mantel-haenszel.js';

/** ETS DIF category: A negligible, B moderate, C large; the sign says which group the item favours. */
export type EtsDifClass = 'A' | 'B+' | 'B-' | 'C+' | 'C-';

/** z_{0.95}: the one-sided 5% point for "|D| significantly greater than 1". */
const Z_95 = 1.6448536269514722;

/**
 * The ETS classification of an item's Mantel-Haenszel DIF on the delta scale.
 *
 * - A: |MH D-DIF| < 1, or D-DIF not significantly different from 0 at the 5% level (taken here
 *   as the continuity-corrected MH χ² p-value ≥ 0.05);
 * - C: |MH D-DIF| ≥ 1.5 and |MH D-DIF| significantly greater than 1 at the 5% level
 *   (one-sided: (|D| − 1) / SE(D) > 1.645);
 * - B: otherwise.
 *
 * The sign is that of D-DIF: "−" means the item is harder for the focal group than for
 * reference-group persons with the same score, "+" that it is easier for them. Which test
 * implements each "significantly" (the χ² for A, the one-sided z for C) is from memory; the
 * thresholds are as read in the sources below.
 *
 * @see Zwick, R. (2012). A review of ETS differential item functioning assessment procedures:
 *   Flagging rules, minimum sample size requirements, and criterion refinement. ETS Research
 *   Report RR-12-08.
 * @see Dorans, N. J., & Holland, P. W. (1993). DIF detection and description: Mantel-Haenszel and
 *   standardization. In P. W. Holland & H. Wainer (Eds.), Differential Item Functioning, pp. 35-66.
 * @param result the item's {@link mantelHaenszel} result.
 * @returns the class, or null when the item has no estimable D-DIF (no information or an infinite α).
 * @example
 * // D-DIF −1.97, SE 0.35, χ² p < 0.001: large and significantly beyond 1
 * etsDifClass(result); // 'C-'
 */
export function etsDifClass(result: MantelHaenszelResult): EtsDifClass | null {
  if (result.kind !== 'test' || result.effect === null) return null;
  const { dDif, dDifStandardError } = result.effect;
  const size = Math.abs(dDif);
  if (size < 1 || !(result.pValueCorrected < 0.05)) return 'A';
  const sign = dDif > 0 ? '+' : '-';
  if (size >= 1.5 && (size - 1) / dDifStandardError > Z_95) return `C${sign}`;
  return `B${sign}`;
}
