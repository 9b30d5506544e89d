import { describe, expect, it } from 'vitest';
import { srgbToLab } from '../../../server/charts/colour/srgb-to-lab.js';

// IEC 61966-2-1 (sRGB transfer function and 4-decimal RGB→XYZ matrix, D65) and CIE 15:2004 §8.2.1
// (CIE 1976 L*a*b*). Expected values are [C] derived: recomputed independently (numpy, same
// published constants), not read in a source.
describe('srgbToLab', () => {
  it('maps white to L* 100, a* = b* = 0 and black to 0 (definition of the reference white)', () => {
    const white = srgbToLab('#ffffff');
    expect(Math.abs(white.l - 100)).toBeLessThan(1e-12);
    expect(Math.abs(white.a)).toBeLessThan(1e-12);
    expect(Math.abs(white.b)).toBeLessThan(1e-12);
    expect(srgbToLab('#000000')).toEqual({ l: 0, a: 0, b: 0 });
  });

  it.each([
    ['#ff0000', 53.232882, 80.105327, 67.222782],
    ['#0000ff', 32.302587, 79.193638, -107.853734],
    ['#808080', 53.585013, 0, 0],
    ['#0a0a0a', 2.741748, 0, 0], // linear segment of both the sRGB decode and the Lab compander
  ] as const)('maps %s to (%s, %s, %s) within 1e-5 ([C] derived)', (colour, l, a, b) => {
    const lab = srgbToLab(colour);
    expect(Math.abs(lab.l - l)).toBeLessThan(1e-5);
    expect(Math.abs(lab.a - a)).toBeLessThan(1e-5);
    expect(Math.abs(lab.b - b)).toBeLessThan(1e-5);
  });

  it('is near the commonly quoted Lab of sRGB red, (53.24, 80.09, 67.20), within 0.05 (from memory)', () => {
    // The quoted figure uses a more precise matrix and white point; agreement within 0.05 is expected.
    const red = srgbToLab('#ff0000');
    expect(Math.abs(red.l - 53.24)).toBeLessThan(0.05);
    expect(Math.abs(red.a - 80.09)).toBeLessThan(0.05);
    expect(Math.abs(red.b - 67.2)).toBeLessThan(0.05);
  });

  it('matches the documented example', () => {
    const red = srgbToLab('#ff0000');
    expect(red.l).toBeCloseTo(53.2329, 4);
    expect(red.a).toBeCloseTo(80.1053, 4);
    expect(red.b).toBeCloseTo(67.2228, 4);
  });
});
