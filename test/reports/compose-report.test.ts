import { errorFunction } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import type { StudyCalibration } from '../../server/reports/calibrate-study.js';
import { composeReport } from '../../server/reports/compose-report.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';

/** A stored calibration written by hand: two cohorts, four items in two cells, no replicates. */
function calibration(groups: { mean: number; sd: number; persons: number }[]): StudyCalibration {
  const items = [
    { itemId: 'bar-1', difficulty: -1.2 },
    { itemId: 'bar-2', difficulty: -0.4 },
    { itemId: 'net-1', difficulty: 0.9 },
    { itemId: 'net-2', difficulty: 1.7 },
  ];
  return {
    record: {
      id: 'cal-x',
      studyId: 's',
      method: 'mml',
      settings: {},
      converged: true,
      iterations: 3,
      logLikelihood: -1,
      responseCount: 0,
      responsesUntil: null,
      createdAt: '2031-01-01T00:00:00.000Z',
    },
    settings: {
      identification: 'first-cohort-mean',
      anchoredFrom: null,
      quadraturePoints: 41,
      maxIterations: 200,
      minRespondents: 30,
      minAnswersPerItem: 10,
      groups: groups.map((g, k) => ({
        cohortId: `c${k}`,
        label: `C${k}`,
        ...g,
        meanStandardError: 0,
        sdStandardError: 0,
      })),
      uncalibrated: [],
      bootstrap: { replicates: 0, seed: 1, draws: [] },
    },
    items: items.map((i) => ({
      ...i,
      itemVersion: 1,
      standardError: 0.1,
      infit: 1,
      outfit: 1,
      anchored: false,
    })),
  };
}

const info = (id: string) =>
  id.startsWith('bar')
    ? ({ chartType: 'bar', level: 'read' } as const)
    : ({ chartType: 'network', level: 'interpret' } as const);

function report(groups: { mean: number; sd: number; persons: number }[]) {
  return composeReport({
    study: { id: 's', title: 'S' },
    cohorts: groups.map((_, k) => ({ id: `c${k}`, label: `C${k}` })),
    calibration: calibration(groups),
    responses: [],
    attempts: [],
    newerResponses: 0,
    itemInfo: info,
    options: {},
  });
}

describe('composeReport: profile numbers against independent computations', () => {
  const groups = [
    { mean: 0, sd: 1, persons: 300 },
    { mean: 0.8, sd: 1.3, persons: 100 },
  ];
  const whole = report(groups);

  it('matches a Monte Carlo simulation of the audience within 4 simulation SEs', () => {
    // Simulate M persons from the cohort mixture, each answering every item of the cell with the Rasch
    // probability. The share of right answers has SE at most √(0.25/M) (persons are independent).
    const M = 40_000;
    const random = seededRandom(77);
    const difficulties = { bar: [-1.2, -0.4], network: [0.9, 1.7] } as const;
    const right = { bar: 0, network: 0 };
    const atRp = { bar: 0, network: 0 };
    const rpOffset = Math.log(0.67 / 0.33);
    for (let p = 0; p < M; p++) {
      const g = random.uniform() < 0.75 ? groups[0]! : groups[1]!;
      const theta = g.mean + g.sd * random.normal();
      for (const type of ['bar', 'network'] as const) {
        for (const b of difficulties[type])
          if (random.uniform() < 1 / (1 + Math.exp(b - theta))) right[type]++;
        const typical = (difficulties[type][0] + difficulties[type][1]) / 2; // the median of two
        if (theta >= typical + rpOffset) atRp[type]++;
      }
    }
    const tolerance = 4 * Math.sqrt(0.25 / M);
    for (const type of ['bar', 'network'] as const) {
      const cell = whole.audiences[0]!.profile.find((c) => c.chartType === type)!;
      expect(Math.abs(cell.expectedShareCorrect - right[type] / (2 * M))).toBeLessThan(tolerance);
      expect(Math.abs(cell.shareAtRp - atRp[type] / M)).toBeLessThan(tolerance);
    }
  });

  it('gives the RP67 share of one cohort by its closed form 1 − Φ((b + 0.7082 − μ)/σ)', () => {
    // RP offset ln(0.67/0.33) = 0.7082 (check-values §9, tolerance 1e-4); Φ via simple-statistics' erf.
    const single = report([{ mean: 0.3, sd: 1.1, persons: 50 }]);
    for (const cell of single.audiences[0]!.profile) {
      const z = (cell.typicalDifficulty + 0.7082 - 0.3) / 1.1;
      const closed = 1 - 0.5 * (1 + errorFunction(z / Math.SQRT2));
      expect(Math.abs(cell.shareAtRp - closed)).toBeLessThan(1e-3); // report rounds to 3 decimals
      expect(cell.rpLocation).toBeCloseTo(cell.typicalDifficulty + 0.7082, 3);
    }
  });

  it('describes the mixture by its exact moments and states method, thresholds and caution', () => {
    const mean = 0.75 * 0 + 0.25 * 0.8;
    const second = 0.75 * 1 + 0.25 * (1.69 + 0.64);
    expect(whole.audiences[0]!.ability.mean).toBeCloseTo(mean, 3);
    expect(whole.audiences[0]!.ability.sd).toBeCloseTo(Math.sqrt(second - mean * mean), 3);
    expect(whole.foot.thresholds).toContain('0.7–1.3');
    expect(whole.foot.caution).toContain('describes an audience, not a person');
    // Bar RP location −0.8 + 0.708 ≈ −0.09: about 55% of this mixture reach it, below 80%.
    expect(whole.audiences[0]!.ladder.ceilingSentence).toContain('no chart type and task reaches 80%');
  });
});
