import { describe, expect, it } from 'vitest';
import {
  MACHADO_2009_MATRICES,
  simulateColourVisionLinear,
} from '../../../server/charts/colour/simulate-colour-vision-linear.js';
import { COLOUR_VISION_DEFICIENCIES } from '../../../server/charts/colour/types.js';

// Machado, Oliveira & Fernandes (2009), IEEE TVCG 15(6) 1291-1298, supplement Table 1, severity 1.0,
// as listed in check-values.md §2a ([V], published).
const PUBLISHED_COLUMNS = {
  protanopia: [
    [0.152286, 0.114503, -0.003882],
    [1.052583, 0.786281, -0.048116],
    [-0.204868, 0.099216, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.280085, -0.01182],
    [0.860646, 0.672501, 0.04294],
    [-0.227968, 0.047413, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.078411, 0.004733],
    [-0.076749, 0.930809, 0.691367],
    [-0.178779, 0.147602, 0.3039],
  ],
} as const;

const UNIT_VECTORS = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
] as const;

describe('simulateColourVisionLinear', () => {
  it('maps linear (1,0,0) to column 1 exactly: protan (0.152286, 0.114503, -0.003882) (Machado 2009 Table 1, [V])', () => {
    expect(simulateColourVisionLinear([1, 0, 0], 'protanopia')).toEqual([0.152286, 0.114503, -0.003882]);
  });

  it.each(COLOUR_VISION_DEFICIENCIES)(
    'maps each unit vector to the published column for %s (Machado 2009 Table 1, [V])',
    (deficiency) => {
      UNIT_VECTORS.forEach((unit, column) => {
        expect(simulateColourVisionLinear(unit, deficiency)).toEqual(PUBLISHED_COLUMNS[deficiency][column]);
      });
    },
  );

  it.each(COLOUR_VISION_DEFICIENCIES)(
    'has rows summing to 1 within 2e-6 for %s, so greys stay fixed (check-values.md §2a, [C])',
    (deficiency) => {
      const m = MACHADO_2009_MATRICES[deficiency];
      for (let row = 0; row < 3; row++) {
        expect(Math.abs(m[3 * row]! + m[3 * row + 1]! + m[3 * row + 2]! - 1)).toBeLessThan(2e-6);
      }
      const grey = simulateColourVisionLinear([0.4, 0.4, 0.4], deficiency);
      for (const channel of grey) expect(Math.abs(channel - 0.4)).toBeLessThan(1e-6);
    },
  );

  it('does not clip (negative light stays negative)', () => {
    expect(simulateColourVisionLinear([0, 0, 1], 'protanopia')[0]).toBeLessThan(0);
  });

  it('rejects NaN', () => {
    expect(() => simulateColourVisionLinear([Number.NaN, 0, 0], 'tritanopia')).toThrow(
      'simulateColourVisionLinear requires finite channels',
    );
  });
});
