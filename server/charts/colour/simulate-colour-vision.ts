import { linearToSrgb } from './linear-to-srgb.js';
import { type ColourInput, resolveColour } from './resolve-colour.js';
import { simulateColourVisionLinear } from './simulate-colour-vision-linear.js';
import { srgbToLinear } from './srgb-to-linear.js';
import type { ColourVision, Rgb } from './types.js';

/**
 * Shows how an sRGB colour appears under a simulated dichromacy: decode sRGB to linear light,
 * multiply by the Machado et al. severity-1.0 matrix, clip to [0, 1], encode to sRGB and round
 * each channel to an integer (the colour an 8-bit display would show). `normal` returns the
 * colour unchanged.
 *
 * @see Machado, G. M., Oliveira, M. M., & Fernandes, L. A. F. (2009). A physiologically-based
 *   model for simulation of color vision deficiency. IEEE TVCG 15(6), 1291–1298 (matrices for
 *   linear RGB); IEC 61966-2-1:1999 for the sRGB transfer functions.
 * @param colour a colour string or channels on the 0..255 scale
 * @param vision `normal`, `protanopia`, `deuteranopia` or `tritanopia`
 * @returns the simulated colour as integer channels 0..255
 * @throws as {@link resolveColour} for an unreadable colour
 * @example
 * simulateColourVision('#ff0000', 'protanopia'); // [109, 95, 0]
 * simulateColourVision('#ff0000', 'deuteranopia'); // [163, 144, 0]
 */
export function simulateColourVision(colour: ColourInput, vision: ColourVision): Rgb {
  const rgb = resolveColour(colour);
  if (vision === 'normal') {
    return rgb;
  }
  const simulated = linearToSrgb(simulateColourVisionLinear(srgbToLinear(rgb), vision));
  return [Math.round(simulated[0]), Math.round(simulated[1]), Math.round(simulated[2])];
}
