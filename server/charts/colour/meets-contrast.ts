/** WCAG 2.x contrast thresholds (ratios, to be compared unrounded). */
export const CONTRAST_THRESHOLDS = {
  /** SC 1.4.3 (AA): text. */
  text: 4.5,
  /** SC 1.4.3 (AA): large-scale text (at least 18 pt, or 14 pt bold). */
  largeText: 3,
  /** SC 1.4.6 (AAA): text. */
  textEnhanced: 7,
  /** SC 1.4.11 (AA): graphical objects needed to understand the content, such as chart marks. */
  graphicalObject: 3,
} as const;

/**
 * Whether a contrast ratio meets a WCAG threshold. The ratio is never rounded: 2.999 does not
 * meet 3, and 4.4781 (#777777 on white) does not meet 4.5.
 *
 * @see W3C, Understanding WCAG 2.2, SC 1.4.11 Non-text Contrast ("2.999:1 would not meet the
 *   3:1 threshold"); w3c/wcag issue #200 on rounding.
 * @param ratio a contrast ratio from {@link contrastRatio}, 1..21
 * @param threshold the required ratio, for example `CONTRAST_THRESHOLDS.graphicalObject`
 * @returns true when ratio >= threshold
 * @throws `meetsContrast requires finite ratio and threshold` for NaN or infinite input
 * @example
 * meetsContrast(2.999, 3); // false
 * meetsContrast(3, 3); // true
 */
export function meetsContrast(ratio: number, threshold: number): boolean {
  if (!Number.isFinite(ratio) || !Number.isFinite(threshold)) {
    throw new Error('meetsContrast requires finite ratio and threshold');
  }
  return ratio >= threshold;
}
