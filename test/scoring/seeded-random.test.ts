import { mean, variance } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../server/scoring/seeded-random.js';

describe('seededRandom', () => {
  it('matches the doc example and repeats under the same seed', () => {
    expect(seededRandom(1).uniform()).toBe(0.6270739405881613);
    const a = seededRandom(77);
    const b = seededRandom(77);
    for (let i = 0; i < 100; i++) expect(a.uniform()).toBe(b.uniform());
  });

  it('gives uniform [0,1) with mean 1/2 and variance 1/12, and standard normals (4 SE bounds)', () => {
    const random = seededRandom(2024);
    const n = 100_000;
    const uniforms = Array.from({ length: n }, () => random.uniform());
    expect(Math.min(...uniforms)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...uniforms)).toBeLessThan(1);
    expect(Math.abs(mean(uniforms) - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(variance(uniforms) - 1 / 12)).toBeLessThan(0.002);
    const normals = Array.from({ length: n }, () => random.normal());
    expect(Math.abs(mean(normals))).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(variance(normals) - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
  });

  it('integer(n) stays in [0, n) and hits every value', () => {
    const random = seededRandom(5);
    const seen = new Set<number>();
    for (let i = 0; i < 1000; i++) {
      const k = random.integer(7);
      expect(k >= 0 && k < 7 && Number.isInteger(k)).toBe(true);
      seen.add(k);
    }
    expect(seen.size).toBe(7);
  });
});
