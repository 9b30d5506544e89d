import { readFileSync } from 'node:fs';
import { MISSING, type ResponseMatrix } from '../../../server/scoring/response-matrix.js';

/** One fixture written by scripts/reference/rasch-erm.R (R 4.2.2, eRm 1.0-2, psychotools 0.7-2). */
export interface ErmFixture {
  readonly description: string;
  readonly versions: { readonly R: string; readonly eRm: string; readonly psychotools: string };
  readonly itemIds: string[];
  readonly rows: string[];
  readonly erm: { difficulty: number[]; standardError: number[]; logLikelihood: number; iterations: number };
  readonly converged: {
    difficulty: number[];
    standardError: number[];
    logLikelihood: number;
    maxAbsGradient: number;
  };
  readonly persons: { rawScore: number[]; theta: number[]; standardError: number[] };
  readonly separation: { reliability: number; observedVariance: number; meanSquaredError: number };
  readonly likelihoodRatio: { statistic: number; df: number; pValue: number };
  readonly itemFit?: { outfit: number[]; infit: number[]; outfitZ: number[]; infitZ: number[] };
  readonly personFit?: { outfit: number[]; infit: number[]; outfitZ: number[]; infitZ: number[] };
}

export const fixtureNames = [
  'raschdat1',
  'raschdat1-missing',
  'simulated-complete',
  'simulated-booklets',
] as const;

export function loadFixture(name: (typeof fixtureNames)[number]): ErmFixture {
  const url = new URL(`../../reference/erm-${name}.json`, import.meta.url);
  return JSON.parse(readFileSync(url, 'utf8')) as ErmFixture;
}

/** The fixture's data as a matrix; persons are P1..Pn in row order, '.' is missing. */
export function fixtureMatrix(fixture: ErmFixture): ResponseMatrix {
  const nItems = fixture.itemIds.length;
  const scores = new Uint8Array(fixture.rows.length * nItems);
  fixture.rows.forEach((row, p) => {
    for (let i = 0; i < nItems; i++) scores[p * nItems + i] = row[i] === '.' ? MISSING : Number(row[i]);
  });
  return { personIds: fixture.rows.map((_, p) => `P${p + 1}`), itemIds: fixture.itemIds, scores };
}

/** Persons whose raw score is neither 0 nor the number of items they answered. */
export function nonExtremeRows(matrix: ResponseMatrix): number[] {
  const nItems = matrix.itemIds.length;
  const rows: number[] = [];
  for (let p = 0; p < matrix.personIds.length; p++) {
    let answered = 0;
    let score = 0;
    for (let i = 0; i < nItems; i++) {
      const x = matrix.scores[p * nItems + i]!;
      if (x === MISSING) continue;
      answered++;
      score += x;
    }
    if (score > 0 && score < answered) rows.push(p);
  }
  return rows;
}

export function maxAbsDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) throw new Error('maxAbsDifference requires equal lengths');
  let worst = 0;
  for (let k = 0; k < a.length; k++) worst = Math.max(worst, Math.abs(a[k]! - b[k]!));
  return worst;
}
