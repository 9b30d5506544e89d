import { describe, expect, it } from 'vitest';
import { itemInformation } from '../../../server/delivery/adaptive/item-information.js';
import { selectNextItem } from '../../../server/delivery/adaptive/select-next-item.js';
import { seededRandom } from '../../../server/scoring/seeded-random.js';
import { spacedBank } from './helpers.js';

// One area, 61 items at b = -3, -2.9, ..., 3 (INVENTED).
const bank = spacedBank(['all'], 61);
const open = () => new Uint8Array(bank.ids.length);

describe('selectNextItem: maximum information', () => {
  it('picks the item nearest theta, which is the argmax of P(1 - P)', () => {
    // Linacre (2006), RMT 20:2: information P(1-P) is largest when b = theta.
    for (const ability of [-2.46, -0.04, 0.71, 2.5, 4.2]) {
      const selection = selectNextItem(bank, {
        ability,
        unavailable: open(),
        areaCounts: [0],
        randomesque: 1,
        random: seededRandom(1),
      })!;
      let argmax = 0;
      for (let i = 1; i < bank.ids.length; i++) {
        if (
          itemInformation(ability, bank.difficulty[i]!) > itemInformation(ability, bank.difficulty[argmax]!)
        )
          argmax = i;
      }
      expect(selection.index).toBe(argmax);
    }
  });

  it('skips items already given', () => {
    const unavailable = open();
    unavailable[30] = 1; // b = 0
    const selection = selectNextItem(bank, {
      ability: 0.01,
      unavailable,
      areaCounts: [0],
      randomesque: 1,
      random: seededRandom(1),
    })!;
    expect(bank.difficulty[selection.index]).toBeCloseTo(0.1, 12);
  });

  it('returns null when nothing is left', () => {
    const unavailable = open().fill(1);
    expect(
      selectNextItem(bank, {
        ability: 0,
        unavailable,
        areaCounts: [0],
        randomesque: 3,
        random: seededRandom(1),
      }),
    ).toBeNull();
  });

  it('refuses a bad k', () => {
    expect(() =>
      selectNextItem(bank, {
        ability: 0,
        unavailable: open(),
        areaCounts: [0],
        randomesque: 0,
        random: seededRandom(1),
      }),
    ).toThrow('randomesque');
  });
});

describe('selectNextItem: randomesque', () => {
  it('picks only among the k most informative, uses all of them, and is deterministic under a seed', () => {
    // Kingsbury & Zara (1989): randomesque picks at random among the k most informative items.
    const k = 4;
    const ability = 0.32; // nearest: b = 0.3, 0.4, 0.2, 0.5 (indices 33, 34, 32, 35)
    const top = new Set([32, 33, 34, 35]);
    const seen = new Map<number, number>();
    const random = seededRandom(99);
    for (let r = 0; r < 2000; r++) {
      const { index } = selectNextItem(bank, {
        ability,
        unavailable: open(),
        areaCounts: [0],
        randomesque: k,
        random,
      })!;
      expect(top.has(index)).toBe(true);
      seen.set(index, (seen.get(index) ?? 0) + 1);
    }
    expect(seen.size).toBe(k);
    for (const count of seen.values()) expect(Math.abs(count - 500)).toBeLessThan(100); // ~binomial(2000, 1/4), SD 19
    const run = (seed: number) => {
      const random2 = seededRandom(seed);
      return Array.from(
        { length: 20 },
        () =>
          selectNextItem(bank, {
            ability,
            unavailable: open(),
            areaCounts: [0],
            randomesque: k,
            random: random2,
          })!.index,
      );
    };
    expect(run(7)).toEqual(run(7));
    expect(run(7)).not.toEqual(run(8));
  });
});

describe('selectNextItem: Sympson-Hetter', () => {
  it('passes over items whose K is 0 and never gives them', () => {
    // Sympson & Hetter (1985): a selected item is given with probability K_i, otherwise passed over.
    const control = new Float64Array(bank.ids.length).fill(1);
    control[30] = 0; // b = 0
    control[31] = 0; // b = 0.1
    const selection = selectNextItem(bank, {
      ability: 0.04,
      unavailable: open(),
      areaCounts: [0],
      randomesque: 1,
      exposureControl: control,
      random: seededRandom(3),
    })!;
    expect(bank.difficulty[selection.index]).toBeCloseTo(-0.1, 12);
    expect(selection.passedOver.sort()).toEqual([30, 31]);
  });

  it('gives the most informative item when every open item is passed over', () => {
    const control = new Float64Array(bank.ids.length); // all 0
    const selection = selectNextItem(bank, {
      ability: 1.02,
      unavailable: open(),
      areaCounts: [0],
      randomesque: 2,
      exposureControl: control,
      random: seededRandom(3),
    })!;
    expect(bank.difficulty[selection.index]).toBeCloseTo(1, 12);
    expect(selection.passedOver).toHaveLength(bank.ids.length - 1);
  });
});
