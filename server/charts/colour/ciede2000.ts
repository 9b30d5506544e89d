import type { Lab } from './types.js';

const DEGREES = 180 / Math.PI;
const RADIANS = Math.PI / 180;
const POW25_7 = 25 ** 7;

/**
 * CIEDE2000 colour difference ΔE00 between two CIELAB colours, with parametric factors
 * kL = kC = kH = 1. Symmetric in its arguments.
 *
 * Follows the implementation notes of Sharma et al.: hue angles in degrees in [0, 360), h' = 0
 * when a' = b' = 0; Δh' = 0 and the mean hue is h1' + h2' when either C' is 0; the mean hue takes
 * the branch by |h1' − h2'| > 180 and by h1' + h2' < 360.
 *
 * @see CIE 142-2001, Improvement to industrial colour-difference evaluation; Sharma, G., Wu, W., &
 *   Dalal, E. N. (2005). The CIEDE2000 color-difference formula: implementation notes,
 *   supplementary test data, and mathematical observations. Color Research & Application 30(1),
 *   21–30, equations (1)–(22) and Table 1.
 * @param first the first colour in L*a*b*
 * @param second the second colour in L*a*b*
 * @returns ΔE00, >= 0
 * @throws `ciede2000 requires finite Lab coordinates` for NaN or infinite input
 * @example
 * ciede2000({ l: 50, a: 2.6772, b: -79.7751 }, { l: 50, a: 0, b: -82.7485 }); // 2.0425 (within 1e-4)
 */
export function ciede2000(first: Lab, second: Lab): number {
  const values = [first.l, first.a, first.b, second.l, second.a, second.b];
  if (!values.every(Number.isFinite)) {
    throw new Error('ciede2000 requires finite Lab coordinates');
  }
  // Step 1: C', h'.
  const chroma1 = Math.hypot(first.a, first.b); // C*_ab,1
  const chroma2 = Math.hypot(second.a, second.b); // C*_ab,2
  const meanChroma7 = ((chroma1 + chroma2) / 2) ** 7;
  const g = 0.5 * (1 - Math.sqrt(meanChroma7 / (meanChroma7 + POW25_7))); // G
  const a1 = (1 + g) * first.a; // a'_1
  const a2 = (1 + g) * second.a; // a'_2
  const c1 = Math.hypot(a1, first.b); // C'_1
  const c2 = Math.hypot(a2, second.b); // C'_2
  const h1 = hueAngle(a1, first.b); // h'_1, degrees
  const h2 = hueAngle(a2, second.b); // h'_2, degrees

  // Step 2: ΔL', ΔC', ΔH'.
  const deltaL = second.l - first.l; // ΔL'
  const deltaC = c2 - c1; // ΔC'
  const chromaProduct = c1 * c2;
  let deltaHue = 0; // Δh', degrees
  if (chromaProduct !== 0) {
    deltaHue = h2 - h1;
    if (deltaHue > 180) deltaHue -= 360;
    else if (deltaHue < -180) deltaHue += 360;
  }
  const deltaH = 2 * Math.sqrt(chromaProduct) * Math.sin((deltaHue / 2) * RADIANS); // ΔH'

  // Step 3: weighting functions and rotation term.
  const meanL = (first.l + second.l) / 2; // L̄'
  const meanC = (c1 + c2) / 2; // C̄'
  let meanHue = h1 + h2; // h̄', degrees
  if (chromaProduct !== 0) {
    if (Math.abs(h1 - h2) <= 180) meanHue = (h1 + h2) / 2;
    else if (h1 + h2 < 360) meanHue = (h1 + h2 + 360) / 2;
    else meanHue = (h1 + h2 - 360) / 2;
  }
  const t =
    1 -
    0.17 * Math.cos((meanHue - 30) * RADIANS) +
    0.24 * Math.cos(2 * meanHue * RADIANS) +
    0.32 * Math.cos((3 * meanHue + 6) * RADIANS) -
    0.2 * Math.cos((4 * meanHue - 63) * RADIANS); // T
  const deltaTheta = 30 * Math.exp(-(((meanHue - 275) / 25) ** 2)); // Δθ, degrees
  const meanC7 = meanC ** 7;
  const rotationC = 2 * Math.sqrt(meanC7 / (meanC7 + POW25_7)); // R_C
  const lightOffset = (meanL - 50) ** 2;
  const weightL = 1 + (0.015 * lightOffset) / Math.sqrt(20 + lightOffset); // S_L
  const weightC = 1 + 0.045 * meanC; // S_C
  const weightH = 1 + 0.015 * meanC * t; // S_H
  const rotation = -Math.sin(2 * deltaTheta * RADIANS) * rotationC; // R_T

  const termL = deltaL / weightL;
  const termC = deltaC / weightC;
  const termH = deltaH / weightH;
  return Math.sqrt(termL * termL + termC * termC + termH * termH + rotation * termC * termH);
}

function hueAngle(a: number, b: number): number {
  if (a === 0 && b === 0) return 0;
  const angle = Math.atan2(b, a) * DEGREES;
  return angle < 0 ? angle + 360 : angle;
}
