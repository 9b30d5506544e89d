import { describe, expect, it } from 'vitest';
import { colourDifference } from '../../../server/charts/colour/colour-difference.js';

describe('colourDifference', () => {
  it('is 100 between black and white (documented example; ΔL* = 100 and S_L = 1 at L̄ = 50, [C])', () => {
    expect(Math.abs(colourDifference('#000000', '#ffffff') - 100)).toBeLessThan(1e-9);
  });

  it('is 0 for the same colour written two ways', () => {
    expect(colourDifference('#abc', 'rgb(170, 187, 204)')).toBe(0);
  });

  it('is symmetric', () => {
    expect(colourDifference('#1f6f9f', '#c0504d')).toBeCloseTo(colourDifference('#c0504d', '#1f6f9f'), 12);
  });
});
