/** Shared layout of charts with one category axis and one numeric axis (bars, box plots). */
import { type ScaleBand, scaleBand } from 'd3-scale';
import {
  drawCategoryAxis,
  drawNumericAxis,
  type NumericAxis,
  type NumericScale,
  type Rect,
  widestLabel,
  wrappedLineCount,
} from './axis.js';
import type { ChartCanvas } from './chart-canvas.js';
import { drawAxisTitles, plotFrame } from './plot-frame.js';

export interface BandLayoutOptions {
  readonly categories: readonly string[];
  readonly valueAxis: NumericAxis;
  readonly horizontal: boolean;
  readonly categoryTitle: string;
  readonly valueTitle: string;
  readonly gridlines: boolean;
  /** Free space right of the plot (value labels, direct labels). */
  readonly rightMargin?: number;
  /** Share of each band left empty between bands; default 0.25. */
  readonly paddingInner?: number;
}

export interface BandLayout {
  readonly plot: Rect;
  /** Category -> start of its band along the category axis. */
  readonly band: ScaleBand<string>;
  /** Value -> position along the value axis. */
  readonly value: NumericScale;
  /** Value where bars start: 0, or the near end of a truncated or log axis. */
  readonly base: number;
  readonly horizontal: boolean;
  /** Axes, tick labels and axis titles. */
  readonly axes: string;
}

/**
 * Lays out the plot for `categories` along one axis and `valueAxis` along the other: vertical
 * charts put categories at the bottom, horizontal ones at the left. The value axis title is drawn
 * above the plot (vertical) or under it (horizontal); category titles the other way round.
 */
export function bandLayout(canvas: ChartCanvas, options: BandLayoutOptions): BandLayout {
  const { categories, valueAxis, horizontal } = options;
  const tickSize = canvas.theme.fontSize.tick;
  const paddingInner = options.paddingInner ?? 0.25;
  const domain = categories.map((_, index) => String(index));
  let plot: Rect;
  const common = { rightMargin: options.rightMargin ?? 0 };
  let bottomLines = 1;
  if (horizontal) {
    plot = plotFrame(canvas, {
      ...common,
      leftLabels: categories,
      bottomLabels: valueAxis.labels,
      leftTitle: options.categoryTitle,
      bottomTitle: options.valueTitle,
    });
  } else {
    const roughWidth = canvas.right - canvas.left - widestLabel(valueAxis.labels, tickSize) - 10;
    const roughBand = (roughWidth / Math.max(categories.length, 1)) * (1 - paddingInner / 2);
    bottomLines = wrappedLineCount(categories, tickSize, roughBand);
    plot = plotFrame(canvas, {
      ...common,
      leftLabels: valueAxis.labels,
      bottomLabels: categories,
      bottomLabelLines: bottomLines,
      leftTitle: options.valueTitle,
      bottomTitle: options.categoryTitle,
    });
  }
  const band = scaleBand<string>()
    .domain(domain)
    .paddingInner(paddingInner)
    .paddingOuter(paddingInner / 2);
  const value = valueAxis.scale.copy().clamp(true) as NumericScale;
  if (horizontal) {
    band.range([plot.y, plot.y + plot.height]);
    value.range([plot.x, plot.x + plot.width]);
  } else {
    band.range([plot.x, plot.x + plot.width]);
    value.range([plot.y + plot.height, plot.y]);
  }
  const valueDomain = value.domain() as [number, number];
  const base = valueAxis.log ? valueDomain[0] : Math.min(Math.max(0, valueDomain[0]), valueDomain[1]);
  const ticks = categories.map((label, index) => ({
    label,
    position: band(String(index))! + band.bandwidth() / 2,
  }));
  const numeric = { ...valueAxis, scale: value };
  const parts = horizontal
    ? [
        drawNumericAxis(canvas, numeric, 'bottom', plot, options.gridlines),
        drawCategoryAxis(canvas, ticks, 'left', plot, { bandWidth: band.bandwidth() }),
        ...drawAxisTitles(canvas, plot, { left: options.categoryTitle, bottom: options.valueTitle }),
      ]
    : [
        drawNumericAxis(canvas, numeric, 'left', plot, options.gridlines),
        drawCategoryAxis(canvas, ticks, 'bottom', plot, {
          bandWidth: band.bandwidth() + band.step() * paddingInner * 0.8,
        }),
        ...drawAxisTitles(
          canvas,
          plot,
          { left: options.valueTitle, bottom: options.categoryTitle },
          bottomLines,
        ),
      ];
  return { plot, band, value, base, horizontal, axes: parts.join('') };
}

/**
 * The rectangle of a bar in a band layout: `offset`/`thickness` along the category axis
 * (absolute coordinates), from value `from` to value `to` along the value axis.
 */
export function barRect(
  layout: BandLayout,
  offset: number,
  thickness: number,
  from: number,
  to: number,
): Rect {
  const a = layout.value(from);
  const b = layout.value(to);
  const low = Math.min(a, b);
  const length = Math.abs(b - a);
  return layout.horizontal
    ? { x: low, y: offset, width: length, height: thickness }
    : { x: offset, y: low, width: thickness, height: length };
}
