import { describe, expect, it } from 'vitest';
import { buildResponseMatrixFromWide } from '../../../server/scoring/build-response-matrix.js';
import { kuderRichardson20 } from '../../../server/scoring/rasch/kuder-richardson-20.js';

describe('kuderRichardson20', () => {
  it("gives 0.6963 on Wuensch's KR20 data (check-values section 7)", () => {
    // K. Wuensch, East Carolina University, "KR20.txt": Σpq = 2.18, population variance 5.84,
    // KR-20 = (10/9)(1 − 2.18/5.84) = 0.6963 (derived, ±1e-4)
    const rows = [
      '1111110110',
      '1011011101',
      '1111011001',
      '0010001000',
      '0000010010',
      '1110111111',
      '1101110111',
      '1111111101',
      '0101111101',
      '1101101110',
    ];
    const matrix = buildResponseMatrixFromWide(
      ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H', 'I', 'J'],
      Array.from({ length: 10 }, (_, i) => `q${i + 1}`),
      rows.map((r) => Array.from(r, Number)),
    );
    expect(kuderRichardson20(matrix)).toBeCloseTo(0.6963, 4);
  });

  it('refuses missing data and constant scores', () => {
    expect(() =>
      kuderRichardson20({ personIds: ['a', 'b'], itemIds: ['x', 'y'], scores: Uint8Array.of(1, 255, 0, 1) }),
    ).toThrow('kuderRichardson20 requires complete data');
    expect(() =>
      kuderRichardson20({ personIds: ['a', 'b'], itemIds: ['x', 'y'], scores: Uint8Array.of(1, 0, 0, 1) }),
    ).toThrow('kuderRichardson20 requires raw scores that vary');
  });
});
