/** Draws labels at the positions {@link placeLabels} chose, with leader lines where needed. */
import type { Rect } from './axis.js';
import type { ChartCanvas } from './chart-canvas.js';
import type { LabelPlacement, LabelRequest } from './label-placer.js';
import { element } from './svg.js';

const classNames: Readonly<Record<string, string>> = {
  point: 'point-label',
  direct: 'direct-label',
  region: 'region-label',
};

/**
 * One `<text>` per placement (with a white halo, `align: 'middle'`), preceded by its leader line
 * (`line.leader`, 1 unit, text colour) when the label sits away from its mark.
 *
 * @param kinds label kind per request ('point', 'direct', 'region'); sets the class and the lint kind
 */
export function drawPlacedLabels(
  canvas: ChartCanvas,
  requests: readonly LabelRequest[],
  kinds: readonly string[],
  placements: readonly LabelPlacement[],
): string[] {
  const n = (value: number) => canvas.n(value);
  return placements.flatMap((placement, index) => {
    const request = requests[index]!;
    const kind = kinds[index]!;
    const parts: string[] = [];
    if (placement.leader !== undefined) {
      parts.push(
        element('line', {
          class: 'leader',
          x1: n(placement.leader.x1),
          y1: n(placement.leader.y1),
          x2: n(placement.leader.x2),
          y2: n(placement.leader.y2),
          stroke: canvas.theme.colours.text,
          'stroke-width': 1,
        }),
      );
    }
    parts.push(
      canvas.text(placement.x, placement.y, request.text, {
        kind,
        className: classNames[kind] ?? kind,
        size: request.size,
        anchor: placement.anchor,
        align: 'middle',
        bold: request.bold ?? false,
        halo: true,
      }),
    );
    return parts;
  });
}

/** Where point labels may go on an x-y chart: the plot, the free band above it and the right margin. */
export function labelBounds(canvas: ChartCanvas, plot: Rect): Rect {
  return {
    x: plot.x,
    y: canvas.top,
    width: canvas.right - plot.x,
    height: plot.y + plot.height - canvas.top,
  };
}
