import { describe, expect, it } from 'vitest';
import { srgbToLinear } from '../../../server/charts/colour/srgb-to-linear.js';

// IEC 61966-2-1 / W3C WCAG 2.2 "relative luminance": c/12.92 at or below 0.04045,
// ((c + 0.055)/1.055)^2.4 above.
describe('srgbToLinear', () => {
  it('matches the documented example', () => {
    const [red, green, blue] = srgbToLinear([255, 128, 0]);
    expect(red).toBe(1);
    expect(green).toBeCloseTo(0.21586050011389926, 15);
    expect(blue).toBe(0);
  });

  it('uses the linear segment at 10/255 and the power segment at 11/255 (check-values.md §1, [C])', () => {
    // 10/255 = 0.0392 is below both the 0.03928 (WCAG 2.0) and 0.04045 cut-offs; 11/255 = 0.0431 above both.
    const [low, high] = srgbToLinear([10, 11, 0]);
    expect(low).toBeCloseTo(10 / 255 / 12.92, 15);
    expect(high).toBeCloseTo(((11 / 255 + 0.055) / 1.055) ** 2.4, 15);
    // the two segments differ by only ~1e-6 here, so the check is tight: the wrong branch gives 0.0030340
    expect(Math.abs(low - 0.0030353)).toBeLessThan(1e-7);
  });
});
