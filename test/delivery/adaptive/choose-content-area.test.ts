import { describe, expect, it } from 'vitest';
import { chooseContentArea } from '../../../server/delivery/adaptive/choose-content-area.js';
import { seededRandom } from '../../../server/scoring/seeded-random.js';
import { spacedBank } from './helpers.js';

describe('chooseContentArea', () => {
  it('chooses the area whose share lags its target most, the largest target first', () => {
    // Kingsbury & Zara (1989): the area furthest below its target proportion comes next.
    const bank = spacedBank(['read', 'interpret', 'envision'], 5, -1, 1, {
      read: 0.5,
      interpret: 0.3,
      envision: 0.2,
    });
    const none = new Uint8Array(bank.ids.length);
    expect(chooseContentArea(bank, [0, 0, 0], none)).toBe(0);
    expect(chooseContentArea(bank, [1, 0, 0], none)).toBe(1); // lags t(n+1) - c: 0, 0.6, 0.4
    expect(chooseContentArea(bank, [1, 1, 0], none)).toBe(2); // 0.5, -0.1, 0.6
    expect(chooseContentArea(bank, [1, 1, 1], none)).toBe(0); // 1, 0.2, -0.2
  });

  it('skips areas with nothing left and says -1 when all are empty', () => {
    const bank = spacedBank(['read', 'envision'], 2);
    const unavailable = Uint8Array.of(1, 1, 0, 0);
    expect(chooseContentArea(bank, [0, 0], unavailable)).toBe(1);
    expect(chooseContentArea(bank, [2, 2], new Uint8Array(4).fill(1))).toBe(-1);
  });

  it('keeps every area within one item of its target share over 300 items, for random targets', () => {
    // The stated check of the adaptive brief: content balance within one item of the target proportions.
    const random = seededRandom(2024);
    let worstOverall = 0;
    for (let trial = 0; trial < 40; trial++) {
      const areas = ['a', 'b', 'c', 'd', 'e'].slice(0, 2 + (trial % 4));
      const weights = Object.fromEntries(areas.map((key) => [key, 0.05 + random.uniform()]));
      const bank = spacedBank(areas, 300, -1, 1, weights);
      const counts = new Int32Array(areas.length);
      const none = new Uint8Array(bank.ids.length);
      let worst = 0;
      for (let n = 1; n <= 300; n++) {
        counts[chooseContentArea(bank, counts, none)]!++;
        for (let a = 0; a < areas.length; a++)
          worst = Math.max(worst, Math.abs(counts[a]! - bank.targets[a]! * n));
      }
      expect(worst).toBeLessThanOrEqual(1);
      worstOverall = Math.max(worstOverall, worst);
    }
    expect(worstOverall).toBeGreaterThan(0.8); // not vacuous: counts do wander close to the bound
  });
});
