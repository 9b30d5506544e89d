import type { Rgb } from './types.js';

const HEX_PATTERN = /^#([0-9a-f]{3}|[0-9a-f]{6})$/i;
const RGB_FUNCTION_PATTERN = /^rgb\(\s*(\d{1,3})\s*,\s*(\d{1,3})\s*,\s*(\d{1,3})\s*\)$/i;

/**
 * Parses a CSS colour written as `#rgb`, `#rrggbb` or `rgb(r, g, b)` into 8-bit sRGB channels.
 *
 * Only these three forms are accepted, so a chart spec cannot smuggle in a colour the lint cannot
 * measure (named colours, `hsl()`, transparency). Surrounding white space is ignored, case is not
 * significant. In the short form each digit is doubled (`#abc` is `#aabbcc`).
 *
 * @see W3C CSS Color Module Level 4, section 5.2 "The RGB hexadecimal notations" and section 5.1
 *   "The RGB functions" (only the comma-separated integer form is accepted here).
 * @param text the colour as written in a chart spec or theme
 * @returns the channels as integers 0..255
 * @throws `parseColour cannot read <text>` for any other form or a channel above 255
 * @example
 * parseColour('#0a8'); // [0, 170, 136]
 * parseColour('rgb(255, 0, 16)'); // [255, 0, 16]
 */
export function parseColour(text: string): Rgb {
  const trimmed = text.trim();
  const hex = HEX_PATTERN.exec(trimmed)?.[1];
  if (hex !== undefined) {
    const full = hex.length === 3 ? [...hex].map((digit) => digit + digit).join('') : hex;
    return [
      Number.parseInt(full.slice(0, 2), 16),
      Number.parseInt(full.slice(2, 4), 16),
      Number.parseInt(full.slice(4, 6), 16),
    ];
  }
  const functional = RGB_FUNCTION_PATTERN.exec(trimmed);
  if (functional !== null) {
    const channels = [functional[1], functional[2], functional[3]].map(Number);
    if (channels.every((channel) => channel <= 255)) {
      return [channels[0]!, channels[1]!, channels[2]!];
    }
  }
  throw new Error(`parseColour cannot read ${JSON.stringify(text)}`);
}
