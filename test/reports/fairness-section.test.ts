import { describe, expect, it } from 'vitest';
import { fairnessSection } from '../../server/reports/fairness-section.js';
import { MISSING } from '../../server/scoring/response-matrix.js';
import { simulateDif } from '../scoring/dif/dif-fixtures.js';

describe('fairnessSection', () => {
  // invented data: focal persons N(−0.5, 1), focal difficulty +0.8 logits on i5 and −0.8 on i14
  const { matrix, groups } = simulateDif(2);
  const difficulties = Float64Array.from({ length: 20 }, (_, i) => -1.8 + (3.6 * i) / 19);
  const section = fairnessSection({
    grouping: { kind: 'cohorts', reference: 'north', focal: 'south' },
    referenceLabel: 'Cohort North',
    focalLabel: 'Cohort South',
    matrix,
    groups,
    difficulties,
  });

  it('flags the injected items and keeps the MH and Rasch numbers per item', () => {
    expect(section.flaggedItemIds).toEqual(['i5', 'i14']);
    expect(section.items.filter((i) => i.flagged).map((i) => i.itemId)).toEqual(['i5', 'i14']);
    expect(section.items[4]!.dDif!).toBeLessThan(-1);
    expect(section.items[13]!.dDif!).toBeGreaterThan(1);
    expect(section.items[4]!.explanation).toContain('Cohort South found it harder');
    expect(section.items[0]!.explanation).toBeNull();
  });

  it('compares the groups on all items and again without the flagged ones', () => {
    const { allItems, flaggedExcluded } = section.comparison;
    expect(allItems.itemCount).toBe(20);
    expect(flaggedExcluded!.itemCount).toBe(18);
    // generating means 0 and −0.5: WLE means differ by about −0.5 (WLE shrinks a little less than EAP)
    expect(allItems.difference).toBeGreaterThan(-0.8);
    expect(allItems.difference).toBeLessThan(-0.25);
    // the two DIF shifts cancel on average, so leaving both out moves the gap by little
    expect(Math.abs(flaggedExcluded!.difference - allItems.difference)).toBeLessThan(0.1);
    expect(section.sentence).toContain('2 items flagged (i5, i14)');
  });

  it('does not class an item with fewer than 50 answers in a group, however large its DIF', () => {
    // i5 (focal +0.8 logits) answered by only 49 focal persons: too few to class; the rest unchanged
    const scores = Uint8Array.from(matrix.scores);
    let kept = 0;
    for (let p = 0; p < groups.length; p++) {
      if (groups[p] !== 1) continue;
      if (kept < 49) kept++;
      else scores[p * 20 + 4] = MISSING;
    }
    const thin = fairnessSection({
      grouping: { kind: 'cohorts', reference: 'north', focal: 'south' },
      referenceLabel: 'Cohort North',
      focalLabel: 'Cohort South',
      matrix: { ...matrix, scores },
      groups,
      difficulties,
    });
    const i5 = thin.items[4]!;
    expect(i5.focalAnswers).toBe(49);
    expect(i5.referenceAnswers).toBe(section.items[4]!.referenceAnswers);
    expect(i5.etsClass).toBeNull();
    expect(i5.flagged).toBe(false);
    expect(i5.explanation).toBeNull();
    expect(thin.flaggedItemIds).toEqual(['i14']);
    expect(thin.smallStrata).toContain('at least 50 answers');
    expect(section.items[4]!.focalAnswers).toBeGreaterThanOrEqual(50);
  });

  it('rejects an empty group and a difficulty vector of the wrong length', () => {
    const input = {
      grouping: { kind: 'cohorts', reference: 'a', focal: 'b' } as const,
      referenceLabel: 'A',
      focalLabel: 'B',
      matrix,
      difficulties,
    };
    expect(() => fairnessSection({ ...input, groups: new Int8Array(1000) })).toThrow(
      'fairnessSection requires persons in both groups',
    );
    expect(() => fairnessSection({ ...input, groups, difficulties: new Float64Array(3) })).toThrow(
      'fairnessSection requires one difficulty per item',
    );
  });
});
