/** Placing the plot rectangle and the axis titles around it. */
import { labelGap, type Rect, tickLength, widestLabel } from './axis.js';
import type { ChartCanvas } from './chart-canvas.js';
import { estimateTextWidth } from './text-metrics.js';

export interface PlotFrameOptions {
  /** Labels drawn left of the plot (numeric ticks or categories). */
  readonly leftLabels: readonly string[];
  /** Labels drawn under the plot. */
  readonly bottomLabels: readonly string[];
  /** Lines the bottom labels may wrap to; default 1. */
  readonly bottomLabelLines?: number;
  /** Title of the left axis: drawn horizontally above the plot. */
  readonly leftTitle?: string;
  /** Title of the bottom axis: centred under the tick labels. */
  readonly bottomTitle?: string;
  /** Free space right of the plot (for direct labels); default half the last bottom label. */
  readonly rightMargin?: number;
  /** Cap on the left label column as a share of the width; default 0.4. */
  readonly maxLeftShare?: number;
}

/** Places the plot rectangle inside the canvas's free area, leaving room for labels and titles. */
export function plotFrame(canvas: ChartCanvas, options: PlotFrameOptions): Rect {
  const sizes = canvas.theme.fontSize;
  const lineHeight = canvas.theme.lineHeight;
  const leftColumn = Math.min(
    widestLabel(options.leftLabels, sizes.tick),
    canvas.width * (options.maxLeftShare ?? 0.4),
  );
  const left = canvas.left + leftColumn + tickLength + labelGap;
  const top =
    canvas.top + (options.leftTitle !== undefined ? sizes.axisTitle * lineHeight + 6 : 0) + sizes.tick / 2;
  const lines = options.bottomLabels.length > 0 ? (options.bottomLabelLines ?? 1) : 0;
  const bottomSpace =
    tickLength +
    labelGap +
    lines * sizes.tick * lineHeight +
    (options.bottomTitle !== undefined ? sizes.axisTitle * lineHeight + 6 : 0);
  const lastLabel = options.bottomLabels[options.bottomLabels.length - 1] ?? '';
  const right =
    canvas.right - Math.max(options.rightMargin ?? 0, estimateTextWidth(lastLabel, sizes.tick) / 2);
  const bottom = canvas.bottom - bottomSpace;
  if (right - left < 40 || bottom - top < 40) throw new Error('chart is too small for its labels');
  return { x: left, y: top, width: right - left, height: bottom - top };
}

/** Draws the left axis title above the plot and the bottom axis title under it. */
export function drawAxisTitles(
  canvas: ChartCanvas,
  plot: Rect,
  titles: { left?: string; bottom?: string },
  bottomLines = 1,
): string[] {
  const sizes = canvas.theme.fontSize;
  const out: string[] = [];
  if (titles.left !== undefined) {
    out.push(
      canvas.text(canvas.left, plot.y - sizes.tick / 2 - 6, titles.left, {
        kind: 'axis-title',
        size: sizes.axisTitle,
        bold: true,
        align: 'bottom',
      }),
    );
  }
  if (titles.bottom !== undefined) {
    const y =
      plot.y + plot.height + tickLength + labelGap + bottomLines * sizes.tick * canvas.theme.lineHeight + 6;
    out.push(
      canvas.text(plot.x + plot.width / 2, y, titles.bottom, {
        kind: 'axis-title',
        size: sizes.axisTitle,
        bold: true,
        anchor: 'middle',
        align: 'top',
      }),
    );
  }
  return out;
}
