import { describe, expect, it } from 'vitest';
import { chartSpecSchema } from '../../server/charts/chart-spec.js';
import { findOverlappingLabels, type LabelBox } from '../../server/charts/label-box.js';
import { collectLabelBoxes } from '../../server/charts/render-chart.js';
import { barSpec } from './fixtures/specs.js';

const box = (x: number, y: number, text = 't'): LabelBox => ({
  x,
  y,
  width: 10,
  height: 10,
  text,
  kind: 'tick',
});

describe('findOverlappingLabels', () => {
  it('matches its documented example', () => {
    expect(findOverlappingLabels([box(0, 0, 'a'), box(5, 5, 'b')])).toEqual([[0, 1]]);
  });

  it('accepts boxes that touch or overlap by less than the tolerance', () => {
    expect(findOverlappingLabels([box(0, 0), box(10, 0), box(0, 10.5)])).toEqual([]);
    expect(findOverlappingLabels([box(0, 0), box(9.5, 0)])).toEqual([]);
    expect(findOverlappingLabels([box(0, 0), box(8, 0)])).toEqual([[0, 1]]);
  });

  it('finds the collisions of long category names under narrow vertical bars', () => {
    const names = [
      'North harbour quay',
      'South harbour quay',
      'Lighthouse point',
      'Old customs house',
      'Seal rocks landing',
      'Kelp bay jetty',
      'Rook cliff steps',
      'Moss valley halt',
    ];
    const crowded = chartSpecSchema.parse({
      ...barSpec,
      annotation: undefined,
      fields: [
        { name: 'month', kind: 'nominal', label: 'Stop' },
        { name: 'crossings', kind: 'quantitative', label: 'Crossings' },
      ],
      data: names.map((month, index) => ({ month, crossings: index + 1 })),
    });
    const boxes = collectLabelBoxes(crowded);
    const overlaps = findOverlappingLabels(boxes);
    expect(overlaps.length).toBeGreaterThan(0);
    for (const [i, j] of overlaps) expect(boxes[i]!.kind === 'tick' || boxes[j]!.kind === 'tick').toBe(true);
  });
});
