import { describe, expect, it } from 'vitest';
import {
  generateJoinCode,
  joinCodeDigits,
  joinCodeLetters,
  normaliseJoinCode,
} from '../../server/delivery/join-code.js';

describe('join codes', () => {
  it('use no look-alike characters (0/O, 1/I)', () => {
    for (const c of ['0', 'O', '1', 'I']) expect(joinCodeLetters + joinCodeDigits).not.toContain(c);
    expect(joinCodeLetters).toHaveLength(24);
    expect(joinCodeDigits).toHaveLength(8);
  });

  it('are four letters, a hyphen, two digits, drawn from the whole alphabet', () => {
    const seen = new Set<string>();
    for (let i = 0; i < 2000; i++) {
      const code = generateJoinCode();
      expect(code).toMatch(/^[A-HJ-NP-Z]{4}-[2-9]{2}$/);
      for (const c of code.replace('-', '')) seen.add(c);
    }
    expect(seen.size).toBe(32);
  });

  it('follow the random source (first and last symbols)', () => {
    expect(generateJoinCode(() => 0)).toBe('AAAA-22');
    expect(generateJoinCode((n) => n - 1)).toBe('ZZZZ-99');
  });

  it('are read the way people type them', () => {
    expect(normaliseJoinCode(' wakt 47 ')).toBe('WAKT-47');
    expect(normaliseJoinCode('wakt-47')).toBe('WAKT-47');
    expect(normaliseJoinCode('W-A-K-T-4-7')).toBe('WAKT-47');
    expect(normaliseJoinCode('WAKT47X')).toBeUndefined();
    expect(normaliseJoinCode('')).toBeUndefined();
    expect(normaliseJoinCode("'; drop table cohorts; --")).toBeUndefined();
  });
});
