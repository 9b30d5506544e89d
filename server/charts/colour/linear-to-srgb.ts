import type { LinearRgb, Rgb } from './types.js';

/**
 * Encodes linear-light channels (0..1) to sRGB channels on the 0..255 scale, clipping each linear
 * value to [0, 1] first. The result is not rounded; use {@link formatHex} to display it.
 *
 * Encoding: 12.92·v when v <= 0.0031308, 1.055·v^(1/2.4) − 0.055 otherwise.
 *
 * @see IEC 61966-2-1:1999 (sRGB), the forward transfer function.
 * @param linear linear-light channels, nominally 0..1 (values outside are clipped)
 * @returns sRGB channels on the 0..255 scale, unrounded
 * @throws `linearToSrgb requires finite channels` when a channel is NaN or infinite
 * @example
 * linearToSrgb([1, 0.21586050011389926, -0.2]); // [255, 128 (within 1e-9), 0]
 */
export function linearToSrgb(linear: LinearRgb): Rgb {
  if (!linear.every(Number.isFinite)) {
    throw new Error('linearToSrgb requires finite channels');
  }
  return [encode(linear[0]), encode(linear[1]), encode(linear[2])];
}

function encode(value: number): number {
  const v = Math.min(1, Math.max(0, value));
  const c = v <= 0.0031308 ? 12.92 * v : 1.055 * v ** (1 / 2.4) - 0.055;
  return 255 * c;
}
