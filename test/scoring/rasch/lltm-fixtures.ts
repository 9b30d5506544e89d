import { readFileSync } from 'node:fs';
import type { ResponseMatrix } from '../../../server/scoring/response-matrix.js';

/** A fixture from scripts/reference/lltm-pcm-erm.R (R 4.2.2, eRm 1.0-2). */
interface LltmFixture {
  readonly rows: string[];
  readonly design: number[][];
  readonly erm: { etapar: number[]; seEta: number[]; betapar: number[]; logLikelihood: number; npar: number };
  readonly rasch: { logLikelihood: number; npar: number; difficulty: number[] };
  readonly likelihoodRatio: {
    statistic: number;
    df: number;
    pValue: number;
    ermAnovaLR: number;
  };
}

export function loadLltmFixture(name: string): LltmFixture {
  return JSON.parse(readFileSync(new URL(`../../reference/lltm-${name}.json`, import.meta.url), 'utf8'));
}

export function lltmInputs(fixture: LltmFixture) {
  const nItems = fixture.design.length;
  const matrix: ResponseMatrix = {
    personIds: fixture.rows.map((_, p) => `P${p + 1}`),
    itemIds: Array.from({ length: nItems }, (_, i) => `I${i + 1}`),
    scores: Uint8Array.from(fixture.rows.flatMap((row) => [...row].map(Number))),
  };
  const p = fixture.design[0]!.length;
  const design = {
    featureNames: Array.from({ length: p }, (_, j) => `f${j + 1}`),
    weights: Float64Array.from(fixture.design.flat()),
  };
  return { matrix, design };
}
