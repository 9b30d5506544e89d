import { describe, expect, it } from 'vitest';
import { rubricAgreementRows } from '../../server/reports/rubric-agreement-rows.js';
import { rubricAgreementSection } from '../../server/reports/rubric-agreement-section.js';

describe('rubricAgreementSection', () => {
  // Ten double-scored answers, invented: 7 agree, 3 one step apart.
  const first = [0, 0, 1, 1, 1, 2, 2, 2, 0, 2];
  const second = [0, 0, 1, 2, 1, 2, 1, 2, 1, 2];
  const doubles = first.map((a, k) => ({
    itemId: 'garden-harvest-bar-envision-2',
    first: a,
    second: second[k]!,
  }));

  it('gives quadratic-weighted kappa with its interval, the table and exact agreement per item', () => {
    const section = rubricAgreementSection(
      ['garden-harvest-bar-envision-2', 'science-members-line-envision-2'],
      doubles,
      [
        {
          itemId: 'garden-harvest-bar-envision-2',
          steps: [-0.41234, 0.91234],
          stepStandardErrors: [0.3, 0.3],
        },
      ],
    );
    const [harvest, members] = section.items;
    expect(harvest!.table).toEqual([2, 1, 0, 0, 2, 1, 0, 1, 3]);
    expect(harvest!.exactAgreement).toBe(0.7);
    // By hand (Cohen 1968 with agreement weights 1, 0.75, 0 by distance; common practice, no source
    // for the arithmetic): row margins .3 .3 .4, column margins .2 .4 .4,
    // p_o = 0.7 + 0.75 · 0.3 = 0.925, p_e = Σ w p_i. p_.j = 0.15 + 0.255 + 0.28 = 0.685,
    // κ = (0.925 − 0.685)/(1 − 0.685) = 0.762.
    expect(harvest!.kappa).toBeCloseTo(0.762, 3);
    expect(harvest!.kappaInterval!.lower).toBeLessThan(0.762);
    expect(harvest!.kappaInterval!.upper).toBeGreaterThan(0.762);
    expect(harvest!.steps).toEqual([-0.412, 0.912]);
    // An item with rubric scores but no double-scored answer: counted, no kappa, no steps.
    expect(members).toMatchObject({ doubleScored: 0, kappa: null, kappaInterval: null, steps: null });
  });

  it('gives no kappa when both raters gave every answer the same score (chance agreement 1)', () => {
    const same = [1, 1, 1].map(() => ({ itemId: 'x', first: 1, second: 1 }));
    const [item] = rubricAgreementSection(['x'], same, []).items;
    expect(item).toMatchObject({ doubleScored: 3, kappa: null, exactAgreement: 1 });
  });

  it('prints the same numbers as CSV rows (section rubric)', () => {
    const rows = rubricAgreementRows(rubricAgreementSection(['garden-harvest-bar-envision-2'], doubles, []));
    const kappa = rows.find((r) => r.measure === 'weighted_kappa')!;
    expect(kappa).toMatchObject({ section: 'rubric', subject: 'garden-harvest-bar-envision-2' });
    expect(kappa.value).toBeCloseTo(0.762, 3);
    expect(rows.map((r) => r.measure)).toEqual([
      'double_scored',
      'weighted_kappa',
      'exact_agreement',
      'step_1',
      'step_2',
    ]);
  });
});
