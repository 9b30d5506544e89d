import { describe, expect, it } from 'vitest';
import { complexityLadder } from '../../server/reports/complexity-ladder.js';
import { type ProfileItem, readabilityProfile } from '../../server/reports/readability-profile.js';
import { shareAtOrAbove } from '../../server/scoring/statistics/share-at-or-above.js';

const items: ProfileItem[] = [
  { itemId: 'b1', chartType: 'bar', level: 'read', difficulty: -2.4 },
  { itemId: 'b2', chartType: 'bar', level: 'read', difficulty: -1.8 },
  { itemId: 'b3', chartType: 'bar', level: 'read', difficulty: -2.0 },
  { itemId: 't1', chartType: 'table', level: 'read', difficulty: -2.2 },
  { itemId: 's1', chartType: 'scatter', level: 'interpret', difficulty: -0.9 },
  { itemId: 's2', chartType: 'scatter', level: 'interpret', difficulty: -0.5 },
  { itemId: 'n1', chartType: 'network', level: 'envision', difficulty: 2.6 },
];
const audience = { mean: 0, sd: 1 };

describe('readabilityProfile', () => {
  const cells = readabilityProfile(items, audience);

  it('has one cell per chart type and level, in a stable order', () => {
    expect(cells.map((c) => `${c.chartType}/${c.level}/${c.itemCount}`)).toEqual([
      'bar/read/3',
      'network/envision/1',
      'scatter/interpret/2',
      'table/read/1',
    ]);
  });

  it('uses the median difficulty as the typical item and places it at RP 0.67', () => {
    const bar = cells[0]!;
    expect(bar.typicalDifficulty).toBe(-2.0);
    expect(bar.rpLocation).toBeCloseTo(-2.0 + Math.log(0.67 / 0.33), 12);
    const scatter = cells[2]!;
    expect(scatter.typicalDifficulty).toBeCloseTo(-0.7, 12);
  });

  it('gives the share at RP in closed form for a normal audience', () => {
    for (const cell of cells) expect(cell.shareAtRp).toBe(shareAtOrAbove(cell.rpLocation, audience));
    // The hard network cell: almost nobody; the easy bar cell: almost everybody.
    expect(cells[1]!.shareAtRp).toBeLessThan(0.01);
    expect(cells[0]!.shareAtRp).toBeGreaterThan(0.9);
  });

  it('the expected share correct falls as items get harder', () => {
    const byShare = [...cells].sort((a, b) => b.expectedShareCorrect - a.expectedShareCorrect);
    const byDifficulty = [...cells].sort((a, b) => a.typicalDifficulty - b.typicalDifficulty);
    expect(byShare.map((c) => c.chartType)).toEqual(byDifficulty.map((c) => c.chartType));
  });
});

describe('complexityLadder', () => {
  const ladder = complexityLadder(readabilityProfile(items, audience));

  it('orders rungs by RP location and finds the reading ceiling at 80%', () => {
    expect(ladder.rungs.map((r) => r.chartType)).toEqual(['table', 'bar', 'scatter', 'network']);
    expect(ladder.ceilingShare).toBe(0.8);
    expect(ladder.readingCeiling?.chartType).toBe('bar');
  });

  it('writes one sentence per share band, most capable first', () => {
    expect(ladder.sentences).toEqual([
      'Most of this audience (80% or more) can read values from tables and bar charts.',
      'About half of this audience (40–60%) can interpret patterns in scatter plots.',
      'Few in this audience (0–20%) can reason beyond what is drawn in network diagrams.',
    ]);
  });

  it('moves the ceiling when the threshold changes, and has none when nobody qualifies', () => {
    expect(
      complexityLadder(readabilityProfile(items, audience), { ceilingShare: 0.45 }).readingCeiling?.chartType,
    ).toBe('scatter');
    expect(complexityLadder(readabilityProfile(items, { mean: -6, sd: 0.5 })).readingCeiling).toBeNull();
  });
});
