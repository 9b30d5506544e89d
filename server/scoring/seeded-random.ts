/**
 * A seeded pseudo-random generator for resampling and simulation, so that bootstrap intervals,
 * adaptive item choice and demo audiences are reproducible under a seed.
 *
 * Mulberry32 (Tommy Ettinger, public domain): 32-bit state, period 2^32. Adequate for
 * resampling and simulation; not for anything cryptographic (tokens use node:crypto).
 * Normal deviates by the Box–Muller transform.
 *
 * @see Box, G. E. P., & Muller, M. E. (1958). A note on the generation of random normal
 *   deviates. Annals of Mathematical Statistics 29, 610–611.
 * @example
 * const random = seededRandom(1); random.uniform(); // 0.6270739405881613
 */
export interface SeededRandom {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
  /** Uniform integer in [0, n). */
  integer(n: number): number;
}

export function seededRandom(seed: number): SeededRandom {
  let state = seed >>> 0;
  let spare: number | null = null;
  const uniform = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (): number => {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    let u = uniform();
    while (u === 0) u = uniform();
    const v = uniform();
    const radius = Math.sqrt(-2 * Math.log(u));
    spare = radius * Math.sin(2 * Math.PI * v);
    return radius * Math.cos(2 * Math.PI * v);
  };
  const integer = (n: number): number => Math.floor(uniform() * n);
  return { uniform, normal, integer };
}
