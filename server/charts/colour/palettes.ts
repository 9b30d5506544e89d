/**
 * The chart theme's colours: a categorical palette for nominal data and a sequential ramp for
 * heatmaps and choropleths. Both were chosen for this project by a bounded search over the sRGB
 * cube (a 4-step grid) that maximised the smallest CIEDE2000 difference between simulated
 * colours, then checked by hand; they do not reproduce any published palette.
 *
 * Categorical palette, measured (test/charts/colour/palettes.test.ts proves each claim):
 * - every colour has contrast >= 3:1 on white #ffffff (WCAG 2.1 SC 1.4.11); the lowest is
 *   #889800 at about 3.2:1, so the palette is for marks on white or near-white only;
 * - all 8 colours are pairwise distinguishable (ΔE00 >= `MIN_CATEGORICAL_DIFFERENCE` = 10)
 *   with normal vision and under simulated protanopia, deuteranopia and tritanopia (Machado et al.
 *   2009, severity 1.0); the smallest difference over all pairs and visions is about 14.0;
 * - the order is chosen so that short prefixes are the most robust: the first 4 stay >= 24 apart
 *   under every vision, the first 5 >= 16. Use colours in order and prefer fewer series.
 *
 * Colour is never the only cue (WCAG 2.2 SC 1.4.1 Use of Color): charts with a legend should
 * also label series directly or vary marker shape or line dash where they can.
 *
 * @see W3C WCAG 2.1 SC 1.4.11 Non-text Contrast; Machado, Oliveira & Fernandes (2009), IEEE TVCG
 *   15(6), 1291–1298; Sharma, Wu & Dalal (2005), Color Research & Application 30(1), 21–30.
 */

/** Categorical colours in the order series should take them. */
export const CATEGORICAL_PALETTE: readonly string[] = [
  '#0c4888', // deep blue
  '#802024', // oxblood red
  '#889800', // olive
  '#a8788c', // dusty mauve
  '#0898d0', // sky blue
  '#007858', // pine green
  '#7040e8', // violet
  '#905c14', // amber brown
];

/**
 * How many leading colours of {@link CATEGORICAL_PALETTE} are pairwise distinguishable under
 * normal vision and all three simulated dichromacies at the lint threshold: all of them.
 */
export const CATEGORICAL_SAFE_COUNT = 8;

/**
 * Sequential ramp of one hue (blue, CIELAB hue angle about 235°–265°), light to dark, for
 * heatmaps and choropleths. L* falls monotonically from about 94 to 26; adjacent steps differ by
 * ΔE00 >= 11.7 with normal vision and under each simulated dichromacy. The light end is below
 * 3:1 on white by design: cells sit on each other, not on the page, so label values directly or
 * outline cells where a light cell meets the background.
 */
export const SEQUENTIAL_RAMP: readonly string[] = [
  '#e0f0f8',
  '#acd4f8',
  '#1cacec',
  '#1484c8',
  '#006498',
  '#084064',
];
