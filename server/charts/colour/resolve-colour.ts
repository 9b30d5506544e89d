import { parseColour } from './parse-colour.js';
import type { Rgb } from './types.js';

/** A colour as written in a spec (`#rgb`, `#rrggbb`, `rgb(r, g, b)`) or as channels 0..255. */
export type ColourInput = string | Rgb;

/**
 * Turns a colour input into checked sRGB channels: strings go through {@link parseColour},
 * channel triples are checked to be finite and within 0..255 and returned unchanged.
 *
 * @see W3C CSS Color Module Level 4, sections 5.1–5.2 (the accepted notations).
 * @param colour a colour string or channels on the 0..255 scale
 * @returns channels on the 0..255 scale
 * @throws `parseColour cannot read <text>` for an unreadable string,
 *   `resolveColour requires three channels within 0..255` for bad channels
 * @example
 * resolveColour('#fff'); // [255, 255, 255]
 */
export function resolveColour(colour: ColourInput): Rgb {
  if (typeof colour === 'string') {
    return parseColour(colour);
  }
  if (
    colour.length !== 3 ||
    !colour.every((channel) => Number.isFinite(channel) && channel >= 0 && channel <= 255)
  ) {
    throw new Error('resolveColour requires three channels within 0..255');
  }
  return colour;
}
