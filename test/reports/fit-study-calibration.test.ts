/**
 * `fitStudyCalibration` gives the same result in a worker thread (`runInWorker`, as calibrateStudy
 * runs large studies) as in the calling thread: typed arrays, Maps of partial credit steps and the
 * bootstrap draws all survive the structured clone. Invented answers (seed 4): six right/wrong items
 * and one rubric item scored 0–2, two groups.
 */
import { describe, expect, it } from 'vitest';
import {
  fitStudyCalibration,
  type StudyFit,
  type StudyFitInput,
} from '../../server/reports/fit-study-calibration.js';
import { pcmCategoryProbabilities } from '../../server/scoring/rasch/pcm-category-probabilities.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';
import { runInWorker } from '../../server/workers/run-in-worker.js';

const fitModule = new URL('../../server/reports/fit-study-calibration.ts', import.meta.url).href;

function invented(): StudyFitInput {
  const random = seededRandom(4);
  const difficulty = [-1.2, -0.6, 0, 0.4, 0.9, 1.4];
  const steps = [-0.5, 0.7];
  const persons = 300;
  const itemIds = [...difficulty.map((_, i) => `item-${i}`), 'rubric-item'];
  const scores = new Uint8Array(persons * itemIds.length);
  const index = new Int32Array(persons);
  for (let p = 0; p < persons; p++) {
    index[p] = p < 150 ? 0 : 1;
    const theta = random.normal() + (p < 150 ? 0 : 0.5);
    difficulty.forEach((b, i) => {
      scores[p * itemIds.length + i] = random.uniform() < 1 / (1 + Math.exp(b - theta)) ? 1 : 0;
    });
    const probabilities = pcmCategoryProbabilities(theta, steps);
    const u = random.uniform();
    scores[p * itemIds.length + 6] =
      u < probabilities[0]! ? 0 : u < probabilities[0]! + probabilities[1]! ? 1 : 2;
  }
  return {
    matrix: { personIds: Array.from({ length: persons }, (_, p) => `p${p}`), itemIds, scores },
    groups: { index, labels: ['north', 'south'] },
    rubricItems: new Set(['rubric-item']),
    quadraturePoints: 21,
    maxIterations: 200,
    replicates: 5,
    seed: 2,
  };
}

describe('fitStudyCalibration in a worker thread', () => {
  it('returns exactly what the calling thread computes, partial credit steps included', async () => {
    const input = invented();
    const here = fitStudyCalibration(input);
    const there = await runInWorker<StudyFit>(fitModule, 'fitStudyCalibration', [input]);
    expect(here.ok).toBe(true);
    expect(there).toEqual(here);
    if (!there.ok) return;
    expect(there.difficulty).toBeInstanceOf(Float64Array);
    expect(there.partialCredit?.steps.get('rubric-item')).toHaveLength(2);
    expect(there.draws).toHaveLength(5);
  });
});
