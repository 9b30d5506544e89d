import { describe, expect, it } from 'vitest';
import { estimateTextWidth, wrapText } from '../../server/charts/text-metrics.js';

describe('estimateTextWidth', () => {
  it('matches its documented example: two digits of 0.556 em at 16 units, times 1.1', () => {
    expect(estimateTextWidth('10', 16)).toBeCloseTo(19.5712, 10);
  });

  it('grows with the text and the font size, and for wide letters more than narrow ones', () => {
    expect(estimateTextWidth('WWW', 16)).toBeGreaterThan(estimateTextWidth('iii', 16) * 3);
    expect(estimateTextWidth('Harbour', 32)).toBeCloseTo(2 * estimateTextWidth('Harbour', 16), 10);
    expect(estimateTextWidth('Harbour', 16, true)).toBeGreaterThan(estimateTextWidth('Harbour', 16));
    expect(estimateTextWidth('', 16)).toBe(0);
  });
});

describe('wrapText', () => {
  it('matches its documented example and keeps an over-long word whole', () => {
    expect(wrapText('North harbour quay', 16, 80)).toEqual(['North', 'harbour', 'quay']);
    expect(wrapText('North harbour quay', 16, 1000)).toEqual(['North harbour quay']);
    expect(wrapText('Supercalifragilistic', 16, 20)).toEqual(['Supercalifragilistic']);
  });
});
