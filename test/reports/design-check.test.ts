/**
 * The design check on simulated data (invented): item difficulties generated EXACTLY from known
 * feature weights (an LLTM with no item residual), Rasch answers of a fixed form, and a calibration
 * scale whose origin differs from the LLTM's by a known amount. The weights must come back within
 * 2 SE, and a held-out design (a combination no item has) must be predicted near its true value.
 */
import { describe, expect, it } from 'vitest';
import type { ItemFeatures } from '../../server/bank/derive-features.js';
import type { TaskLevel } from '../../server/bank/item-schema.js';
import type { ChartType } from '../../server/charts/chart-spec.js';
import type { AppError } from '../../server/errors.js';
import {
  type DesignCheckInput,
  type DesignCheckItem,
  designCheck,
} from '../../server/reports/design-check.js';
import { type PlannedChartInput, plannedChartSchema } from '../../server/reports/design-features.js';
import type { ResponseMatrix } from '../../server/scoring/response-matrix.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';
import { standardNormalCdf } from '../../server/scoring/statistics/standard-normal-cdf.js';

const types: ChartType[] = ['table', 'bar', 'scatter', 'network'];
const levels: TaskLevel[] = ['read', 'interpret', 'envision'];
/** INVENTED generating weights (logits). */
const truth = {
  type: { table: 0, bar: 0.3, scatter: 0.8, network: 1.4 } as Record<string, number>,
  level: { read: 0, interpret: 0.6, envision: 1.3 } as Record<string, number>,
  lnMarks: 0.35,
  legend: 0.4,
  constant: -1.6,
};
/** The calibration's origin differs from the LLTM's (mean item difficulty 0) by the generating mean plus this. */
const scaleOffset = 0.7;

function featuresOf(marks: number, legend: boolean, series = 1): ItemFeatures {
  return {
    chartType: 'bar',
    markCount: marks,
    seriesCount: series,
    channels: ['position'],
    labelling: legend ? 'legend' : 'none',
    legend,
    axisScales: [],
    logAxis: false,
    truncatedAxis: false,
    annotation: false,
    gridlines: false,
    sorted: false,
    valueLabels: false,
    keyOp: null,
    multiStep: false,
    precision: false,
    distractorKinds: [],
  };
}

function trueDifficulty(type: string, level: string, marks: number, legend: boolean): number {
  return (
    truth.constant +
    truth.type[type]! +
    truth.level[level]! +
    truth.lnMarks * Math.log(marks) +
    (legend ? truth.legend : 0)
  );
}

interface Simulated {
  items: Map<string, DesignCheckItem>;
  difficulty: Map<string, number>;
  matrix: ResponseMatrix;
}

/** 60 items (4 types × 3 levels × 5 variants), `persons` abilities N(0, 1), everyone answers everything. */
function simulate(persons: number, seed: number, residualSd = 0): Simulated {
  const random = seededRandom(seed);
  const items = new Map<string, DesignCheckItem>();
  const difficulty = new Map<string, number>();
  const marksOf = [4, 8, 16, 32, 6];
  types.forEach((type, t) => {
    for (const level of levels) {
      for (let v = 0; v < 5; v++) {
        const id = `${type}-${level}-${v}`;
        const marks = marksOf[v]!;
        const legend = (v + t) % 2 === 1;
        items.set(id, { chartType: type, level, features: featuresOf(marks, legend) });
        difficulty.set(id, trueDifficulty(type, level, marks, legend) + residualSd * random.normal());
      }
    }
  });
  const itemIds = [...items.keys()];
  const scores = new Uint8Array(persons * itemIds.length);
  for (let p = 0; p < persons; p++) {
    const theta = random.normal();
    itemIds.forEach((id, i) => {
      scores[p * itemIds.length + i] =
        random.uniform() < 1 / (1 + Math.exp(-(theta - difficulty.get(id)!))) ? 1 : 0;
    });
  }
  return {
    items,
    difficulty,
    matrix: { personIds: Array.from({ length: persons }, (_, p) => `p${p}`), itemIds, scores },
  };
}

function inputFor(sim: Simulated, planned: PlannedChartInput, extra: Partial<DesignCheckInput> = {}) {
  // the calibration's scale: calibrated b = generating b + scaleOffset; abilities move with the scale,
  // so a cohort generated N(0, 1) has calibrated mean scaleOffset
  return {
    matrix: sim.matrix,
    items: sim.items,
    calibratedDifficulty: new Map([...sim.difficulty].map(([id, b]) => [id, b + scaleOffset])),
    calibrationId: 'cal-test',
    planned: plannedChartSchema.parse(planned),
    cohorts: [
      { cohortId: 'c1', label: 'Harbour school', mean: scaleOffset, sd: 1 },
      { cohortId: 'c2', label: 'Island library', mean: scaleOffset + 0.5, sd: 1.2 },
    ],
    draws: [],
    ...extra,
  } satisfies DesignCheckInput;
}

const rp67 = Math.log(0.67 / 0.33);

