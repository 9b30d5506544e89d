import { describe, expect, it } from 'vitest';
import {
  itemInformation,
  itemsNeededForStandardError,
  standardErrorFromInformation,
  testInformation,
} from '../../../server/delivery/adaptive/item-information.js';

describe('itemInformation', () => {
  it('is P(1 - P), largest (0.25) at theta = b', () => {
    // Linacre (2006), RMT 20:2: I = P(1 - P), at most 0.25 when the item is on target.
    expect(itemInformation(0.7, 0.7)).toBe(0.25);
    expect(itemInformation(0, Math.log(4))).toBeCloseTo(0.16, 12); // P = 0.2
    expect(itemInformation(1, 0)).toBeCloseTo(itemInformation(-1, 0), 15); // symmetric in theta - b
    expect(itemInformation(1.5, 0)).toBeLessThan(itemInformation(0.5, 0));
  });
});

describe('testInformation and standardErrorFromInformation', () => {
  it('gives SE = 1/sqrt(sum P(1 - P))', () => {
    // Linacre (2006), RMT 20:2: SE = 1/sqrt(sum P(1-P)); 16 on-target items give SE 0.5.
    const onTarget = new Float64Array(16);
    expect(standardErrorFromInformation(testInformation(0, onTarget))).toBeCloseTo(0.5, 12);
    expect(standardErrorFromInformation(0)).toBe(Number.POSITIVE_INFINITY);
    expect(() => standardErrorFromInformation(-1)).toThrow('information >= 0');
  });

  it('80 items on target give SE 0.22', () => {
    // Linacre, "How much is enough?", RMT 12:3 (rmt123h): perfect targeting with 80 items, SE = 0.22.
    expect(standardErrorFromInformation(testInformation(0, new Float64Array(80)))).toBeCloseTo(0.22, 2);
  });
});

describe('itemsNeededForStandardError', () => {
  // Linacre (2006), RMT 20:2, table of items needed for a target SE: ceil(1 / (P(1-P) SE^2)).
  const table: [number, number[]][] = [
    [0.5, [16, 25, 45, 100, 178, 400]],
    [0.7, [20, 30, 53, 120, 212, 477]],
    [0.8, [25, 40, 70, 157, 278, 625]],
  ];
  const targets = [0.5, 0.4, 0.3, 0.2, 0.15, 0.1];
  for (const [p, expected] of table) {
    it(`matches the published row for P = ${p}`, () => {
      expect(targets.map((se) => itemsNeededForStandardError(p, se))).toEqual(expected);
    });
  }

  it('refuses impossible input', () => {
    expect(() => itemsNeededForStandardError(1, 0.3)).toThrow('probability in (0, 1)');
    expect(() => itemsNeededForStandardError(0.5, 0)).toThrow('positive target');
  });
});
