import { describe, expect, it } from 'vitest';
import { relativeLuminance } from '../../../server/charts/colour/relative-luminance.js';

// W3C WCAG 2.2 definition "relative luminance": L = 0.2126 R + 0.7152 G + 0.0722 B on linear channels.
describe('relativeLuminance', () => {
  it('gives luminance 0.215861 for #808080 (check-values.md §1, [C] derived)', () => {
    expect(relativeLuminance('#808080')).toBeCloseTo(0.21586050011389926, 12);
    expect(Math.abs(relativeLuminance('#808080') - 0.215861)).toBeLessThan(1e-6);
  });

  it('is 0 for black and 1 for white (definition)', () => {
    expect(relativeLuminance('#000')).toBe(0);
    expect(relativeLuminance('#fff')).toBeCloseTo(1, 15);
  });

  it('weights the primaries 0.2126, 0.7152, 0.0722 (definition)', () => {
    expect(relativeLuminance('#ff0000')).toBeCloseTo(0.2126, 15);
    expect(relativeLuminance('#00ff00')).toBeCloseTo(0.7152, 15);
    expect(relativeLuminance('#0000ff')).toBeCloseTo(0.0722, 15);
  });

  it('accepts channel triples', () => {
    expect(relativeLuminance([128, 128, 128])).toBeCloseTo(0.215861, 6);
  });

  it('throws on unreadable colours', () => {
    expect(() => relativeLuminance('grey')).toThrow('parseColour cannot read "grey"');
  });
});
