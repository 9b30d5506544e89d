import { describe, expect, it } from 'vitest';
import { linearToSrgb } from '../../../server/charts/colour/linear-to-srgb.js';
import { srgbToLinear } from '../../../server/charts/colour/srgb-to-linear.js';

// IEC 61966-2-1 forward transfer: 12.92·v at or below 0.0031308, 1.055·v^(1/2.4) − 0.055 above.
describe('linearToSrgb', () => {
  it('matches the documented example (clips negative light to 0)', () => {
    const [red, green, blue] = linearToSrgb([1, 0.21586050011389926, -0.2]);
    expect(red).toBeCloseTo(255, 9);
    expect(green).toBeCloseTo(128, 9);
    expect(blue).toBe(0);
  });

  it('clips values above 1', () => {
    expect(linearToSrgb([1.4, 0, 0])[0]).toBeCloseTo(255, 12);
  });

  it('inverts srgbToLinear on every 8-bit level (round trip, [C])', () => {
    for (let level = 0; level <= 255; level++) {
      const back = linearToSrgb(srgbToLinear([level, level, level]));
      expect(Math.abs(back[0] - level)).toBeLessThan(1e-9);
    }
  });

  it('rejects non-finite input', () => {
    expect(() => linearToSrgb([Number.POSITIVE_INFINITY, 0, 0])).toThrow(
      'linearToSrgb requires finite channels',
    );
  });
});
