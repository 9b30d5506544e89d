import { describe, expect, it } from 'vitest';
import { renderTreemapChart } from '../../server/charts/treemap-chart.js';
import { byClass, num, parseSvg } from '../helpers/svg.js';
import { treemapSpec } from './fixtures/specs.js';

describe('renderTreemapChart', () => {
  it('gives each leaf an area close to its share of the total, without overlaps', () => {
    const root = parseSvg(renderTreemapChart(treemapSpec));
    const tiles = byClass(root, 'mark tile');
    expect(tiles).toHaveLength(5);
    const area = (row: string) => {
      const tile = tiles.find((candidate) => candidate.attributes['data-row'] === row)!;
      return num(tile, 'width') * num(tile, 'height');
    };
    // Ferry 200 vs School 150; 2-unit padding between tiles makes the ratio approximate.
    expect(area('1') / area('2')).toBeGreaterThan(1.2);
    expect(area('1') / area('2')).toBeLessThan(1.45);
    const rects = tiles.map((tile) => ({
      x: num(tile, 'x'),
      y: num(tile, 'y'),
      w: num(tile, 'width'),
      h: num(tile, 'height'),
    }));
    for (let i = 0; i < rects.length; i += 1) {
      for (let j = i + 1; j < rects.length; j += 1) {
        const a = rects[i]!;
        const b = rects[j]!;
        const overlap =
          Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x) > 0.01 &&
          Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y) > 0.01;
        expect(overlap).toBe(false);
      }
    }
    // Two groups, two colours.
    expect(new Set(tiles.map((tile) => tile.attributes['fill'])).size).toBe(2);
  });
});