describe('designCheck on data generated from known feature weights', () => {
  const sim = simulate(1500, 2031);
  const heldOut = { chartType: 'scatter', level: 'envision', features: { marks: 50, legend: true } } as const;
  const check = designCheck(inputFor(sim, heldOut));

  const expected: Record<string, number> = {
    'chart type: bar (vs table)': truth.type.bar!,
    'chart type: scatter (vs table)': truth.type.scatter!,
    'chart type: network (vs table)': truth.type.network!,
    'task level: interpret (vs read)': truth.level.interpret!,
    'task level: envision (vs read)': truth.level.envision!,
    'marks (per unit of ln marks)': truth.lnMarks,
    legend: truth.legend,
  };

  it('names the weights against the stated reference levels', () => {
    expect(check.basis).toBe('model-based');
    expect(check.model.referenceChartType).toBe('table');
    expect(check.model.referenceLevel).toBe('read');
    expect(check.model.weights.map((w) => w.feature)).toEqual(Object.keys(expected));
    expect(check.model.weights.find((w) => w.feature === 'legend')!.field).toBe('features.legend');
    expect(check.model.items).toBe(60);
    for (const w of check.model.weights)
      expect(Math.abs(w.weight - expected[w.feature]!)).toBeLessThan(3 * w.standardError);
  });

  it('recovers the generating weights within 2 SE about 95% of the time (20 seeds × 7 weights)', () => {
    const z: number[] = [];
    for (let seed = 1; seed <= 20; seed++) {
      const fit = designCheck(inputFor(simulate(600, 100 + seed), heldOut));
      for (const w of fit.model.weights) z.push((w.weight - expected[w.feature]!) / w.standardError);
    }
    const within = (k: number) => z.filter((v) => Math.abs(v) < k).length;
    // normal theory: 95.4% within 2 SE (133.6 of 140, binomial SD 2.5) and 68.3% within 1 SE (95.6, SD 5.5);
    // too small SEs fail the first bound, too large ones the last (common practice, no source)
    expect(within(2)).toBeGreaterThanOrEqual(126);
    expect(within(1)).toBeGreaterThanOrEqual(80);
    expect(within(1)).toBeLessThanOrEqual(112);
    const bias = z.reduce((s, v) => s + v, 0) / z.length;
    expect(Math.abs(bias)).toBeLessThan(0.3);
  });

  it('predicts a held-out design near its true difficulty, on the calibration scale', () => {
    const target = trueDifficulty('scatter', 'envision', 50, true) + scaleOffset;
    expect(Math.abs(check.prediction.difficulty - target)).toBeLessThan(2 * check.prediction.standardError);
    expect(check.prediction.predictionInterval[0]).toBeLessThan(target);
    expect(check.prediction.predictionInterval[1]).toBeGreaterThan(target);
    // the calibration scale's origin is the mean calibrated difficulty of the items the model used
    const meanCalibrated = [...sim.difficulty.values()].reduce((s, b) => s + b, 0) / 60 + scaleOffset;
    expect(check.scale.shift).toBeCloseTo(meanCalibrated, 3);
    expect(check.scale.note).toContain('cal-test');
    // no item residual was generated: the residual variance is near 0 and the LR test does not reject
    // (with this seed; the LLTM holds exactly in the generating model)
    expect(check.model.residualVariance).toBeLessThan(0.01);
    expect(check.model.likelihoodRatio.degreesOfFreedom).toBe(60 - 1 - 7);
    expect(check.model.likelihoodRatio.pValue!).toBeGreaterThan(0.01);
    expect(check.statement).toContain('not a measured difficulty');
  });

  it('gives each cohort the RP67 share with the shares at the prediction-interval ends', () => {
    const [first, second] = check.shares;
    // 1 − Φ((b + ln(0.67/0.33) − μ)/σ): the RP67 share (common practice, no source)
    const b = check.prediction.difficulty;
    expect(first!.share).toBeCloseTo(1 - standardNormalCdf((b + rp67 - scaleOffset) / 1), 2);
    expect(second!.share).toBeCloseTo(1 - standardNormalCdf((b + rp67 - scaleOffset - 0.5) / 1.2), 2);
    const [lo, hi] = check.prediction.predictionInterval;
    expect(first!.interval[0]).toBeCloseTo(1 - standardNormalCdf((hi + rp67 - scaleOffset) / 1), 2);
    expect(first!.interval[1]).toBeCloseTo(1 - standardNormalCdf((lo + rp67 - scaleOffset) / 1), 2);
    expect(check.shareMethod).toContain('two ends of the 95% prediction interval');
    expect(check.prediction.rpLocation).toBeCloseTo(b + rp67, 2);
  });

  it('uses the bootstrap replicates for the share interval when the calibration has them, and one chosen cohort', () => {
    const random = seededRandom(9);
    const draws = Array.from({ length: 200 }, () => [
      [scaleOffset + 0.05 * random.normal(), 1 + 0.04 * random.normal()] as const,
      [scaleOffset + 0.5 + 0.05 * random.normal(), 1.2 + 0.04 * random.normal()] as const,
    ]);
    const withDraws = designCheck(inputFor(sim, { ...heldOut, cohortId: 'c2' }, { draws }));
    expect(withDraws.shares.map((s) => s.cohortId)).toEqual(['c2']);
    const share = withDraws.shares[0]!;
    expect(share.interval[0]).toBeLessThan(share.share);
    expect(share.interval[1]).toBeGreaterThan(share.share);
    expect(withDraws.shareMethod).toContain('200 bootstrap replicates');
  });

  it('widens the prediction interval by the residual item variance when difficulties stray from the line', () => {
    const noisy = designCheck(inputFor(simulate(1500, 7, 0.5), heldOut));
    // generated residual SD 0.5: σ²_res ≈ 0.25 (expected from the generating model; 60 items give a rough estimate)
    expect(noisy.model.residualVariance).toBeGreaterThan(0.1);
    expect(noisy.model.residualVariance).toBeLessThan(0.5);
    expect(noisy.prediction.predictionStandardError).toBeGreaterThan(0.3);
    expect(noisy.model.likelihoodRatio.pValue!).toBeLessThan(0.001);
    expect(noisy.model.likelihoodRatio.reading).toContain('explain item difficulty only in part');
  });
});

