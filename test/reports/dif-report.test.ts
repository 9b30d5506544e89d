import { describe, expect, it } from 'vitest';
import { difReport } from '../../server/reports/dif-report.js';
import { simulateDif } from '../scoring/dif/dif-fixtures.js';

describe('difReport', () => {
  // invented data: focal difficulty +0.8 logits on i5 and −0.8 on i14
  const { matrix, groups } = simulateDif(2);
  const report = difReport(matrix, groups, { referenceLabel: 'Cohort North', focalLabel: 'Cohort South' });

  it('flags the two items with injected DIF and lists them for exclusion', () => {
    expect(report.flaggedItemIds).toEqual(['i5', 'i14']);
    expect(report.referencePersons).toBe(500);
    expect(report.focalPersons).toBe(500);
    expect(report.items.filter((item) => item.explanation !== null).map((item) => item.itemId)).toEqual([
      'i5',
      'i14',
    ]);
  });

  it('explains each flag in words with its direction, size and the Rasch contrast', () => {
    const i5 = report.items[4]!;
    expect(i5.etsClass).toMatch(/^[BC]-$/);
    const odds = i5.mantelHaenszel.kind === 'test' ? i5.mantelHaenszel.effect!.alpha.toFixed(1) : '';
    expect(i5.explanation).toContain('people in Cohort South found it harder than people in Cohort North');
    expect(i5.explanation).toContain(`${odds} times lower`);
    expect(i5.explanation).toContain('which agrees');
    expect(report.items[13]!.explanation).toContain('found it easier');
    expect(report.method).toContain('Cohort North (500 people)');
  });

  it('rejects a grouping with an empty group', () => {
    expect(() => difReport(matrix, new Int32Array(1000))).toThrow(
      'difReport requires persons in both groups',
    );
  });
});
