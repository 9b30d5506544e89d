/** Axes: numeric scales from an axis spec, tick labels, and the SVG fragments that draw them. */
import { extent, range } from 'd3-array';
import { format, precisionFixed } from 'd3-format';
import { type ScaleLinear, type ScaleLogarithmic, scaleLinear, scaleLog } from 'd3-scale';
import type { ChartCanvas } from './chart-canvas.js';
import { formatNumber } from './chart-data.js';
import type { Axis } from './chart-spec.js';
import { element } from './svg.js';
import { estimateTextWidth, wrapText } from './text-metrics.js';

/** A rectangle in viewBox units: left, top, width, height. */
export interface Rect {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export type NumericScale = ScaleLinear<number, number> | ScaleLogarithmic<number, number>;

/** A numeric scale (range still unset) with its labelled ticks. */
export interface NumericAxis {
  readonly scale: NumericScale;
  readonly ticks: readonly number[];
  readonly labels: readonly string[];
  readonly log: boolean;
}

export interface NumericAxisOptions {
  /** Stretch the automatic domain to include 0 (bars, areas); ignored for log axes. */
  readonly includeZero?: boolean;
  /** Tick label format; default thousands separators with the tick step's decimals. */
  readonly format?: (value: number) => string;
  /** Approximate number of ticks d3 aims for; default 5. */
  readonly tickCount?: number;
  /** Keep only whole-number ticks (years, counts). */
  readonly integerTicks?: boolean;
  /** Widen the automatic domain by this share of its span on each side before making it nice (points
   * must not sit on an axis line); default 0. */
  readonly padding?: number;
}

/**
 * Builds the scale of a numeric axis: the spec's domain if given (it may be truncated), else the
 * data's extent (with 0 when asked) made nice by d3; ticks from `tickStep` or from d3's tick rules.
 * Log axes label powers of ten (and 2 and 5 times them when fewer than three powers fit).
 */
export function numericAxis(
  axis: Axis,
  values: readonly number[],
  options: NumericAxisOptions = {},
): NumericAxis {
  const count = options.tickCount ?? 5;
  const [low, high] = extent(values) as [number | undefined, number | undefined];
  if (low === undefined || high === undefined) throw new Error('numericAxis requires at least one value');
  if (axis.scale === 'log') {
    if (axis.domain === undefined && low <= 0) throw new Error('a log axis requires positive values');
    const domain = axis.domain ?? [
      10 ** Math.floor(Math.log10(low)),
      10 ** Math.ceil(Math.log10(high === low ? high * 10 : high)),
    ];
    const scale = scaleLog().domain(domain);
    const all = scale.ticks();
    const powers = all.filter((tick) => Math.abs(Math.log10(tick) - Math.round(Math.log10(tick))) < 1e-9);
    const ticks =
      powers.length >= 3
        ? powers
        : all.filter((tick) =>
            [1, 2, 5].includes(Math.round(tick / 10 ** Math.floor(Math.log10(tick) + 1e-9))),
          );
    const labelOf = options.format ?? formatNumber;
    return { scale, ticks, labels: ticks.map(labelOf), log: true };
  }
  let domain: [number, number];
  if (axis.domain !== undefined) {
    domain = [axis.domain[0], axis.domain[1]];
  } else {
    const margin = (high - low) * (options.padding ?? 0);
    // Padding never pushes a non-negative range below zero.
    const padded = low >= 0 ? Math.max(0, low - margin) : low - margin;
    let lo = options.includeZero ? Math.min(0, padded) : padded;
    let hi = options.includeZero ? Math.max(0, high + margin) : high + margin;
    if (lo === hi) {
      lo -= 1;
      hi += 1;
    }
    domain = scaleLinear().domain([lo, hi]).nice(count).domain() as [number, number];
  }
  const scale = scaleLinear().domain(domain);
  let ticks: number[];
  let step: number;
  if (axis.tickStep !== undefined) {
    step = axis.tickStep;
    const first = Math.ceil(domain[0] / step - 1e-9);
    const last = Math.floor(domain[1] / step + 1e-9);
    ticks = range(first, last + 1).map((multiple) => Number((multiple * step).toPrecision(12)));
  } else {
    ticks = scale.ticks(count);
    step = ticks.length > 1 ? ticks[1]! - ticks[0]! : 1;
  }
  if (options.integerTicks) {
    ticks = ticks.filter((tick) => Number.isInteger(tick));
    step = Math.max(1, step);
  }
  const labelOf = options.format ?? format(`,.${precisionFixed(step)}f`);
  return { scale, ticks, labels: ticks.map(labelOf), log: false };
}

/** Widest of some labels at a font size (estimated). */
export function widestLabel(labels: readonly string[], fontSize: number): number {
  return labels.reduce((widest, label) => Math.max(widest, estimateTextWidth(label, fontSize)), 0);
}

/** Length of tick marks and gap between tick and label, in viewBox units. */
export const tickLength = 5;
export const labelGap = 4;

/** Draws a numeric axis (line, ticks, labels, optional gridlines) on the left or bottom of the plot. */
export function drawNumericAxis(
  canvas: ChartCanvas,
  axis: NumericAxis,
  side: 'left' | 'bottom',
  plot: Rect,
  gridlines: boolean,
): string {
  const colours = canvas.theme.colours;
  const n = (value: number) => canvas.n(value);
  const parts: string[] = [];
  axis.ticks.forEach((tick, index) => {
    const position = axis.scale(tick);
    const label = axis.labels[index] ?? '';
    if (side === 'left') {
      if (gridlines)
        parts.push(
          element('line', {
            class: 'gridline',
            x1: n(plot.x),
            x2: n(plot.x + plot.width),
            y1: n(position),
            y2: n(position),
            stroke: colours.grid,
          }),
        );
      parts.push(
        element('line', {
          class: 'tick',
          x1: n(plot.x - tickLength),
          x2: n(plot.x),
          y1: n(position),
          y2: n(position),
          stroke: colours.axis,
        }),
      );
      parts.push(
        canvas.text(plot.x - tickLength - labelGap, position, label, {
          kind: 'tick',
          className: 'tick-label',
          size: canvas.theme.fontSize.tick,
          anchor: 'end',
          align: 'middle',
        }),
      );
    } else {
      const bottom = plot.y + plot.height;
      if (gridlines)
        parts.push(
          element('line', {
            class: 'gridline',
            x1: n(position),
            x2: n(position),
            y1: n(plot.y),
            y2: n(bottom),
            stroke: colours.grid,
          }),
        );
      parts.push(
        element('line', {
          class: 'tick',
          x1: n(position),
          x2: n(position),
          y1: n(bottom),
          y2: n(bottom + tickLength),
          stroke: colours.axis,
        }),
      );
      parts.push(
        canvas.text(position, bottom + tickLength + labelGap, label, {
          kind: 'tick',
          className: 'tick-label',
          size: canvas.theme.fontSize.tick,
          anchor: 'middle',
          align: 'top',
        }),
      );
    }
  });
  parts.push(axisLine(canvas, side, plot));
  return element('g', { class: `axis axis-${side}` }, parts);
}

/** A category on a category axis: its label and the centre of its band or point. */
export interface CategoryTick {
  readonly label: string;
  readonly position: number;
}

/**
 * Draws a category axis. Bottom labels wrap at spaces to `bandWidth` (up to `maxLines`); with
 * `every` > 1 only every `every`-th label is printed (time axes with many points).
 */
export function drawCategoryAxis(
  canvas: ChartCanvas,
  ticks: readonly CategoryTick[],
  side: 'left' | 'bottom',
  plot: Rect,
  layout: { bandWidth: number; maxLines?: number; every?: number },
): string {
  const size = canvas.theme.fontSize.tick;
  const parts: string[] = [];
  const every = layout.every ?? 1;
  ticks.forEach((tick, index) => {
    if (index % every !== 0) return;
    if (side === 'bottom') {
      const lines = wrapText(tick.label, size, layout.bandWidth).slice(0, layout.maxLines ?? 2);
      const y = plot.y + plot.height + tickLength + labelGap;
      parts.push(
        ...canvas.lines(tick.position, y, lines, {
          kind: 'tick',
          className: 'tick-label',
          size,
          anchor: 'middle',
          align: 'top',
        }),
      );
    } else {
      const maxWidth = plot.x - tickLength - labelGap - canvas.left;
      const lines = wrapText(tick.label, size, maxWidth).slice(0, layout.maxLines ?? 2);
      const first = tick.position - ((lines.length - 1) * size * canvas.theme.lineHeight) / 2;
      parts.push(
        ...canvas.lines(plot.x - tickLength - labelGap, first, lines, {
          kind: 'tick',
          className: 'tick-label',
          size,
          anchor: 'end',
          align: 'middle',
        }),
      );
    }
  });
  parts.push(axisLine(canvas, side, plot));
  return element('g', { class: `axis axis-${side}` }, parts);
}

/** Number of lines the longest of `labels` needs when wrapped to `width`. */
export function wrappedLineCount(
  labels: readonly string[],
  fontSize: number,
  width: number,
  maxLines = 2,
): number {
  return labels.reduce(
    (most, label) => Math.max(most, Math.min(maxLines, wrapText(label, fontSize, width).length)),
    1,
  );
}

/** Smallest k so that printing every k-th of `labels`, `step` apart, leaves 8 units between them. */
export function labelInterval(labels: readonly string[], fontSize: number, step: number): number {
  const widest = widestLabel(labels, fontSize) + 8;
  return Math.max(1, Math.ceil(widest / Math.max(step, 1e-9)));
}

function axisLine(canvas: ChartCanvas, side: 'left' | 'bottom', plot: Rect): string {
  const bottom = plot.y + plot.height;
  const coords =
    side === 'left'
      ? { x1: plot.x, x2: plot.x, y1: plot.y, y2: bottom }
      : { x1: plot.x, x2: plot.x + plot.width, y1: bottom, y2: bottom };
  return element('line', {
    class: 'domain',
    x1: canvas.n(coords.x1),
    x2: canvas.n(coords.x2),
    y1: canvas.n(coords.y1),
    y2: canvas.n(coords.y2),
    stroke: canvas.theme.colours.axis,
  });
}
