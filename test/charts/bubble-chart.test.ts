import { describe, expect, it } from 'vitest';
import { renderBubbleChart } from '../../server/charts/bubble-chart.js';
import { byClass, num, parseSvg, textsOf } from '../helpers/svg.js';
import { bubbleSpec } from './fixtures/specs.js';

describe('renderBubbleChart', () => {
  it('makes bubble area proportional to size, drawing the largest first', () => {
    const root = parseSvg(renderBubbleChart(bubbleSpec));
    const bubbles = byClass(root, 'mark bubble');
    expect(bubbles.map((bubble) => bubble.attributes['data-row'])).toEqual(['0', '1', '2']);
    const radius = (row: string) =>
      num(bubbles.find((bubble) => bubble.attributes['data-row'] === row)!, 'r');
    // Areas 900 : 400 : 100 people -> radii 3 : 2 : 1 (area ~ r squared).
    expect(radius('0') / radius('1')).toBeCloseTo(1.5, 2);
    expect(radius('0') / radius('2')).toBeCloseTo(3, 2);
    expect(textsOf(root, 'point-label')).toEqual(['Ebb', 'Kelp', 'Rook']);
  });
});
