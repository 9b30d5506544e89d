/**
 * Sizes, fonts and colours shared by every renderer. Renderers read these values and never
 * hard-code their own.
 *
 * Size rule: every chart is drawn in a viewBox `width` (600) units wide, and one viewBox
 * unit is one CSS pixel when the chart is shown 600 px wide. So a font size of 14 units is 14 px at
 * 600 px width; no text in any chart is smaller than `minFontSize` (14). At 360 px width (a phone)
 * everything shrinks by 0.6, which is why tick labels default to 16 units and marks are kept few
 * and large rather than crammed.
 *
 * Mark colours come from the colour engineer's palettes (server/charts/colour/palettes.ts).
 */

import { lab, rgb } from 'd3-color';
import { CATEGORICAL_PALETTE, SEQUENTIAL_RAMP } from './colour/palettes.js';

/**
 * `classes` colours from the sequential ramp, lightest first. Up to the ramp's length (6) the
 * colours are ramp steps themselves, evenly spread (index round(i * (steps - 1) / (classes - 1))),
 * so the palette's measured contrast and colour-difference claims hold; beyond it, the ramp is
 * interpolated piecewise-linearly in CIELAB (d3-color `lab`).
 *
 * @example
 * sequentialClasses(3); // [SEQUENTIAL_RAMP[0], SEQUENTIAL_RAMP[3], SEQUENTIAL_RAMP[5]]
 */
export function sequentialClasses(classes: number): readonly string[] {
  const steps = SEQUENTIAL_RAMP.length;
  if (classes <= 1) return [SEQUENTIAL_RAMP[steps - 1]!];
  if (classes <= steps) {
    return Array.from(
      { length: classes },
      (_, index) => SEQUENTIAL_RAMP[Math.round((index * (steps - 1)) / (classes - 1))]!,
    );
  }
  return Array.from({ length: classes }, (_, index) => {
    const position = (index * (steps - 1)) / (classes - 1);
    const lower = Math.floor(position);
    const upper = Math.min(lower + 1, steps - 1);
    const t = position - lower;
    const a = lab(SEQUENTIAL_RAMP[lower]!);
    const b = lab(SEQUENTIAL_RAMP[upper]!);
    return rgb(lab(a.l + (b.l - a.l) * t, a.a + (b.a - a.a) * t, a.b + (b.b - a.b) * t)).formatHex();
  });
}

export interface Theme {
  /** Default viewBox width in units (= px at 600 px display width). */
  readonly width: number;
  /** Default viewBox height in units. */
  readonly height: number;
  readonly fontFamily: string;
  readonly fontSize: {
    readonly title: number;
    readonly axisTitle: number;
    readonly tick: number;
    readonly label: number;
    readonly legend: number;
    readonly note: number;
  };
  /** Smallest font size any text may use. */
  readonly minFontSize: number;
  /** Distance between text lines as a multiple of the font size. */
  readonly lineHeight: number;
  /** Outer padding of the drawing. */
  readonly padding: number;
  readonly colours: {
    readonly background: string;
    /** Text: #1a1a1a on white is 17.4:1 (WCAG SC 1.4.3 needs 4.5:1). */
    readonly text: string;
    /** Secondary text (notes): #555555 on white is 7.5:1. */
    readonly mutedText: string;
    /** Axis lines and tick marks: #595959 on white is 7.0:1 (SC 1.4.11 needs 3:1). */
    readonly axis: string;
    /** Gridlines: deliberately light; they are guides, not information carriers. */
    readonly grid: string;
    /** Region outlines, link lines, box-plot whiskers. */
    readonly outline: string;
    /** Fill of map regions without data. */
    readonly noData: string;
    /** Categorical mark colours in series order. */
    readonly categorical: readonly string[];
  };
  /** `classes` colours of the sequential ramp, lightest first. */
  readonly sequential: (classes: number) => readonly string[];
  /** Digits after the decimal point for every coordinate written to the SVG. */
  readonly digits: number;
}

/** The theme used when a caller passes none. */
export const defaultTheme: Theme = {
  width: 600,
  height: 400,
  fontFamily: 'system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif',
  fontSize: { title: 20, axisTitle: 16, tick: 16, label: 16, legend: 16, note: 14 },
  minFontSize: 14,
  lineHeight: 1.25,
  padding: 12,
  colours: {
    background: '#ffffff',
    text: '#1a1a1a',
    mutedText: '#555555',
    axis: '#595959',
    grid: '#dddddd',
    outline: '#4d4d4d',
    noData: '#eeeeee',
    categorical: CATEGORICAL_PALETTE,
  },
  sequential: sequentialClasses,
  digits: 2,
};
