import { describe, expect, it } from 'vitest';
import { etsDifClass } from '../../../server/scoring/dif/ets-dif-class.js';
import { type MantelHaenszelStratum, mantelHaenszel } from '../../../server/scoring/dif/mantel-haenszel.js';
import { scoreStrata } from '../../../server/scoring/dif/score-strata.js';
import { loadReference, type MhReference, rowsMatrix, simulateDif } from './dif-fixtures.js';

const toStrata = (rows: number[][]): MantelHaenszelStratum[] =>
  rows.map(([a, b, c, d]) => ({ referenceRight: a!, referenceWrong: b!, focalRight: c!, focalWrong: d! }));

const ucb = loadReference<{ strata: number[][]; result: MhReference & { strataOddsRatioFirst: number } }>(
  'mantel-haenszel-ucb-admissions.json',
);

function expectTest(result: ReturnType<typeof mantelHaenszel>) {
  if (result.kind !== 'test' || result.effect === null) throw new Error('expected an estimable test');
  return { ...result, effect: result.effect };
}

describe('mantelHaenszel on UCBAdmissions (check-values §6)', () => {
  const result = expectTest(mantelHaenszel(toStrata(ucb.strata)));

  it('matches the published base R mantelhaen.test values', () => {
    // Bickel, Hammel & O'Connell (1975) data; values from R 4.2.2 mantelhaen.test (check-values §6, [V+C])
    expect(result.effect.alpha).toBeCloseTo(0.9046968, 7);
    expect(result.effect.confidenceInterval[0]).toBeCloseTo(0.7719074, 6);
    expect(result.effect.confidenceInterval[1]).toBeCloseTo(1.0603298, 6);
    expect(result.chiSquaredCorrected).toBeCloseTo(1.4269, 4);
    expect(result.pValueCorrected).toBeCloseTo(0.2323, 4);
    expect(result.chiSquared).toBeCloseTo(1.5246, 4);
    expect(result.pValue).toBeCloseTo(0.2169, 4);
    // derived [C] in check-values §6: D-DIF +0.2354, SE 0.1903, class A
    expect(result.effect.dDif).toBeCloseTo(0.2354, 4);
    expect(result.effect.dDifStandardError).toBeCloseTo(0.1903, 4);
    expect(etsDifClass(result)).toBe('A');
  });

  it('matches the committed R fixture to 1e-9', () => {
    // scripts/reference/mantel-haenszel.R, R 4.2.2 mantelhaen.test and the RBG formula in R
    const r = ucb.result;
    expect(result.effect.alpha).toBeCloseTo(r.alpha, 9);
    expect(result.effect.confidenceInterval[0]).toBeCloseTo(r.confidenceInterval[0], 9);
    expect(result.effect.confidenceInterval[1]).toBeCloseTo(r.confidenceInterval[1], 9);
    expect(result.chiSquaredCorrected).toBeCloseTo(r.chiSquaredCorrected, 9);
    expect(result.pValueCorrected).toBeCloseTo(r.pValueCorrected, 9);
    expect(result.chiSquared).toBeCloseTo(r.chiSquared, 9);
    expect(result.pValue).toBeCloseTo(r.pValue, 9);
    expect(result.effect.logAlphaStandardError).toBeCloseTo(r.logAlphaStandardError, 9);
  });

  it('gives the department A odds ratio for a single stratum', () => {
    // check-values §6: Dept A odds ratio 0.3492120
    const single = expectTest(mantelHaenszel(toStrata([ucb.strata[0]!])));
    expect(single.effect.alpha).toBeCloseTo(0.349212, 7);
    expect(single.strataUsed).toBe(1);
  });
});

describe('mantelHaenszel small strata and zero cells', () => {
  it('skips strata where a group is absent without changing any statistic', () => {
    const strata = toStrata(ucb.strata);
    const padded = [
      ...strata,
      ...toStrata([
        [5, 3, 0, 0],
        [0, 0, 2, 7],
        [1, 0, 0, 0],
      ]),
    ];
    const base = expectTest(mantelHaenszel(strata));
    const more = expectTest(mantelHaenszel(padded));
    expect(more.strataUsed).toBe(6);
    expect(more.personsUsed).toBe(base.personsUsed);
    expect(more.effect.alpha).toBe(base.effect.alpha);
    expect(more.chiSquaredCorrected).toBe(base.chiSquaredCorrected);
  });

  it('keeps zero cells inside informative strata (no 0.5 added)', () => {
    // stratum 1 has B = 0: α = (A1D1/N1 + A2D2/N2) / (B2C2/N2), by hand (common practice, no source)
    const result = expectTest(
      mantelHaenszel(
        toStrata([
          [4, 0, 2, 2],
          [3, 3, 2, 4],
        ]),
      ),
    );
    expect(result.effect.alpha).toBeCloseTo((8 / 8 + 12 / 12) / (6 / 12), 12);
  });

  it('returns a null effect when an odds sum is zero, and no-information without both answers', () => {
    const zero = mantelHaenszel(
      toStrata([
        [4, 0, 2, 2],
        [3, 0, 1, 1],
      ]),
    );
    expect(zero.kind).toBe('test');
    expect(zero.kind === 'test' && zero.effect).toBeNull();
    expect(etsDifClass(zero)).toBeNull();
    expect(
      mantelHaenszel(
        toStrata([
          [4, 0, 2, 0],
          [3, 1, 0, 0],
        ]),
      ).kind,
    ).toBe('no-information');
  });

  it('rejects negative counts', () => {
    expect(() => mantelHaenszel(toStrata([[1, -1, 1, 1]]))).toThrow('non-negative');
  });
});

