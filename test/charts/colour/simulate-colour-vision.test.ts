import { describe, expect, it } from 'vitest';
import { simulateColourVision } from '../../../server/charts/colour/simulate-colour-vision.js';
import { COLOUR_VISION_DEFICIENCIES } from '../../../server/charts/colour/types.js';

// Pipeline (decode sRGB, multiply by the Machado et al. 2009 severity-1.0 matrix, clip, encode):
// check-values.md §2a regression values [C] derived, not published, ±1 per channel.
describe('simulateColourVision', () => {
  it.each([
    ['protanopia', [109, 95, 0]],
    ['deuteranopia', [163, 144, 0]],
    ['tritanopia', [255, 0, 15]],
  ] as const)('maps #FF0000 under %s to %j (check-values.md §2a, [C] derived)', (deficiency, expected) => {
    const seen = simulateColourVision('#FF0000', deficiency);
    seen.forEach((channel, index) => {
      expect(Math.abs(channel - expected[index]!)).toBeLessThanOrEqual(1);
    });
  });

  it('matches the documented example exactly', () => {
    expect(simulateColourVision('#ff0000', 'protanopia')).toEqual([109, 95, 0]);
    expect(simulateColourVision('#ff0000', 'deuteranopia')).toEqual([163, 144, 0]);
  });

  it('works on linear light: applying the matrix to gamma-encoded values would give protan red (39, 29, 0)', () => {
    // Guard against the common mistake of multiplying sRGB-encoded channels.
    const seen = simulateColourVision('#ff0000', 'protanopia');
    expect(seen[0]).toBeGreaterThan(100);
  });

  it.each(COLOUR_VISION_DEFICIENCIES)(
    'leaves white, black and greys unchanged under %s (rows sum to 1, [C])',
    (deficiency) => {
      for (const grey of ['#ffffff', '#000000', '#777777', '#3a3a3a']) {
        const expected = Number.parseInt(grey.slice(1, 3), 16);
        for (const channel of simulateColourVision(grey, deficiency)) {
          expect(Math.abs(channel - expected)).toBeLessThanOrEqual(1);
        }
      }
    },
  );

  it('returns the colour itself for normal vision', () => {
    expect(simulateColourVision('#12ab34', 'normal')).toEqual([18, 171, 52]);
  });

  it('returns integer channels in 0..255 even when the product leaves [0, 1]', () => {
    const seen = simulateColourVision('#0000ff', 'deuteranopia');
    for (const channel of seen) {
      expect(Number.isInteger(channel)).toBe(true);
      expect(channel).toBeGreaterThanOrEqual(0);
      expect(channel).toBeLessThanOrEqual(255);
    }
  });
});
