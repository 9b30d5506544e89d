import type { LinearRgb, Rgb } from './types.js';

/**
 * Decodes sRGB channels (0..255) to linear-light values (0..1) with the sRGB transfer function.
 *
 * For each channel c = C/255: c/12.92 when c <= 0.04045, ((c + 0.055)/1.055)^2.4 otherwise.
 * WCAG 2.0 printed 0.03928 as the cut-off; for 8-bit input both cut-offs give identical results
 * (10/255 lies below both, 11/255 above both).
 *
 * @see IEC 61966-2-1:1999 (sRGB), the inverse transfer function; restated in the W3C WCAG 2.2
 *   definition "relative luminance".
 * @param colour channels on the 0..255 scale
 * @returns linear-light channels on the 0..1 scale
 * @example
 * srgbToLinear([255, 128, 0]); // [1, 0.21586050011389926, 0]
 */
export function srgbToLinear(colour: Rgb): LinearRgb {
  return [decode(colour[0]), decode(colour[1]), decode(colour[2])];
}

function decode(channel: number): number {
  const c = channel / 255;
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}
