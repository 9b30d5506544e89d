import { type ColourInput, resolveColour } from './resolve-colour.js';
import { srgbToLinear } from './srgb-to-linear.js';

/**
 * WCAG 2.x relative luminance of an sRGB colour: 0 for black, 1 for white.
 *
 * L = 0.2126·R + 0.7152·G + 0.0722·B over the linear-light channels (see {@link srgbToLinear}).
 *
 * @see W3C, Web Content Accessibility Guidelines (WCAG) 2.2, definition "relative luminance".
 * @param colour a colour string or channels on the 0..255 scale
 * @returns the relative luminance, 0..1
 * @throws as {@link resolveColour} for an unreadable colour
 * @example
 * relativeLuminance('#808080'); // 0.21586050011389926
 */
export function relativeLuminance(colour: ColourInput): number {
  const [red, green, blue] = srgbToLinear(resolveColour(colour));
  return 0.2126 * red + 0.7152 * green + 0.0722 * blue;
}
