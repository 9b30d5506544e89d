import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, contentHash } from '../../server/bank/content-hash.js';
import { validItem } from './valid-item.js';

describe('canonicalJson', () => {
  it('sorts keys at every depth and keeps array order', () => {
    expect(canonicalJson({ b: 1, a: [2, { d: 3, c: 4 }] })).toBe('{"a":[2,{"c":4,"d":3}],"b":1}');
  });
});

describe('contentHash', () => {
  it('is sha256 of the canonical JSON (FIPS 180-2 example: sha256("abc") = ba7816bf...)', () => {
    expect(createHash('sha256').update('abc').digest('hex')).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
    const item = { id: 'x', prompt: 'p' };
    expect(contentHash(item)).toBe(createHash('sha256').update('{"id":"x","prompt":"p"}').digest('hex'));
  });

  it('ignores key order and status; changes when the prompt or data change', () => {
    const item = validItem() as unknown as Record<string, unknown>;
    const reordered = Object.fromEntries(Object.entries(item).reverse());
    expect(contentHash(reordered)).toBe(contentHash(item));
    expect(contentHash({ ...item, status: 'retired' })).toBe(contentHash(item));
    expect(contentHash({ ...item, prompt: 'On which day did the fewest people take the ferry?' })).not.toBe(
      contentHash(item),
    );
    const chart = structuredClone(item.chart) as { data: { passengers: number }[] };
    chart.data[0]!.passengers = 121;
    expect(contentHash({ ...item, chart })).not.toBe(contentHash(item));
  });
});
