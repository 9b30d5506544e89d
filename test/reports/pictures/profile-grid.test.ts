import { describe, expect, it } from 'vitest';
import { contrastRatio } from '../../../server/charts/colour/contrast-ratio.js';
import { renderProfileGrid } from '../../../server/reports/pictures/profile-grid.js';
import type { ReportCell } from '../../../server/reports/report-types.js';

const cell = (
  chartType: ReportCell['chartType'],
  level: ReportCell['level'],
  shareAtRp: number,
): ReportCell => ({
  chartType,
  level,
  itemCount: 2,
  typicalDifficulty: 0,
  rpLocation: 0.708,
  expectedShareCorrect: 0.5,
  expectedShareInterval: null,
  shareAtRp,
  shareAtRpInterval: null,
});

describe('renderProfileGrid', () => {
  const cells = [
    cell('bar', 'read', 0.93),
    cell('bar', 'interpret', 0.55),
    cell('network', 'envision', 0.07),
  ];
  const svg = renderProfileGrid(cells, { title: 'Profile' });

  it('prints every share as text, so colour is never the only channel, and has a text alternative', () => {
    for (const text of ['93%', '55%', '7%', 'no items']) expect(svg).toContain(`>${text}</text>`);
    expect(svg).toMatch(/<title id="[^"]+">Profile<\/title>/);
    expect(svg).toContain('Highest: bar charts, read, 93%');
  });

  it('gives every label on a fill at least 3:1, and sets it as large bold text (WCAG 2.1 SC 1.4.3, large-scale text)', () => {
    const pairs = [
      ...svg.matchAll(/<rect[^>]*fill="(#[0-9a-f]{6})"[^>]*\/><text([^>]*)fill="(#[0-9a-f]{6})"/g),
    ];
    expect(pairs.length).toBeGreaterThanOrEqual(3 * 2 + 5);
    for (const [, fill, attrs, text] of pairs) {
      if (fill === '#eeeeee' || fill === '#ffffff') {
        expect(contrastRatio(text!, fill)).toBeGreaterThanOrEqual(4.5); // "no items" and text on the white background: small text
        continue;
      }
      expect(attrs).toContain('font-size="19" font-weight="bold"'); // 19 px bold ≥ 14 pt bold
      expect(contrastRatio(text!, fill!)).toBeGreaterThanOrEqual(3);
    }
  });
});
