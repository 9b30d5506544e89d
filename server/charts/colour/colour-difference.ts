import { ciede2000 } from './ciede2000.js';
import type { ColourInput } from './resolve-colour.js';
import { srgbToLab } from './srgb-to-lab.js';

/**
 * CIEDE2000 difference between two sRGB colours: each is converted to CIELAB (D65) by
 * {@link srgbToLab}, then compared by {@link ciede2000} with kL = kC = kH = 1.
 *
 * @see IEC 61966-2-1:1999 and CIE 15:2004 (conversion); Sharma, Wu & Dalal (2005), Color
 *   Research & Application 30(1), 21–30 (ΔE00).
 * @param first a colour string or channels on the 0..255 scale
 * @param second a colour string or channels on the 0..255 scale
 * @returns ΔE00, >= 0
 * @throws as {@link resolveColour} for an unreadable colour
 * @example
 * colourDifference('#000000', '#ffffff'); // 100 (within 1e-9)
 */
export function colourDifference(first: ColourInput, second: ColourInput): number {
  return ciede2000(srgbToLab(first), srgbToLab(second));
}
