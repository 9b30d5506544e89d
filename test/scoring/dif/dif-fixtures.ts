import { readFileSync } from 'node:fs';
import type { ResponseMatrix } from '../../../server/scoring/response-matrix.js';
import { createRandom, normalSample, simulateRasch } from '../../helpers/random.js';

/** The per-item numbers scripts/reference/mantel-haenszel.R writes (base R 4.2.2 mantelhaen.test). */
export interface MhReference {
  readonly alpha: number;
  readonly confidenceInterval: [number, number];
  readonly chiSquaredCorrected: number;
  readonly pValueCorrected: number;
  readonly chiSquared: number;
  readonly pValue: number;
  readonly dDif: number;
  readonly dDifStandardError: number;
  readonly logAlphaStandardError: number;
  readonly etsClass: string;
}

export function loadReference<T>(name: string): T {
  return JSON.parse(readFileSync(new URL(`../../reference/${name}`, import.meta.url), 'utf8')) as T;
}

/** Rows of 0/1 digits as a matrix, persons P1..Pn. */
export function rowsMatrix(itemIds: string[], rows: string[]): ResponseMatrix {
  const n = itemIds.length;
  const scores = new Uint8Array(rows.length * n);
  rows.forEach((row, p) => {
    for (let i = 0; i < n; i++) scores[p * n + i] = Number(row[i]);
  });
  return { personIds: rows.map((_, p) => `P${p + 1}`), itemIds, scores };
}

/**
 * Invented data: `perGroup` reference persons N(0,1) and focal persons N(−0.5,1) on 20 Rasch items
 * from −1.8 to 1.8; the focal difficulty of items i5 and i14 (indices 4 and 13) is shifted by
 * +shift and −shift. Groups: first half 0, second half 1.
 */
export function simulateDif(seed: number, perGroup = 500, shift = 0.8) {
  const random = createRandom(seed);
  const difficulty = Float64Array.from({ length: 20 }, (_, i) => -1.8 + (3.6 * i) / 19);
  const focalDifficulty = Float64Array.from(difficulty);
  focalDifficulty[4]! += shift;
  focalDifficulty[13]! -= shift;
  const reference = simulateRasch({ difficulty, abilities: normalSample(random, perGroup, 0, 1), random });
  const focal = simulateRasch({
    difficulty: focalDifficulty,
    abilities: normalSample(random, perGroup, -0.5, 1),
    random,
  });
  const scores = new Uint8Array(reference.scores.length + focal.scores.length);
  scores.set(reference.scores);
  scores.set(focal.scores, reference.scores.length);
  const matrix: ResponseMatrix = {
    personIds: Array.from({ length: 2 * perGroup }, (_, p) => `p${p + 1}`),
    itemIds: reference.itemIds,
    scores,
  };
  const groups = Int32Array.from({ length: 2 * perGroup }, (_, p) => (p < perGroup ? 0 : 1));
  return { matrix, groups };
}
