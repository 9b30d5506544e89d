/** Legends (a swatch and a name per series, wrapped into rows) and direct-label placement. */
import type { ChartCanvas } from './chart-canvas.js';
import { element } from './svg.js';
import { estimateTextWidth } from './text-metrics.js';

export interface LegendEntry {
  readonly label: string;
  readonly colour: string;
  /** Swatch drawn: a square (bars, areas, tiles), a short line (lines) or a dot (points). */
  readonly shape: 'square' | 'line' | 'circle';
}

const swatch = 14;
const swatchGap = 6;
const entryGap = 18;

/**
 * Draws a legend under the title, entries left to right and wrapped into rows, and takes its
 * height off the canvas's free area. Each entry is a <g class="legend-item">.
 */
export function drawLegend(canvas: ChartCanvas, entries: readonly LegendEntry[], title?: string): string {
  if (entries.length === 0) return '';
  const size = canvas.theme.fontSize.legend;
  const rowHeight = size * canvas.theme.lineHeight + 4;
  const parts: string[] = [];
  let x = canvas.left;
  let y = canvas.top;
  if (title !== undefined) {
    parts.push(
      canvas.text(x, y + rowHeight / 2, title, {
        kind: 'legend',
        className: 'legend-title',
        size,
        bold: true,
        align: 'middle',
      }),
    );
    x += estimateTextWidth(title, size, true) + entryGap;
  }
  for (const entry of entries) {
    const width = swatch + swatchGap + estimateTextWidth(entry.label, size);
    if (x > canvas.left && x + width > canvas.right) {
      x = canvas.left;
      y += rowHeight;
    }
    const middle = y + rowHeight / 2;
    parts.push(
      element('g', { class: 'legend-item' }, [
        swatchMark(canvas, entry, x, middle),
        canvas.text(x + swatch + swatchGap, middle, entry.label, {
          kind: 'legend',
          className: 'legend-label',
          size,
          align: 'middle',
        }),
      ]),
    );
    x += width + entryGap;
  }
  canvas.reserveTop(y + rowHeight + 6 - canvas.top);
  return element('g', { class: 'legend' }, parts);
}

function swatchMark(canvas: ChartCanvas, entry: LegendEntry, x: number, middle: number): string {
  const n = (value: number) => canvas.n(value);
  if (entry.shape === 'line') {
    return element('line', {
      x1: n(x),
      x2: n(x + swatch),
      y1: n(middle),
      y2: n(middle),
      stroke: entry.colour,
      'stroke-width': 3,
    });
  }
  if (entry.shape === 'circle') {
    return element('circle', { cx: n(x + swatch / 2), cy: n(middle), r: swatch / 2 - 1, fill: entry.colour });
  }
  return element('rect', {
    x: n(x),
    y: n(middle - swatch / 2),
    width: swatch,
    height: swatch,
    fill: entry.colour,
  });
}

/**
 * Moves label centres apart so neighbours are at least `gap` apart, keeping them within
 * [low, high] where possible and as close to their wanted positions as the order allows
 * (one pass down, one pass up). Returns the new positions in the input order.
 *
 * @example
 * spreadLabels([10, 12, 30], 10, 0, 100); // [10, 20, 30]
 */
export function spreadLabels(wanted: readonly number[], gap: number, low: number, high: number): number[] {
  const order = wanted.map((_, index) => index).sort((a, b) => wanted[a]! - wanted[b]! || a - b);
  const placed = order.map((index) => Math.min(Math.max(wanted[index]!, low), high));
  for (let i = 1; i < placed.length; i += 1) placed[i] = Math.max(placed[i]!, placed[i - 1]! + gap);
  if (placed.length > 0 && placed[placed.length - 1]! > high) {
    placed[placed.length - 1] = high;
    for (let i = placed.length - 2; i >= 0; i -= 1) placed[i] = Math.min(placed[i]!, placed[i + 1]! - gap);
  }
  const result = new Array<number>(wanted.length);
  order.forEach((index, rank) => {
    result[index] = placed[rank]!;
  });
  return result;
}

/** Room for direct labels right of a plot: gap, 12-unit swatch, gap, widest label, margin. */
export function directLabelWidth(canvas: ChartCanvas, labels: readonly string[]): number {
  return (
    labels.reduce(
      (widest, label) => Math.max(widest, estimateTextWidth(label, canvas.theme.fontSize.label)),
      0,
    ) + 26
  );
}
