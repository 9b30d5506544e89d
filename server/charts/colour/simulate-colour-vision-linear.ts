import type { ColourVisionDeficiency, LinearRgb } from './types.js';

/**
 * Machado, Oliveira & Fernandes (2009) simulation matrices at severity 1.0, row-major 3×3, for
 * linear-light RGB. Each row sums to 1 within 2e-6, so greys map to themselves.
 */
export const MACHADO_2009_MATRICES: Readonly<Record<ColourVisionDeficiency, Float64Array>> = {
  protanopia: Float64Array.of(
    0.152286,
    1.052583,
    -0.204868,
    0.114503,
    0.786281,
    0.099216,
    -0.003882,
    -0.048116,
    1.051998,
  ),
  deuteranopia: Float64Array.of(
    0.367322,
    0.860646,
    -0.227968,
    0.280085,
    0.672501,
    0.047413,
    -0.01182,
    0.04294,
    0.968881,
  ),
  tritanopia: Float64Array.of(
    1.255528,
    -0.076749,
    -0.178779,
    -0.078411,
    0.930809,
    0.147602,
    0.004733,
    0.691367,
    0.3039,
  ),
};

/**
 * Simulates a dichromacy on a linear-light RGB colour by multiplying it with the severity-1.0
 * matrix of Machado et al. The result is not clipped (it can leave [0, 1]); the sRGB pipeline in
 * {@link simulateColourVision} clips before encoding.
 *
 * The tritanopia matrix is the model's approximation; the protan and deutan matrices are the
 * better-supported part of the model.
 *
 * @see Machado, G. M., Oliveira, M. M., & Fernandes, L. A. F. (2009). A physiologically-based
 *   model for simulation of color vision deficiency. IEEE TVCG 15(6), 1291–1298,
 *   doi:10.1109/TVCG.2009.113 — Table 1 of the supplement, severity 1.0.
 * @param linear linear-light RGB (decode sRGB first, see {@link srgbToLinear})
 * @param deficiency the dichromacy to simulate
 * @returns the simulated linear-light RGB, unclipped
 * @throws `simulateColourVisionLinear requires finite channels` for NaN or infinite input
 * @example
 * simulateColourVisionLinear([1, 0, 0], 'protanopia'); // [0.152286, 0.114503, -0.003882]
 */
export function simulateColourVisionLinear(linear: LinearRgb, deficiency: ColourVisionDeficiency): LinearRgb {
  if (!linear.every(Number.isFinite)) {
    throw new Error('simulateColourVisionLinear requires finite channels');
  }
  const m = MACHADO_2009_MATRICES[deficiency];
  const [red, green, blue] = linear;
  return [
    m[0]! * red + m[1]! * green + m[2]! * blue,
    m[3]! * red + m[4]! * green + m[5]! * blue,
    m[6]! * red + m[7]! * green + m[8]! * blue,
  ];
}
