import { describe, expect, it } from 'vitest';
import { ciede2000 } from '../../../server/charts/colour/ciede2000.js';
import type { Lab } from '../../../server/charts/colour/types.js';

// Sharma, G., Wu, W., & Dalal, E. N. (2005). The CIEDE2000 color-difference formula: implementation
// notes, supplementary test data, and mathematical observations. Color Research & Application 30(1),
// 21-30, Table 1 (34 pairs, published, [V+C] in check-values.md §2b), kL = kC = kH = 1, tolerance 1e-4.
// The 14 pairs listed in check-values.md §2b are marked so; the other 20 rows of the same Table 1 were
// read in the copy shipped by scikit-image (skimage/color/tests/ciede2000_test_data.txt).
// Row: [pair, L1, a1, b1, L2, a2, b2, ΔE00]
const SHARMA_2005_TABLE_1: readonly (readonly number[])[] = [
  [1, 50.0, 2.6772, -79.7751, 50.0, 0.0, -82.7485, 2.0425], // check-values.md §2b
  [2, 50.0, 3.1571, -77.2803, 50.0, 0.0, -82.7485, 2.8615], // Table 1 via scikit-image copy
  [3, 50.0, 2.8361, -74.02, 50.0, 0.0, -82.7485, 3.4412], // Table 1 via scikit-image copy
  [4, 50.0, -1.3802, -84.2814, 50.0, 0.0, -82.7485, 1.0], // check-values.md §2b
  [5, 50.0, -1.1848, -84.8006, 50.0, 0.0, -82.7485, 1.0], // Table 1 via scikit-image copy
  [6, 50.0, -0.9009, -85.5211, 50.0, 0.0, -82.7485, 1.0], // Table 1 via scikit-image copy
  [7, 50.0, 0.0, 0.0, 50.0, -1.0, 2.0, 2.3669], // check-values.md §2b
  [8, 50.0, -1.0, 2.0, 50.0, 0.0, 0.0, 2.3669], // check-values.md §2b
  [9, 50.0, 2.49, -0.001, 50.0, -2.49, 0.0009, 7.1792], // check-values.md §2b
  [10, 50.0, 2.49, -0.001, 50.0, -2.49, 0.001, 7.1792], // Table 1 via scikit-image copy
  [11, 50.0, 2.49, -0.001, 50.0, -2.49, 0.0011, 7.2195], // check-values.md §2b
  [12, 50.0, 2.49, -0.001, 50.0, -2.49, 0.0012, 7.2195], // Table 1 via scikit-image copy
  [13, 50.0, -0.001, 2.49, 50.0, 0.0009, -2.49, 4.8045], // check-values.md §2b
  [14, 50.0, -0.001, 2.49, 50.0, 0.001, -2.49, 4.8045], // Table 1 via scikit-image copy
  [15, 50.0, -0.001, 2.49, 50.0, 0.0011, -2.49, 4.7461], // check-values.md §2b
  [16, 50.0, 2.5, 0.0, 50.0, 0.0, -2.5, 4.3065], // check-values.md §2b
  [17, 50.0, 2.5, 0.0, 73.0, 25.0, -18.0, 27.1492], // check-values.md §2b
  [18, 50.0, 2.5, 0.0, 61.0, -5.0, 29.0, 22.8977], // Table 1 via scikit-image copy
  [19, 50.0, 2.5, 0.0, 56.0, -27.0, -3.0, 31.903], // Table 1 via scikit-image copy
  [20, 50.0, 2.5, 0.0, 58.0, 24.0, 15.0, 19.4535], // Table 1 via scikit-image copy
  [21, 50.0, 2.5, 0.0, 50.0, 3.1736, 0.5854, 1.0], // Table 1 via scikit-image copy
  [22, 50.0, 2.5, 0.0, 50.0, 3.2972, 0.0, 1.0], // Table 1 via scikit-image copy
  [23, 50.0, 2.5, 0.0, 50.0, 1.8634, 0.5757, 1.0], // Table 1 via scikit-image copy
  [24, 50.0, 2.5, 0.0, 50.0, 3.2592, 0.335, 1.0], // Table 1 via scikit-image copy
  [25, 60.2574, -34.0099, 36.2677, 60.4626, -34.1751, 39.4387, 1.2644], // check-values.md §2b
  [26, 63.0109, -31.0961, -5.8663, 62.8187, -29.7946, -4.0864, 1.263], // Table 1 via scikit-image copy
  [27, 61.2901, 3.7196, -5.3901, 61.4292, 2.248, -4.962, 1.8731], // Table 1 via scikit-image copy
  [28, 35.0831, -44.1164, 3.7933, 35.0232, -40.0716, 1.5901, 1.8645], // Table 1 via scikit-image copy
  [29, 22.7233, 20.0904, -46.694, 23.0331, 14.973, -42.5619, 2.0373], // Table 1 via scikit-image copy
  [30, 36.4612, 47.858, 18.3852, 36.2715, 50.5065, 21.2231, 1.4146], // Table 1 via scikit-image copy
  [31, 90.8027, -2.0831, 1.441, 91.1528, -1.6435, 0.0447, 1.4441], // check-values.md §2b
  [32, 90.9257, -0.5406, -0.9208, 88.6381, -0.8985, -0.7239, 1.5381], // Table 1 via scikit-image copy
  [33, 6.7747, -0.2908, -2.4247, 5.8714, -0.0985, -2.2286, 0.6377], // check-values.md §2b
  [34, 2.0776, 0.0795, -1.135, 0.9033, -0.0636, -0.5514, 0.9082], // check-values.md §2b
];

const lab = (l: number, a: number, b: number): Lab => ({ l, a, b });

describe('ciede2000', () => {
  it.each(SHARMA_2005_TABLE_1.map((row) => [row[0], row] as const))(
    'reproduces Sharma et al. (2005) Table 1 pair %i within 1e-4 (published)',
    (_pair, row) => {
      const [, l1, a1, b1, l2, a2, b2, expected] = row as [
        number,
        number,
        number,
        number,
        number,
        number,
        number,
        number,
      ];
      expect(Math.abs(ciede2000(lab(l1, a1, b1), lab(l2, a2, b2)) - expected)).toBeLessThan(1e-4);
    },
  );

  it.each(SHARMA_2005_TABLE_1.map((row) => [row[0], row] as const))(
    'is symmetric on pair %i',
    (_pair, row) => {
      const [, l1, a1, b1, l2, a2, b2] = row as [number, number, number, number, number, number, number];
      const forward = ciede2000(lab(l1, a1, b1), lab(l2, a2, b2));
      const backward = ciede2000(lab(l2, a2, b2), lab(l1, a1, b1));
      expect(Math.abs(forward - backward)).toBeLessThan(1e-12);
    },
  );

  it('matches the documented example', () => {
    expect(ciede2000(lab(50, 2.6772, -79.7751), lab(50, 0, -82.7485))).toBeCloseTo(2.0425, 4);
  });

  it('is 0 for identical colours, including the achromatic axis', () => {
    expect(ciede2000(lab(40, 10, -20), lab(40, 10, -20))).toBe(0);
    expect(ciede2000(lab(40, 0, 0), lab(40, 0, 0))).toBe(0);
  });

  it('rejects NaN', () => {
    expect(() => ciede2000(lab(Number.NaN, 0, 0), lab(0, 0, 0))).toThrow(
      'ciede2000 requires finite Lab coordinates',
    );
  });
});
