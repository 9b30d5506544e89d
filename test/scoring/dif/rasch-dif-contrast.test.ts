import { describe, expect, it } from 'vitest';
import { selectResponseMatrix } from '../../../server/scoring/build-response-matrix.js';
import { raschDifContrast } from '../../../server/scoring/dif/rasch-dif-contrast.js';
import { calibrateCml } from '../../../server/scoring/rasch/calibrate-cml.js';
import { simulateDif } from './dif-fixtures.js';

describe('raschDifContrast', () => {
  const { matrix, groups } = simulateDif(1);
  const result = raschDifContrast(matrix, groups);
  const byId = new Map(result.items.map((item) => [item.itemId, item]));

  it('recovers the injected shifts of +0.8 and −0.8 logits within 2 SE and flags only them at 1%', () => {
    // invented data with known truth; common practice, no source for the 2 SE band
    const i5 = byId.get('i5')!;
    const i14 = byId.get('i14')!;
    expect(Math.abs(i5.contrast - 0.8)).toBeLessThan(2 * i5.standardError);
    expect(Math.abs(i14.contrast + 0.8)).toBeLessThan(2 * i14.standardError);
    const flagged = result.items.filter((item) => item.pValue < 0.01).map((item) => item.itemId);
    expect(flagged).toEqual(['i5', 'i14']);
  });

  it('uses the separate CML calibrations, SE = √(SE_R² + SE_F²), and aligns on the other items', () => {
    const reference = calibrateCml(selectResponseMatrix(matrix, [...Array(500).keys()]));
    const i3 = byId.get('i3')!;
    expect(i3.referenceDifficulty).toBeCloseTo(reference.difficulty[2]!, 10);
    expect(i3.standardError).toBeCloseTo(Math.hypot(i3.referenceStandardError, i3.focalStandardError), 12);
    // with sum-zero calibrations on the same items, leaving item i out of the anchor mean gives
    // contrast_i = (b_Fi − b_Ri) · I / (I − 1) (algebra, common practice, no source)
    const raw = result.focal.difficulty[2]! - result.reference.difficulty[2]!;
    expect(i3.contrast).toBeCloseTo((raw * 20) / 19, 10);
    expect(i3.pValue).toBeCloseTo(2 * (1 - 0.5 * (1 + erf(Math.abs(i3.z) / Math.SQRT2))), 6);
  });

  it('aligns on named anchor items when given', () => {
    const anchored = raschDifContrast(matrix, groups, { anchorItems: ['i1', 'i2', 'i3'] });
    const gaps = ['i1', 'i2', 'i3'].map((id) => anchored.items.find((item) => item.itemId === id)!);
    // an anchor item is aligned on the other anchors (i1 on i2 and i3), any other item on all three
    const raw = (k: number) => result.focal.difficulty[k]! - result.reference.difficulty[k]!;
    expect(gaps[0]!.contrast).toBeCloseTo(raw(0) - (raw(1) + raw(2)) / 2, 10);
    const i10 = anchored.items.find((item) => item.itemId === 'i10')!;
    expect(i10.contrast).toBeCloseTo(raw(9) - (raw(0) + raw(1) + raw(2)) / 3, 10);
  });

  it('rejects an empty group and a wrong group length', () => {
    expect(() => raschDifContrast(matrix, new Int32Array(1000))).toThrow('focal group');
    expect(() => raschDifContrast(matrix, new Int32Array(3))).toThrow('one group per person');
    expect(() => raschDifContrast(matrix, groups, { anchorItems: ['zz'] })).toThrow('anchor zz');
  });
});

/** Abramowitz & Stegun 7.1.26 (|error| < 1.5e-7), an independent check of the normal tail. */
function erf(x: number): number {
  const t = 1 / (1 + 0.3275911 * x);
  const poly =
    t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429))));
  return 1 - poly * Math.exp(-x * x);
}
