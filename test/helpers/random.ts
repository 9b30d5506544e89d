/**
 * Seeded random numbers and a Rasch response simulator for tests and benchmarks.
 *
 * The generator is Mulberry32 (Tommy Ettinger, public domain): a 32-bit state, period 2^32,
 * adequate for simulating test data, not for anything cryptographic. The same seed gives the
 * same sequence on every platform, so simulated fixtures are reproducible. Normal deviates use
 * the Box-Muller transform (Box & Muller, 1958, Ann. Math. Statist. 29, 610–611).
 *
 * Usage:
 *   const random = createRandom(20240501);
 *   const matrix = simulateRasch({ difficulty, abilities: normalSample(random, 500, 0, 1), random });
 */
import { MISSING, type ResponseMatrix } from '../../server/scoring/response-matrix.js';
import { type SeededRandom, seededRandom } from '../../server/scoring/seeded-random.js';

export type Random = SeededRandom;

/** The server's seeded generator (Mulberry32 with a Box-Muller normal), so tests and server agree. */
export function createRandom(seed: number): Random {
  return seededRandom(seed);
}

/** n draws from N(mean, sd). */
export function normalSample(random: Random, n: number, mean: number, sd: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = mean + sd * random.normal();
  return out;
}

/**
 * Rotated overlapping booklets: items are cut into 2·booklets equal blocks and booklet k holds
 * blocks 2k .. 2k + blocksPerBooklet − 1 (cyclically), so each block appears in several booklets
 * and every booklet overlaps its neighbours. Persons take booklets in turn (person p: p mod booklets).
 * @returns presented[p · items + i] = 1 when person p sees item i.
 */
export function rotatedBookletDesign(
  persons: number,
  items: number,
  booklets: number,
  itemsPerBooklet: number,
): Uint8Array {
  const blocks = 2 * booklets;
  const blockSize = items / blocks;
  const blocksPerBooklet = itemsPerBooklet / blockSize;
  if (!Number.isInteger(blockSize) || !Number.isInteger(blocksPerBooklet)) {
    throw new Error('rotatedBookletDesign requires items divisible into whole blocks');
  }
  const presented = new Uint8Array(persons * items);
  for (let p = 0; p < persons; p++) {
    const booklet = p % booklets;
    for (let k = 0; k < blocksPerBooklet; k++) {
      const block = (2 * booklet + k) % blocks;
      for (let j = 0; j < blockSize; j++) presented[p * items + block * blockSize + j] = 1;
    }
  }
  return presented;
}

/**
 * Simulates Rasch responses: P(x = 1) = 1 / (1 + exp(−(θ_p − b_i))).
 * @param presented optional mask (1 = item shown); unshown cells are MISSING.
 */
export function simulateRasch(input: {
  difficulty: Float64Array;
  abilities: Float64Array;
  random: Random;
  presented?: Uint8Array;
}): ResponseMatrix {
  const { difficulty, abilities, random, presented } = input;
  const items = difficulty.length;
  const persons = abilities.length;
  const scores = new Uint8Array(persons * items);
  for (let p = 0; p < persons; p++) {
    for (let i = 0; i < items; i++) {
      const cell = p * items + i;
      if (presented && presented[cell] === 0) {
        scores[cell] = MISSING;
        continue;
      }
      const probability = 1 / (1 + Math.exp(difficulty[i]! - abilities[p]!));
      scores[cell] = random.uniform() < probability ? 1 : 0;
    }
  }
  return {
    personIds: Array.from({ length: persons }, (_, p) => `p${p + 1}`),
    itemIds: Array.from({ length: items }, (_, i) => `i${i + 1}`),
    scores,
  };
}

/** Evenly spaced difficulties from `low` to `high` (inclusive). */
export function spacedDifficulties(count: number, low: number, high: number): Float64Array {
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) out[i] = count === 1 ? low : low + ((high - low) * i) / (count - 1);
  return out;
}
