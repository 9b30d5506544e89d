import { type ColourInput, resolveColour } from './resolve-colour.js';
import { srgbToLinear } from './srgb-to-linear.js';
import type { Lab } from './types.js';

// sRGB (linear) → CIE XYZ, D65, as printed to four decimals in IEC 61966-2-1:1999.
const X_ROW = [0.4124, 0.3576, 0.1805] as const;
const Y_ROW = [0.2126, 0.7152, 0.0722] as const;
const Z_ROW = [0.0193, 0.1192, 0.9505] as const;

// Reference white: the XYZ of sRGB white under the same matrix (the row sums), which is D65
// (0.9505, 1, 1.0890) and makes #ffffff exactly L* = 100, a* = b* = 0.
const WHITE_X = X_ROW[0] + X_ROW[1] + X_ROW[2]; // X_n
const WHITE_Y = Y_ROW[0] + Y_ROW[1] + Y_ROW[2]; // Y_n
const WHITE_Z = Z_ROW[0] + Z_ROW[1] + Z_ROW[2]; // Z_n

// CIE 15:2004: f(t) = t^(1/3) above (24/116)^3, otherwise (841/108)·t + 16/116.
const EPSILON = (24 / 116) ** 3;
const SLOPE = 841 / 108;

/**
 * Converts an sRGB colour to CIE 1976 L*a*b* with a D65 reference white, via linear RGB and
 * CIE XYZ.
 *
 * @see IEC 61966-2-1:1999, Multimedia systems and equipment — Colour measurement and management —
 *   Default RGB colour space — sRGB (transfer function and RGB→XYZ matrix);
 *   CIE 15:2004, Colorimetry, 3rd ed., section 8.2.1 (CIE 1976 L*a*b*).
 * @param colour a colour string or channels on the 0..255 scale
 * @returns the L*a*b* coordinates
 * @throws as {@link resolveColour} for an unreadable colour
 * @example
 * srgbToLab('#ffffff'); // { l: 100, a: 0, b: 0 } (within 1e-12)
 * srgbToLab('#ff0000'); // { l: 53.2329, a: 80.1053, b: 67.2228 } (within 1e-4)
 */
export function srgbToLab(colour: ColourInput): Lab {
  const [red, green, blue] = srgbToLinear(resolveColour(colour));
  const x = X_ROW[0] * red + X_ROW[1] * green + X_ROW[2] * blue;
  const y = Y_ROW[0] * red + Y_ROW[1] * green + Y_ROW[2] * blue;
  const z = Z_ROW[0] * red + Z_ROW[1] * green + Z_ROW[2] * blue;
  const fx = labCompand(x / WHITE_X);
  const fy = labCompand(y / WHITE_Y);
  const fz = labCompand(z / WHITE_Z);
  return { l: 116 * fy - 16, a: 500 * (fx - fy), b: 200 * (fy - fz) };
}

function labCompand(ratio: number): number {
  return ratio > EPSILON ? Math.cbrt(ratio) : SLOPE * ratio + 16 / 116;
}
