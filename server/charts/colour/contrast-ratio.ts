import { relativeLuminance } from './relative-luminance.js';
import type { ColourInput } from './resolve-colour.js';

/**
 * WCAG 2.x contrast ratio of two colours, (L1 + 0.05)/(L2 + 0.05) with L1 the lighter relative
 * luminance. The order of the arguments does not matter. The ratio runs from 1 to 21 and is not
 * rounded; compare it with a threshold through {@link meetsContrast}.
 *
 * @see W3C, Web Content Accessibility Guidelines (WCAG) 2.2, definition "contrast ratio".
 * @param first a colour string or channels on the 0..255 scale
 * @param second a colour string or channels on the 0..255 scale
 * @returns the contrast ratio, 1..21
 * @throws as {@link resolveColour} for an unreadable colour
 * @example
 * contrastRatio('#000', '#fff'); // 21
 * contrastRatio('#777777', '#ffffff'); // 4.478089453577214
 */
export function contrastRatio(first: ColourInput, second: ColourInput): number {
  const a = relativeLuminance(first);
  const b = relativeLuminance(second);
  const lighter = Math.max(a, b);
  const darker = Math.min(a, b);
  return (lighter + 0.05) / (darker + 0.05);
}
