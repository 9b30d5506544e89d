import { describe, expect, it } from 'vitest';
import { bookletsAreLinked } from '../../server/delivery/booklets-are-linked.js';
import { bookletForAttempt, buildBooklets } from '../../server/delivery/build-booklets.js';

const ids = (n: number) => Array.from({ length: n }, (_, i) => `item-${i + 1}`);

describe('buildBooklets', () => {
  it('matches its documented example', () => {
    expect(buildBooklets(['a', 'b', 'c', 'd', 'e', 'f'], 4)).toEqual([
      ['a', 'b', 'c', 'd'],
      ['c', 'd', 'e', 'f'],
      ['e', 'f', 'a', 'b'],
    ]);
  });

  it('gives one booklet when the pool fits', () => {
    expect(buildBooklets(['a', 'b', 'c'], 3)).toEqual([['a', 'b', 'c']]);
  });

  // Pool sizes and booklet lengths across the range studies use.
  const cases = [];
  for (const n of [3, 5, 7, 12, 20, 31, 60])
    for (const m of [2, 3, 4, 5, 8, 10, 15]) if (n > m) cases.push([n, m]);

  it.each(cases)('%i items, %i per booklet: linked, every item twice, once in each half', (n, m) => {
    const booklets = buildBooklets(ids(n), m);
    // Connected item–booklet graph: one scale for all items (common practice, no source).
    expect(bookletsAreLinked(booklets)).toBe(true);
    const blockSize = Math.floor(m / 2);
    for (const booklet of booklets) {
      expect(booklet.length).toBeLessThanOrEqual(m);
      expect(new Set(booklet).size).toBe(booklet.length);
    }
    const first = new Map<string, number>();
    const second = new Map<string, number>();
    booklets.forEach((booklet, k) => {
      // Booklet k starts with block k (the last block may be short).
      const half = Math.min(blockSize, n - k * blockSize);
      booklet.forEach((id, index) => {
        const into = index < half ? first : second;
        into.set(id, (into.get(id) ?? 0) + 1);
      });
    });
    expect(booklets).toHaveLength(Math.ceil(n / blockSize));
    for (const id of ids(n)) {
      expect([first.get(id), second.get(id)]).toEqual([1, 1]);
    }
    // Neighbouring booklets share a whole block of linking items.
    for (let k = 0; k < booklets.length; k++) {
      const next = new Set(booklets[(k + 1) % booklets.length]);
      expect(booklets[k]!.filter((id) => next.has(id)).length).toBeGreaterThanOrEqual(1);
    }
  });

  it('opens every booklet with the common block and rotates the rest (documented example)', () => {
    expect(buildBooklets(['a', 'b', 'c', 'd', 'e', 'f'], 3, ['a'])).toEqual([
      ['a', 'b', 'c'],
      ['a', 'c', 'd'],
      ['a', 'd', 'e'],
      ['a', 'e', 'f'],
      ['a', 'f', 'b'],
    ]);
    // the demo's shape: 107 items, 12 per booklet, 2 common → 105 rotate in blocks of 5: 21 booklets
    const booklets = buildBooklets(ids(107), 12, ['item-2', 'item-54']);
    expect(booklets).toHaveLength(21);
    for (const booklet of booklets) {
      expect(booklet.slice(0, 2)).toEqual(['item-2', 'item-54']);
      expect(booklet).toHaveLength(12);
      expect(new Set(booklet).size).toBe(12);
    }
    const seen = new Map<string, number>();
    for (const id of booklets.flat()) seen.set(id, (seen.get(id) ?? 0) + 1);
    expect(seen.get('item-2')).toBe(21);
    expect(seen.get('item-1')).toBe(2);
    expect(seen.size).toBe(107);
    expect(bookletsAreLinked(booklets)).toBe(true);
    expect(buildBooklets(['a', 'b', 'c'], 5, ['b'])).toEqual([['b', 'a', 'c']]);
  });

  it('refuses nonsense', () => {
    expect(() => buildBooklets(['a', 'b', 'c'], 4, ['z'])).toThrow(
      'common items to be distinct items of the pool',
    );
    expect(() => buildBooklets(['a', 'b', 'c', 'd', 'e'], 3, ['a', 'b'])).toThrow('at least 2 places left');
    expect(() => buildBooklets(['a', 'a'], 1)).toThrow('buildBooklets requires unique item ids');
    expect(() => buildBooklets(['a', 'b'], 0)).toThrow(/at least 1/);
    expect(() => buildBooklets(['a', 'b', 'c'], 1)).toThrow(/at least 2 items per booklet/);
  });
});

describe('bookletsAreLinked', () => {
  it('matches its documented examples', () => {
    expect(
      bookletsAreLinked([
        ['a', 'b'],
        ['b', 'c'],
      ]),
    ).toBe(true);
    expect(
      bookletsAreLinked([
        ['a', 'b'],
        ['c', 'd'],
      ]),
    ).toBe(false);
  });

  it('finds a chain linked only through its ends', () => {
    expect(
      bookletsAreLinked([
        ['a', 'b'],
        ['c', 'd'],
        ['b', 'c'],
      ]),
    ).toBe(true);
    expect(
      bookletsAreLinked([
        ['a', 'b'],
        ['c', 'd'],
        ['e', 'f'],
        ['b', 'c'],
      ]),
    ).toBe(false);
  });

  it('sees that blocks without linking items break the scale', () => {
    // Two booklets made of separate halves (no anchor): not linked.
    const items = ids(8);
    expect(bookletsAreLinked([items.slice(0, 4), items.slice(4)])).toBe(false);
  });
});

describe('bookletForAttempt', () => {
  it('hands out booklets in turn', () => {
    expect(bookletForAttempt(7, 3)).toBe(1);
    expect(Array.from({ length: 6 }, (_, n) => bookletForAttempt(n, 3))).toEqual([0, 1, 2, 0, 1, 2]);
    expect(() => bookletForAttempt(1, 0)).toThrow('bookletForAttempt requires at least one booklet');
  });
});
