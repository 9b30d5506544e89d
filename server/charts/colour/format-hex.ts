import type { Rgb } from './types.js';

/**
 * Writes sRGB channels as a lower-case `#rrggbb` string, rounding each channel to the nearest
 * integer and clamping it to 0..255.
 *
 * @see W3C CSS Color Module Level 4, section 5.2 "The RGB hexadecimal notations".
 * @param colour channels on the 0..255 scale
 * @returns the six-digit hex notation
 * @throws `formatHex requires finite channels` when a channel is NaN or infinite
 * @example
 * formatHex([0, 170, 136]); // '#00aa88'
 */
export function formatHex(colour: Rgb): string {
  if (!colour.every(Number.isFinite)) {
    throw new Error('formatHex requires finite channels');
  }
  const digits = colour.map((channel) =>
    Math.min(255, Math.max(0, Math.round(channel)))
      .toString(16)
      .padStart(2, '0'),
  );
  return `#${digits.join('')}`;
}
