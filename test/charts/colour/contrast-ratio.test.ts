import { describe, expect, it } from 'vitest';
import { contrastRatio } from '../../../server/charts/colour/contrast-ratio.js';
import { meetsContrast } from '../../../server/charts/colour/meets-contrast.js';

// Formula: W3C WCAG 2.2 definition "contrast ratio", (L1 + 0.05)/(L2 + 0.05), L1 the lighter.
// ACT = W3C ACT rule "Text has minimum contrast" (afw4f7), w3c/wcag-act-rules
// content/rules/afw4f7/proposed.md; its ratios are printed rounded, so they are asserted at that precision.
describe('contrastRatio', () => {
  it('black on white is exactly 21 (ACT afw4f7 Passed Example 8)', () => {
    expect(Math.abs(contrastRatio('#000', '#FFF') - 21)).toBeLessThan(1e-9);
  });

  it('white on white is 1 (definition)', () => {
    expect(Math.abs(contrastRatio('#FFF', '#FFF') - 1)).toBeLessThan(1e-9);
  });

  it.each([
    // [foreground, background, printed ratio, tolerance, source]
    ['#333', '#FFF', 12.6, 0.05, 'ACT afw4f7 Passed Example 1'],
    ['#000', '#666', 3.6, 0.06, 'ACT afw4f7 Passed Examples 5/6'],
    ['#0000EE', '#FFF', 9.39, 0.01, 'ACT afw4f7 Passed Example 10'],
    ['#AAA', '#FFF', 2.3, 0.05, 'ACT afw4f7 Failed Example 1'],
  ] as const)('%s on %s is %s:1 (%s, published)', (foreground, background, expected, tolerance, _source) => {
    expect(Math.abs(contrastRatio(foreground, background) - expected)).toBeLessThanOrEqual(tolerance);
  });

  it.each([
    // check-values.md §1, [C] derived from the verified formula (regression values, not published)
    ['#777777', 4.4781],
    ['#959595', 2.9953],
    ['#767676', 4.5422],
    ['#949494', 3.0335],
    ['#FF0000', 3.9985],
  ] as const)('%s on white is %s:1 (check-values.md §1, [C] derived)', (colour, expected) => {
    expect(Math.abs(contrastRatio(colour, '#FFFFFF') - expected)).toBeLessThan(1e-4);
  });

  it('matches the documented example', () => {
    expect(contrastRatio('#000', '#fff')).toBe(21);
    expect(contrastRatio('#777777', '#ffffff')).toBeCloseTo(4.478089453577214, 12);
  });

  it('does not depend on argument order', () => {
    expect(contrastRatio('#fff', '#0000ee')).toBe(contrastRatio('#0000ee', '#fff'));
  });

  it('keeps the exact branch: #777777 fails 4.5:1 and #959595 fails 3:1 (check-values.md §1, [C])', () => {
    // Rounding to one decimal would turn 4.478 into 4.5 and 2.995 into 3.0 and pass both wrongly.
    expect(meetsContrast(contrastRatio('#777777', '#FFFFFF'), 4.5)).toBe(false);
    expect(meetsContrast(contrastRatio('#959595', '#FFFFFF'), 3)).toBe(false);
    expect(meetsContrast(contrastRatio('#767676', '#FFFFFF'), 4.5)).toBe(true);
    expect(meetsContrast(contrastRatio('#949494', '#FFFFFF'), 3)).toBe(true);
  });
});