describe('etsDifClass', () => {
  const make = (dDif: number, se: number, p: number) =>
    ({
      kind: 'test',
      strataUsed: 1,
      personsUsed: 1,
      chiSquared: 0,
      pValue: p,
      chiSquaredCorrected: 0,
      pValueCorrected: p,
      effect: {
        alpha: Math.exp(-dDif / 2.35),
        logAlpha: -dDif / 2.35,
        logAlphaStandardError: se / 2.35,
        confidenceInterval: [0, 0],
        dDif,
        dDifStandardError: se,
      },
    }) as const;
  it('applies the ETS A/B/C thresholds with sign (Zwick 2012, ETS RR-12-08)', () => {
    expect(etsDifClass(make(-0.99, 0.1, 0.0001))).toBe('A'); // |D| < 1
    expect(etsDifClass(make(-2.5, 2, 0.2))).toBe('A'); // not significant
    expect(etsDifClass(make(-1.2, 0.1, 0.0001))).toBe('B-'); // 1 ≤ |D| < 1.5
    expect(etsDifClass(make(1.6, 0.5, 0.001))).toBe('B+'); // (1.6−1)/0.5 = 1.2 < 1.645
    expect(etsDifClass(make(1.6, 0.3, 0.001))).toBe('C+'); // 2.0 > 1.645
    expect(etsDifClass(make(-1.5, 0.2, 0.001))).toBe('C-'); // |D| = 1.5 exactly, 2.5 > 1.645
  });
});

describe('mantelHaenszel on simulated DIF (R fixture)', () => {
  const fixture = loadReference<{
    itemIds: string[];
    rows: string[];
    groups: number[];
    items: MhReference[];
  }>('mantel-haenszel-simulated-dif.json');
  const matrix = rowsMatrix(fixture.itemIds, fixture.rows);

  it('matches R per item: α, χ² both ways, D-DIF, SE and class', () => {
    // scripts/reference/mantel-haenszel.R: mantelhaen.test on total-score strata (R 4.2.2)
    fixture.items.forEach((r, i) => {
      const result = expectTest(mantelHaenszel(scoreStrata(matrix, fixture.groups, i)));
      expect(result.effect.alpha).toBeCloseTo(r.alpha, 9);
      expect(result.chiSquaredCorrected).toBeCloseTo(r.chiSquaredCorrected, 8);
      expect(result.chiSquared).toBeCloseTo(r.chiSquared, 8);
      expect(result.pValueCorrected).toBeCloseTo(r.pValueCorrected, 9);
      expect(result.effect.dDif).toBeCloseTo(r.dDif, 9);
      expect(result.effect.dDifStandardError).toBeCloseTo(r.dDifStandardError, 9);
      expect(result.effect.confidenceInterval[1]).toBeCloseTo(r.confidenceInterval[1], 8);
      expect(etsDifClass(result) ?? 'none').toBe(r.etsClass);
    });
  });

  it('flags exactly the two injected items (I05 harder for the focal group, I14 easier)', () => {
    const flagged = fixture.items.flatMap((r, i) =>
      r.etsClass === 'A' ? [] : [`${fixture.itemIds[i]}${r.etsClass}`],
    );
    expect(flagged).toEqual(['I05C-', 'I14B+']);
  });
});

describe('mantelHaenszel on simulated DIF (seeded TS simulation)', () => {
  it('flags items i5 (−) and i14 (+) and no other, seeds 1 to 5', () => {
    // invented data; the injected shift is 0.8 logits = 1.88 on the delta scale. Over seeds 1-20
    // no other item was flagged; seed 20240807 flags one clean item B (a 5% test over 18 items).
    for (let seed = 1; seed <= 5; seed++) {
      const { matrix, groups } = simulateDif(seed);
      const classes = matrix.itemIds.map((_, i) =>
        etsDifClass(mantelHaenszel(scoreStrata(matrix, groups, i))),
      );
      const flagged = classes.flatMap((c, i) => (c === 'A' ? [] : [`${matrix.itemIds[i]}:${c}`]));
      expect(flagged.map((f) => f.replace(/[BC]/, ''))).toEqual(['i5:-', 'i14:+']);
    }
  });

  it('flags nothing when no DIF is injected, seeds 1 to 5', () => {
    for (let seed = 1; seed <= 5; seed++) {
      const { matrix, groups } = simulateDif(seed, 500, 0);
      const flagged = matrix.itemIds.filter(
        (_, i) => etsDifClass(mantelHaenszel(scoreStrata(matrix, groups, i))) !== 'A',
      );
      expect(flagged).toEqual([]);
    }
  });

  it('builds strata per form when persons answered different items', () => {
    // two forms: persons 1-2 answered both items, persons 3-4 only the first (common practice, no source)
    const strata = scoreStrata(
      {
        personIds: ['a', 'b', 'c', 'd'],
        itemIds: ['x', 'y'],
        scores: Uint8Array.of(1, 1, 1, 0, 1, 255, 0, 255),
      },
      [0, 1, 0, 1],
      0,
    );
    expect(strata).toEqual([
      { referenceRight: 1, referenceWrong: 0, focalRight: 0, focalWrong: 0 },
      { referenceRight: 0, referenceWrong: 0, focalRight: 1, focalWrong: 0 },
      { referenceRight: 1, referenceWrong: 0, focalRight: 0, focalWrong: 0 },
      { referenceRight: 0, referenceWrong: 0, focalRight: 0, focalWrong: 1 },
    ]);
    expect(() =>
      scoreStrata({ personIds: ['a'], itemIds: ['x'], scores: Uint8Array.of(1) }, [0, 1], 0),
    ).toThrow('one group per person');
  });
});
