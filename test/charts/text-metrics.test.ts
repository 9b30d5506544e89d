import { describe, expect, it } from 'vitest';
import { estimateTextWidth, wrapText } from '../../server/charts/text-metrics.js';

/**
 * Widths measured with Chromium's canvas measureText on Debian 12 (font stack of the theme, which
 * resolves to DejaVu Sans 2.37 there), in px at the given size. Measured once for this test; the
 * estimate must never be narrower (text would run past the edge) nor more than 15 % wider.
 */
const measuredDejaVu: ReadonlyArray<[string, number, boolean, number]> = [
  ['Weekly visitors at the Lumen Hall science centre', 20, true, 550.61],
  ['Repair jobs at Orbelle Bikes, as shares', 20, true, 435.47],
  ['Share of jobs (%)', 16, true, 155.23],
  ['Route 1', 16, false, 61.71],
  ['Lanternpoint', 16, false, 102.22],
  ['10:00–12:00', 16, false, 100.22],
];

describe('estimateTextWidth', () => {
  it('matches its documented example: two digits of 0.636 em at 16 units, times 1.03', () => {
    expect(estimateTextWidth('10', 16)).toBeCloseTo(20.96256, 10);
  });

  it('is never narrower than DejaVu Sans as Chromium draws it, and at most 15 % wider', () => {
    for (const [text, size, bold, measured] of measuredDejaVu) {
      const estimate = estimateTextWidth(text, size, bold);
      expect({ text, wide: estimate >= measured }).toEqual({ text, wide: true });
      expect({ text, close: estimate <= measured * 1.15 }).toEqual({ text, close: true });
    }
  });

  it('grows with the text and the font size, and for wide letters more than narrow ones', () => {
    expect(estimateTextWidth('WWW', 16)).toBeGreaterThan(estimateTextWidth('iii', 16) * 3);
    expect(estimateTextWidth('Harbour', 32)).toBeCloseTo(2 * estimateTextWidth('Harbour', 16), 10);
    expect(estimateTextWidth('Harbour', 16, true)).toBeGreaterThan(estimateTextWidth('Harbour', 16));
    expect(estimateTextWidth('', 16)).toBe(0);
  });
});

describe('wrapText', () => {
  it('matches its documented examples and keeps an over-long word whole', () => {
    expect(wrapText('North harbour quay', 16, 80)).toEqual(['North', 'harbour', 'quay']);
    expect(wrapText('North harbour quay', 16, 1000)).toEqual(['North harbour quay']);
    expect(wrapText('Supercalifragilistic', 16, 20)).toEqual(['Supercalifragilistic']);
    expect(wrapText('10:00–12:00', 16, 60)).toEqual(['10:00–', '12:00']);
  });

  it('breaks after a dash only when the word does not fit whole', () => {
    expect(wrapText('10:00–12:00', 16, 200)).toEqual(['10:00–12:00']);
    expect(wrapText('Week 3 in mid-summer', 16, 110)).toEqual(['Week 3 in', 'mid-summer']);
  });

  it('keeps a text on one line when maxWidth equals its width up to rounding residue', () => {
    const width = estimateTextWidth('Stop 1', 16);
    // 12 + w + 9 - 9 - 12 is 1 ulp below w in floating point: still one line.
    expect(12 + width + 9 - 9 - 12).toBeLessThan(width);
    expect(wrapText('Stop 1', 16, 12 + width + 9 - 9 - 12)).toEqual(['Stop 1']);
  });
});
