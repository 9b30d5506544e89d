import { describe, expect, it } from 'vitest';
import {
  checkCategoricalColours,
  MIN_CATEGORICAL_DIFFERENCE,
} from '../../../server/charts/colour/check-categorical-colours.js';
import { ciede2000 } from '../../../server/charts/colour/ciede2000.js';
import { contrastRatio } from '../../../server/charts/colour/contrast-ratio.js';
import { meetsContrast } from '../../../server/charts/colour/meets-contrast.js';
import {
  CATEGORICAL_PALETTE,
  CATEGORICAL_SAFE_COUNT,
  SEQUENTIAL_RAMP,
} from '../../../server/charts/colour/palettes.js';
import { simulateColourVision } from '../../../server/charts/colour/simulate-colour-vision.js';
import { srgbToLab } from '../../../server/charts/colour/srgb-to-lab.js';
import { COLOUR_VISION_DEFICIENCIES, type ColourVision } from '../../../server/charts/colour/types.js';

const VISIONS: readonly ColourVision[] = ['normal', ...COLOUR_VISION_DEFICIENCIES];

/** Smallest ΔE00 over all pairs of `colours` and all four visions. */
function smallestDifference(colours: readonly string[]): number {
  let smallest = Number.POSITIVE_INFINITY;
  for (const vision of VISIONS) {
    const labs = colours.map((colour) => srgbToLab(simulateColourVision(colour, vision)));
    for (let i = 0; i < labs.length; i++) {
      for (let j = i + 1; j < labs.length; j++) smallest = Math.min(smallest, ciede2000(labs[i]!, labs[j]!));
    }
  }
  return smallest;
}

describe('CATEGORICAL_PALETTE', () => {
  it('has 8 distinct colours in #rrggbb form', () => {
    expect(CATEGORICAL_PALETTE).toHaveLength(8);
    expect(new Set(CATEGORICAL_PALETTE).size).toBe(8);
    for (const colour of CATEGORICAL_PALETTE) expect(colour).toMatch(/^#[0-9a-f]{6}$/);
  });

  it.each(CATEGORICAL_PALETTE)(
    '%s has >= 3:1 contrast on white (WCAG 2.1 SC 1.4.11, unrounded)',
    (colour) => {
      expect(meetsContrast(contrastRatio(colour, '#ffffff'), 3)).toBe(true);
    },
  );

  it(`keeps the first CATEGORICAL_SAFE_COUNT (${CATEGORICAL_SAFE_COUNT}) colours distinguishable under every vision`, () => {
    expect(CATEGORICAL_SAFE_COUNT).toBe(8);
    const safe = CATEGORICAL_PALETTE.slice(0, CATEGORICAL_SAFE_COUNT);
    const report = checkCategoricalColours(safe, '#ffffff');
    expect(report.problems).toEqual([]);
    expect(report.ok).toBe(true);
    expect(smallestDifference(safe)).toBeGreaterThanOrEqual(MIN_CATEGORICAL_DIFFERENCE);
  });

  it('matches the margins stated in its documentation (all 8 >= 13.9, first 5 >= 16, first 4 >= 24)', () => {
    expect(smallestDifference(CATEGORICAL_PALETTE)).toBeGreaterThanOrEqual(13.9);
    expect(smallestDifference(CATEGORICAL_PALETTE.slice(0, 5))).toBeGreaterThanOrEqual(16);
    expect(smallestDifference(CATEGORICAL_PALETTE.slice(0, 4))).toBeGreaterThanOrEqual(24);
  });
});

describe('SEQUENTIAL_RAMP', () => {
  it('has at least 5 steps', () => {
    expect(SEQUENTIAL_RAMP.length).toBeGreaterThanOrEqual(5);
  });

  it('runs light to dark: L* strictly decreasing, from near white to dark', () => {
    const lightness = SEQUENTIAL_RAMP.map((colour) => srgbToLab(colour).l);
    for (let i = 1; i < lightness.length; i++) expect(lightness[i]!).toBeLessThan(lightness[i - 1]!);
    expect(lightness[0]!).toBeGreaterThan(90);
    expect(lightness.at(-1)!).toBeLessThan(30);
  });

  it('keeps one hue family (CIELAB hue angle within 235°–265°)', () => {
    for (const colour of SEQUENTIAL_RAMP) {
      const { a, b } = srgbToLab(colour);
      const hue = ((Math.atan2(b, a) * 180) / Math.PI + 360) % 360;
      expect(hue).toBeGreaterThanOrEqual(235);
      expect(hue).toBeLessThanOrEqual(265);
    }
  });

  it.each(VISIONS)(
    'has adjacent steps distinguishable (ΔE00 >= threshold) and monotonic L* under %s',
    (vision) => {
      const labs = SEQUENTIAL_RAMP.map((colour) => srgbToLab(simulateColourVision(colour, vision)));
      for (let i = 1; i < labs.length; i++) {
        expect(labs[i]!.l).toBeLessThan(labs[i - 1]!.l);
        expect(ciede2000(labs[i - 1]!, labs[i]!)).toBeGreaterThanOrEqual(MIN_CATEGORICAL_DIFFERENCE);
      }
    },
  );
});