describe('designCheck refusals', () => {
  const sim = simulate(300, 5);
  const refusal = (planned: PlannedChartInput, extra: Partial<DesignCheckInput> = {}) => {
    try {
      designCheck(inputFor(sim, planned, extra));
    } catch (error) {
      return error as AppError;
    }
    throw new Error('expected a refusal');
  };

  it('names a feature every item shares (a constant column)', () => {
    const error = refusal({ chartType: 'bar', level: 'read', features: { series: 2 } });
    expect(error.code).toBe('DESIGN_NOT_ESTIMABLE');
    expect(error.statusCode).toBe(422);
    expect(error.details.fields).toEqual(['body.features.series']);
    expect(error.message).toContain('"series (per series drawn)" is the same for every item');
  });

  it('names collinear features: a legend on exactly the scatter plots', () => {
    const items = new Map(
      [...sim.items].map(([id, item]) => [
        id,
        { ...item, features: featuresOf(item.features.markCount, item.chartType === 'scatter') },
      ]),
    );
    const error = refusal({ chartType: 'bar', level: 'read', features: { legend: false } }, { items });
    expect(error.code).toBe('DESIGN_NOT_ESTIMABLE');
    expect(error.details.fields).toEqual(['body.features.legend', 'body.chartType']);
    expect(error.details.features).toEqual(['legend', 'chart type: scatter (vs table)']);
    expect(error.message).toContain(
      '"legend" is a linear combination of the constant and "chart type: scatter (vs table)"',
    );
  });

  it('refuses a chart type or level no calibrated item has, naming the field', () => {
    const pie = refusal({ chartType: 'pie', level: 'read' });
    expect(pie.code).toBe('VALIDATION_FAILED');
    expect(pie.details.field).toBe('body.chartType');
    expect(pie.message).toContain('table, bar, scatter, network');
    const onlyRead = simulate(200, 3);
    const readOnly = new Set([...onlyRead.items].filter(([, i]) => i.level === 'read').map(([id]) => id));
    const columns = onlyRead.matrix.itemIds.flatMap((id, c) => (readOnly.has(id) ? [c] : []));
    const scores = new Uint8Array(200 * columns.length);
    for (let p = 0; p < 200; p++)
      columns.forEach((c, j) => {
        scores[p * columns.length + j] = onlyRead.matrix.scores[p * 60 + c]!;
      });
    const matrix = { personIds: onlyRead.matrix.personIds, itemIds: [...readOnly], scores };
    const level = refusal({ chartType: 'bar', level: 'envision' }, { matrix });
    expect(level.details.field).toBe('body.level');
  });

  it('refuses a cohort the calibration does not hold', () => {
    const error = refusal({ chartType: 'bar', level: 'read', cohortId: 'c9' });
    expect(error.code).toBe('COHORT_NOT_FOUND');
    expect(error.details.field).toBe('body.cohortId');
  });

  it('rejects unknown chart types, levels, features and values at the schema', () => {
    const issues = (body: unknown) =>
      plannedChartSchema.safeParse(body).error?.issues.map((i) => i.path.join('.')) ?? [];
    expect(issues({ chartType: 'pie3d', level: 'read' })).toEqual(['chartType']);
    expect(issues({ chartType: 'bar', level: 'analyse' })).toEqual(['level']);
    expect(issues({ chartType: 'bar', level: 'read', features: { colour: true } })).toEqual(['features']);
    expect(issues({ chartType: 'bar', level: 'read', features: { marks: 0 } })).toEqual(['features.marks']);
    expect(issues({ chartType: 'bar', level: 'read', features: { legend: 'yes' } })).toEqual([
      'features.legend',
    ]);
  });
});
