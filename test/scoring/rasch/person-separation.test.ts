import { describe, expect, it } from 'vitest';
import { estimateAbilityMle } from '../../../server/scoring/rasch/estimate-ability-mle.js';
import {
  personSeparation,
  reliabilityFromSeparation,
  separationFromReliability,
} from '../../../server/scoring/rasch/person-separation.js';
import {
  fixtureMatrix,
  fixtureNames,
  loadFixture,
  maxAbsDifference,
  nonExtremeRows,
} from './erm-fixtures.js';

describe('personSeparation', () => {
  it.each([
    // check-values section 7: R = G²/(1 + G²) (Linacre, Rasch measurement discussion list, 2017)
    [1, 0.5],
    [2, 0.8],
    [3, 0.9],
    [4, 0.9412],
  ])('converts G = %d to R = %d', (g, r) => {
    expect(reliabilityFromSeparation(g)).toBeCloseTo(r, 4);
    expect(separationFromReliability(reliabilityFromSeparation(g))).toBeCloseTo(g, 10);
  });

  it('matches its doc example and keeps G and R consistent', () => {
    const s = personSeparation(Float64Array.of(-2, 0, 2), Float64Array.of(1, 1, 1));
    expect(s.reliability).toBeCloseTo(0.75, 14); // observed 4, error 1, true 3
    expect(s.separation).toBeCloseTo(Math.sqrt(3), 14);
    expect(reliabilityFromSeparation(s.separation)).toBeCloseTo(s.reliability, 14);
    expect(s.strata).toBeCloseTo((4 * Math.sqrt(3) + 1) / 3, 14);
  });

  for (const name of fixtureNames) {
    it(`${name}: reproduces eRm SepRel from the eRm person estimates and from our own MLEs`, () => {
      // eRm 1.0-2 SepRel(person.parameter(RM(X))): sample variance of non-interpolated thetas
      const fixture = loadFixture(name);
      const own = personSeparation(
        Float64Array.from(fixture.persons.theta),
        Float64Array.from(fixture.persons.standardError),
      );
      expect(own.reliability).toBeCloseTo(fixture.separation.reliability, 6);
      expect(own.observedVariance).toBeCloseTo(fixture.separation.observedVariance, 6);
      expect(own.meanSquaredError).toBeCloseTo(fixture.separation.meanSquaredError, 6);
    });
  }

  it('rejects too few measures', () => {
    expect(() => personSeparation(Float64Array.of(1), Float64Array.of(1))).toThrow(
      'personSeparation requires at least two measures',
    );
  });
});

describe('estimateAbilityMle against eRm person.parameter', () => {
  for (const name of fixtureNames) {
    it(`${name}: per-person MLE and SE within 1e-3 given eRm's difficulties`, () => {
      // eRm 1.0-2 person.parameter: MLE per raw score within each missing pattern
      const fixture = loadFixture(name);
      const matrix = fixtureMatrix(fixture);
      const nItems = matrix.itemIds.length;
      const estimates: number[] = [];
      const errors: number[] = [];
      for (const p of nonExtremeRows(matrix)) {
        const answered: number[] = [];
        const responses: number[] = [];
        for (let i = 0; i < nItems; i++) {
          const x = matrix.scores[p * nItems + i]!;
          if (x > 1) continue;
          answered.push(fixture.erm.difficulty[i]!);
          responses.push(x);
        }
        const result = estimateAbilityMle(Float64Array.from(answered), responses);
        if (result.kind !== 'estimate') throw new Error('expected an estimate');
        estimates.push(result.estimate);
        errors.push(result.standardError);
      }
      expect(maxAbsDifference(estimates, fixture.persons.theta)).toBeLessThan(1e-3);
      expect(maxAbsDifference(errors, fixture.persons.standardError)).toBeLessThan(1e-3);
    });
  }
});
