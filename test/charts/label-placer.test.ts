import { describe, expect, it } from 'vitest';
import { type LabelRequest, placeLabels } from '../../server/charts/label-placer.js';
import { estimateTextWidth } from '../../server/charts/text-metrics.js';

const bounds = { x: 0, y: 0, width: 300, height: 200 };
const label = (text: string, x: number, y: number, markRadius = 5): LabelRequest => ({
  text,
  x,
  y,
  markRadius,
  size: 16,
});
type Box = { x: number; y: number; width: number; height: number };
const apart = (a: Box, b: Box) =>
  a.x + a.width <= b.x || b.x + b.width <= a.x || a.y + a.height <= b.y || b.y + b.height <= a.y;

describe('placeLabels', () => {
  it('matches its documented example: right of the mark, 4 units past its edge, centred on it', () => {
    const [placed] = placeLabels([label('A', 50, 50)], { bounds: { x: 0, y: 0, width: 100, height: 100 } });
    expect(placed).toMatchObject({ x: 59, y: 50, anchor: 'start', clear: true });
    expect(placed!.box).toEqual({ x: 59, y: 42, width: estimateTextWidth('A', 16), height: 16 });
    expect(placed!.leader).toBeUndefined();
  });

  it('moves a label left of its mark when the right side would leave the bounds', () => {
    const [placed] = placeLabels([label('Harbour', 290, 100)], { bounds });
    expect(placed!.anchor).toBe('end');
    expect(placed!.x).toBe(281);
    expect(placed!.box.x + placed!.box.width).toBeCloseTo(281, 10);
  });

  it('keeps two labels of nearly coincident points apart (the second goes to the next free side)', () => {
    const placements = placeLabels([label('Skua', 100, 100), label('Minnow', 104, 102)], { bounds });
    expect(apart(placements[0]!.box, placements[1]!.box)).toBe(true);
    expect(placements[0]!.anchor).toBe('start');
    expect(placements[1]!.anchor).toBe('end');
  });

  it('avoids fixed boxes such as tick labels and titles', () => {
    const fixed = [{ x: 105, y: 80, width: 150, height: 40 }];
    const [placed] = placeLabels([label('Gull', 100, 100)], { bounds, fixed });
    expect(apart(placed!.box, fixed[0]!)).toBe(true);
  });

  it('prefers a side that covers no other mark', () => {
    // A point right of the anchor: the label should not sit on it.
    const marks = [
      { x: 100, y: 100, r: 5, weight: 300 },
      { x: 125, y: 100, r: 5, weight: 300 },
    ];
    const [placed] = placeLabels([label('Tern', 100, 100)], { bounds, marks });
    expect(placed!.anchor).toBe('end');
  });

  it('falls back to a leader line when all adjacent positions are taken', () => {
    const crowd = [label('Alder', 150, 100), label('Birch', 150, 100), label('Cedar', 150, 100)];
    const many = [
      ...crowd,
      ...['Elm', 'Fir', 'Hazel', 'Larch', 'Maple', 'Oak', 'Pine'].map((t) => label(t, 150, 100)),
    ];
    const placements = placeLabels(many, { bounds });
    for (let i = 0; i < placements.length; i += 1)
      for (let j = i + 1; j < placements.length; j += 1)
        expect(apart(placements[i]!.box, placements[j]!.box)).toBe(true);
    expect(placements.some((placement) => placement.leader !== undefined)).toBe(true);
    expect(placements.every((placement) => placement.clear)).toBe(true);
  });

  it('flags a label it cannot place clear of the others instead of overlapping silently', () => {
    const tiny = { x: 0, y: 0, width: 80, height: 20 };
    const placements = placeLabels([label('Aa', 10, 10, 0), label('Bb', 10, 10, 0)], {
      bounds: tiny,
      rings: 0,
    });
    expect(placements.map((placement) => placement.clear)).toEqual([true, false]);
  });

  it('centres a label on its anchor when asked and the spot is inside the preferred area', () => {
    const [placed] = placeLabels(
      [{ ...label('Mossridge', 150, 100, 0), centred: true, prefer: () => true }],
      {
        bounds,
      },
    );
    expect(placed).toMatchObject({ x: 150, y: 100, anchor: 'middle' });
  });

  it('is deterministic', () => {
    const requests = [label('Alder', 150, 100), label('Birch', 152, 101), label('Cedar', 149, 99)];
    expect(placeLabels(requests, { bounds })).toEqual(placeLabels(requests, { bounds }));
  });
});
