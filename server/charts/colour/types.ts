/** Shared shapes for the colour-science functions of the chart layer. */

/**
 * An sRGB colour as three channels on the 0..255 scale (red, green, blue).
 * {@link parseColour} yields integers; the channel functions also accept fractions.
 */
export type Rgb = readonly [red: number, green: number, blue: number];

/** A colour in linear-light RGB, each channel nominally 0..1 (may leave that range before clipping). */
export type LinearRgb = readonly [red: number, green: number, blue: number];

/** CIE 1976 L*a*b* coordinates (D65 reference white in this project). */
export interface Lab {
  /** L*, lightness, 0 (black) to 100 (reference white). */
  readonly l: number;
  /** a*, green (negative) to red (positive). */
  readonly a: number;
  /** b*, blue (negative) to yellow (positive). */
  readonly b: number;
}

/** The dichromacies simulated by {@link simulateColourVision}. */
export type ColourVisionDeficiency = 'protanopia' | 'deuteranopia' | 'tritanopia';

/** Normal trichromatic vision or one of the simulated dichromacies. */
export type ColourVision = 'normal' | ColourVisionDeficiency;

/** Every simulated dichromacy, in a fixed order (for loops and reports). */
export const COLOUR_VISION_DEFICIENCIES: readonly ColourVisionDeficiency[] = [
  'protanopia',
  'deuteranopia',
  'tritanopia',
];
