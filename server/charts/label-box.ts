/**
 * Bounding boxes of the text labels a renderer placed, for the bank lint's overlap check.
 *
 * Every renderer reports each text it draws through `options.onLabel` (see `ChartRenderOptions`);
 * `collectLabelBoxes` in render-chart.ts gathers them for one spec. Boxes are axis-aligned, in
 * viewBox units, from estimated text metrics (text-metrics.ts).
 */
export interface LabelBox {
  /** Left edge. */
  readonly x: number;
  /** Top edge. */
  readonly y: number;
  readonly width: number;
  readonly height: number;
  readonly text: string;
  /** What the label is: 'title', 'tick', 'axis-title', 'value', 'legend', 'direct', 'slice', 'region', 'node', 'tile', 'cell', 'annotation', 'note', 'header'. */
  readonly kind: string;
}

/**
 * Pairs of labels whose boxes overlap by more than `tolerance` units in both directions.
 *
 * @param boxes label boxes of one chart
 * @param tolerance overlap (in viewBox units) that is still accepted, default 1
 * @returns index pairs [i, j] with i < j, in order
 * @example
 * findOverlappingLabels([{ x: 0, y: 0, width: 10, height: 10, text: 'a', kind: 'tick' },
 *   { x: 5, y: 5, width: 10, height: 10, text: 'b', kind: 'tick' }]); // [[0, 1]]
 */
export function findOverlappingLabels(boxes: readonly LabelBox[], tolerance = 1): Array<[number, number]> {
  const pairs: Array<[number, number]> = [];
  for (let i = 0; i < boxes.length; i += 1) {
    const a = boxes[i]!;
    for (let j = i + 1; j < boxes.length; j += 1) {
      const b = boxes[j]!;
      const overlapX = Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x);
      const overlapY = Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y);
      if (overlapX > tolerance && overlapY > tolerance) pairs.push([i, j]);
    }
  }
  return pairs;
}
