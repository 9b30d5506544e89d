/** Equal-interval colour classes for heat maps and shaded maps, and their legend. */

import { tickStep } from 'd3-array';
import { format, precisionFixed } from 'd3-format';
import { scaleQuantize } from 'd3-scale';
import type { ChartCanvas } from './chart-canvas.js';
import { element } from './svg.js';
import { estimateTextWidth } from './text-metrics.js';
import type { Theme } from './theme.js';

export interface ColourClasses {
  /** Class edges, lowest first: classes + 1 numbers. */
  readonly edges: readonly number[];
  /** Class colours, lightest (lowest) first. */
  readonly colours: readonly string[];
  /** Colour of a value's class. */
  readonly colourOf: (value: number) => string;
  /** Index of a value's class. */
  readonly classOf: (value: number) => number;
  readonly formatEdge: (value: number) => string;
}

/**
 * Equal-interval classes: `classes` intervals of one round width (1, 2, 2.5 or 5 times a power of ten,
 * starting at a multiple of it) that together cover the values' range; d3 `scaleQuantize` maps a value to its class (a value on an
 * inner edge belongs to the upper class). Colours come from the theme's sequential ramp.
 *
 * @see Slocum, T. A. et al. (2009), Thematic Cartography and Geovisualization, 3rd ed., ch. 4
 *   (equal-interval classification).
 * @example
 * equalIntervalClasses([5, 50], 5, defaultTheme).edges; // [0, 10, 20, 30, 40, 50]
 * equalIntervalClasses([12, 45], 3, defaultTheme).edges; // [0, 20, 40, 60]
 */
export function equalIntervalClasses(
  values: readonly number[],
  classes: number,
  theme: Theme,
): ColourClasses {
  if (values.length === 0) throw new Error('equalIntervalClasses requires at least one value');
  let low = Math.min(...values);
  let high = Math.max(...values);
  if (low === high) {
    low -= 1;
    high += 1;
  }
  // Round class width: d3's tick step (1, 2 or 5 times a power of ten) for the range, raised
  // through the sequence 1, 2, 2.5, 5, 10 until `classes` intervals from a multiple of it cover the range.
  let width = tickStep(low, high, classes);
  let start = Math.floor(low / width) * width;
  for (let attempt = 0; attempt < 10 && start + classes * width < high; attempt += 1) {
    const power = 10 ** Math.floor(Math.log10(width) + 1e-9);
    const mantissa = width / power;
    width = (mantissa < 1.5 ? 2 : mantissa < 2.25 ? 2.5 : mantissa < 3.5 ? 5 : 10) * power;
    start = Math.floor(low / width) * width;
  }
  const niceLow = start;
  const niceHigh = start + classes * width;
  const edges = Array.from({ length: classes + 1 }, (_, index) =>
    Number((niceLow + index * width).toPrecision(12)),
  );
  const colours = theme.sequential(classes);
  const indices = Array.from({ length: classes }, (_, index) => index);
  const quantize = scaleQuantize<number>().domain([niceLow, niceHigh]).range(indices);
  const classOf = (value: number) => quantize(value);
  return {
    edges,
    colours,
    classOf,
    colourOf: (value) => colours[classOf(value)]!,
    formatEdge: format(`,.${precisionFixed(width)}f`),
  };
}

/**
 * Draws the class legend under the title: an optional title, then one swatch per class with the
 * class edges printed under the swatch borders; takes its height off the canvas's free area.
 */
export function drawClassLegend(
  canvas: ChartCanvas,
  classes: ColourClasses,
  title: string,
  noData?: string,
): string {
  const size = canvas.theme.fontSize.legend;
  const labels = classes.edges.map(classes.formatEdge);
  const swatchWidth = Math.max(44, ...labels.map((label) => estimateTextWidth(label, size) + 10));
  const swatchHeight = 16;
  const n = (value: number) => canvas.n(value);
  const parts: string[] = [];
  let y = canvas.top;
  parts.push(
    canvas.text(canvas.left, y, title, {
      kind: 'legend',
      className: 'legend-title',
      size,
      bold: true,
      align: 'top',
    }),
  );
  y += size * canvas.theme.lineHeight + 2;
  const x0 = canvas.left + estimateTextWidth(labels[0]!, size) / 2;
  classes.colours.forEach((colour, index) => {
    parts.push(
      element('rect', {
        class: 'legend-swatch',
        x: n(x0 + index * swatchWidth),
        y: n(y),
        width: n(swatchWidth),
        height: swatchHeight,
        fill: colour,
        stroke: canvas.theme.colours.outline,
        'stroke-width': 0.5,
      }),
    );
  });
  labels.forEach((label, index) => {
    parts.push(
      canvas.text(x0 + index * swatchWidth, y + swatchHeight + 4, label, {
        kind: 'legend',
        className: 'legend-label',
        size,
        anchor: 'middle',
        align: 'top',
      }),
    );
  });
  if (noData !== undefined) {
    const x = x0 + classes.colours.length * swatchWidth + 24;
    parts.push(
      element('rect', {
        class: 'legend-swatch',
        x: n(x),
        y: n(y),
        width: 24,
        height: swatchHeight,
        fill: canvas.theme.colours.noData,
        stroke: canvas.theme.colours.outline,
        'stroke-width': 0.5,
      }),
    );
    parts.push(
      canvas.text(x + 30, y + swatchHeight / 2, noData, {
        kind: 'legend',
        className: 'legend-label',
        size,
        align: 'middle',
      }),
    );
  }
  canvas.reserveTop(y + swatchHeight + 4 + size * canvas.theme.lineHeight + 8 - canvas.top);
  return element('g', { class: 'legend class-legend' }, parts);
}
