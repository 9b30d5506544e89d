import { describe, expect, it } from 'vitest';
import { CONTRAST_THRESHOLDS, meetsContrast } from '../../../server/charts/colour/meets-contrast.js';

describe('meetsContrast', () => {
  it('never rounds: 2.999 fails 3 (W3C Understanding WCAG 2.2, SC 1.4.11, published wording)', () => {
    expect(meetsContrast(2.999, 3)).toBe(false);
    expect(meetsContrast(4.4999, 4.5)).toBe(false);
  });

  it('passes at and above the threshold (documented example)', () => {
    expect(meetsContrast(3, 3)).toBe(true);
    expect(meetsContrast(3.0001, 3)).toBe(true);
  });

  it('carries the WCAG 2.x thresholds (SC 1.4.3, 1.4.6, 1.4.11; check-values.md §1)', () => {
    expect(CONTRAST_THRESHOLDS).toEqual({ text: 4.5, largeText: 3, textEnhanced: 7, graphicalObject: 3 });
  });

  it('rejects NaN', () => {
    expect(() => meetsContrast(Number.NaN, 3)).toThrow('meetsContrast requires finite ratio and threshold');
  });
});
