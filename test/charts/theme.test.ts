import { lab } from 'd3-color';
import { describe, expect, it } from 'vitest';
import { contrastRatio } from '../../server/charts/colour/contrast-ratio.js';
import { SEQUENTIAL_RAMP } from '../../server/charts/colour/palettes.js';
import { defaultTheme, sequentialClasses } from '../../server/charts/theme.js';

describe('defaultTheme', () => {
  it('keeps text at 4.5:1 and axes at 3:1 on the background (WCAG 2.1 SC 1.4.3 and 1.4.11)', () => {
    const { background, text, mutedText, axis } = defaultTheme.colours;
    expect(contrastRatio(text, background)).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio(mutedText, background)).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio(axis, background)).toBeGreaterThanOrEqual(3);
  });

  it('never sets text below 14 units (14 px at 600 px width)', () => {
    expect(Math.min(...Object.values(defaultTheme.fontSize))).toBeGreaterThanOrEqual(
      defaultTheme.minFontSize,
    );
    expect(defaultTheme.minFontSize).toBe(14);
    expect(defaultTheme.width).toBe(600);
  });
});

describe('sequentialClasses', () => {
  it('matches its documented example: ramp steps spread evenly', () => {
    expect(sequentialClasses(3)).toEqual([SEQUENTIAL_RAMP[0], SEQUENTIAL_RAMP[3], SEQUENTIAL_RAMP[5]]);
    expect(sequentialClasses(SEQUENTIAL_RAMP.length)).toEqual(SEQUENTIAL_RAMP);
  });

  it('interpolates beyond the ramp length with lightness falling monotonically', () => {
    const colours = sequentialClasses(7);
    expect(colours).toHaveLength(7);
    expect(colours[0]).toBe(SEQUENTIAL_RAMP[0]);
    expect(colours[6]).toBe(SEQUENTIAL_RAMP[SEQUENTIAL_RAMP.length - 1]);
    const lightness = colours.map((colour) => lab(colour).l);
    for (let index = 1; index < lightness.length; index += 1)
      expect(lightness[index]!).toBeLessThan(lightness[index - 1]!);
  });
});
