/**
 * The design check: how hard a planned chart is likely to be, before anyone answers it. Item
 * difficulty is modelled as a weighted sum of design features (the LLTM, fitted by CML on the
 * study's answers), the planned chart's features give a predicted difficulty with a prediction
 * interval, and each cohort's calibrated ability distribution gives the share likely to read it
 * (RP67, as for pilots). Pure: no database.
 *
 * The design matrix: chart type and task level one-hot, each with a reference level dropped (the
 * first chart type of the bank's list, and the first level of read, interpret, envision, that the
 * calibrated items use; the answer names both), then the features the request names
 * (server/reports/design-features.ts). A chart type or level no calibrated item has cannot be
 * predicted (400 naming the field); features the items cannot tell apart are 422
 * DESIGN_NOT_ESTIMABLE naming them.
 *
 * Scale: CML leaves the origin free and the LLTM puts the mean model difficulty of its items at 0,
 * while the study's calibration (MML) fixes the first cohort's mean at 0. The prediction is moved to
 * the calibration's scale by adding the mean calibrated difficulty of the items the LLTM used, so
 * it can be compared with the report's item difficulties and the cohorts' abilities. The uncertainty
 * of that shift (and the small differences between CML and MML estimates) is not in the intervals.
 *
 * @see Fischer, G. H. (1973). The linear logistic test model as an instrument in educational
 *   research. Acta Psychologica 37, 359-374 (the LLTM; CML estimation and the LR test against the
 *   Rasch model in Fischer 1995, Rasch Models ch. 8).
 * @see Janssen, R., Schepers, J., & Peres, D. (2004), in De Boeck & Wilson (Eds.), Explanatory Item
 *   Response Models, ch. 6 (the residual item variance behind the prediction interval; from memory).
 * @see Kolstad, A. (1996), the RP67 convention (from memory); shares as in server/reports/pilot-results.ts.
 */
import type { ItemFeatures } from '../bank/derive-features.js';
import { type TaskLevel, taskLevels } from '../bank/item-schema.js';
import { type ChartType, chartTypes } from '../charts/chart-spec.js';
import { AppError } from '../errors.js';
import { calibrateLltm, type LltmCalibration, LltmDesignError } from '../scoring/rasch/calibrate-lltm.js';
import { predictDifficulty } from '../scoring/rasch/predict-difficulty.js';
import type { ResponseMatrix } from '../scoring/response-matrix.js';
import { type DesignFeature, designFeatures, featureValue, type PlannedChart } from './design-features.js';
import { pilotCohortShares, pilotResponseProbability, shareLikelyToRead } from './pilot-results.js';

/** What the design check knows of one calibrated item. */
export interface DesignCheckItem {
  readonly chartType: ChartType;
  readonly level: TaskLevel;
  readonly features: ItemFeatures;
}

/** One cohort's calibrated ability distribution (logits), in the calibration's stored group order. */
export interface DesignCheckCohort {
  readonly cohortId: string;
  readonly label: string;
  readonly mean: number;
  readonly sd: number;
}

export interface DesignCheckInput {
  /** The study's scored answers; every column an item of `items` with a calibrated difficulty. */
  readonly matrix: ResponseMatrix;
  readonly items: ReadonlyMap<string, DesignCheckItem>;
  /** The calibration's difficulties (its scale), by item id. */
  readonly calibratedDifficulty: ReadonlyMap<string, number>;
  readonly calibrationId: string;
  readonly planned: PlannedChart;
  /** Every cohort of the calibration, in its stored order (the bootstrap draws use that order). */
  readonly cohorts: readonly DesignCheckCohort[];
  /** Bootstrap replicates of the cohorts: draws[r][g] = [mean, sd]. */
  readonly draws: readonly (readonly (readonly [number, number])[])[];
}

/** Coverage of every interval of the design check. */
export const designCheckLevel = 0.95;

/** One column of the design matrix and its weight. */
export interface DesignWeight {
  /** What the weight is of, in words: "chart type: scatter (vs table)", "legend". */
  readonly feature: string;
  /** The request field that brought the column in (chartType, level, features.legend, …). */
  readonly field: string;
  /** Logits of difficulty per unit (positive: makes charts harder). */
  readonly weight: number;
  readonly standardError: number;
}

export interface DesignCohortShare {
  readonly cohortId: string;
  readonly label: string;
  /** Share of the cohort at or above the RP67 location of the predicted difficulty. */
  readonly share: number;
  readonly interval: readonly [number, number];
}

export interface DesignCheck {
  readonly basis: 'model-based';
  /** The sentence every output prints: this is a prediction, not a measurement. */
  readonly statement: string;
  readonly calibrationId: string;
  readonly planned: PlannedChart;
  readonly model: {
    readonly method: string;
    readonly referenceChartType: ChartType;
    readonly referenceLevel: TaskLevel;
    readonly items: number;
    readonly persons: number;
    readonly converged: boolean;
    readonly weights: readonly DesignWeight[];
    readonly likelihoodRatio: {
      readonly statistic: number;
      readonly degreesOfFreedom: number;
      readonly pValue: number | null;
      readonly reading: string;
    };
    /** Variance of item difficulties around the model's line, logits². */
    readonly residualVariance: number;
  };
  readonly prediction: {
    /** On the calibration's scale (see `scale`). */
    readonly difficulty: number;
    /** Uncertainty of the model's line at these features. */
    readonly standardError: number;
    /** Uncertainty of one new chart's difficulty: line and residual item variance. */
    readonly predictionStandardError: number;
    readonly level: number;
    readonly predictionInterval: readonly [number, number];
    /** Ability at which the chance of a right answer is 0.67. */
    readonly rpLocation: number;
  };
  readonly scale: { readonly shift: number; readonly note: string };
  readonly shares: readonly DesignCohortShare[];
  readonly shareMethod: string;
}

const round = (value: number, digits = 3) => {
  const f = 10 ** digits;
  const r = Math.round(value * f) / f;
  return Object.is(r, -0) ? 0 : r;
};

interface Column {
  readonly name: string;
  readonly field: string;
  readonly ofItem: (item: DesignCheckItem) => number;
  readonly planned: number;
}

/** The design columns for the items the matrix holds and the planned chart; refusals name the field. */
function designColumns(
  itemIds: readonly string[],
  items: ReadonlyMap<string, DesignCheckItem>,
  planned: PlannedChart,
): { columns: Column[]; referenceChartType: ChartType; referenceLevel: TaskLevel } {
  const used = itemIds.map((id) => {
    const item = items.get(id);
    if (!item) throw new Error(`designCheck requires the features of item ${id}`);
    return item;
  });
  const typesUsed = chartTypes.filter((t) => used.some((item) => item.chartType === t));
  const levelsUsed = taskLevels.filter((l) => used.some((item) => item.level === l));
  if (!typesUsed.includes(planned.chartType)) {
    throw new AppError(
      'VALIDATION_FAILED',
      `body.chartType: no calibrated item of this study is a ${planned.chartType} chart, so the model knows nothing of it. Chart types it can predict: ${typesUsed.join(', ')}.`,
      {
        field: 'body.chartType',
        problems: [{ field: 'body.chartType', message: 'not among the calibrated items' }],
      },
    );
  }
  if (!levelsUsed.includes(planned.level)) {
    throw new AppError(
      'VALIDATION_FAILED',
      `body.level: no calibrated item of this study asks to ${planned.level}. Levels it can predict: ${levelsUsed.join(', ')}.`,
      { field: 'body.level', problems: [{ field: 'body.level', message: 'not among the calibrated items' }] },
    );
  }
  const referenceChartType = typesUsed[0]!;
  const referenceLevel = levelsUsed[0]!;
  const columns: Column[] = [
    ...typesUsed.slice(1).map((type) => ({
      name: `chart type: ${type} (vs ${referenceChartType})`,
      field: 'chartType',
      ofItem: (item: DesignCheckItem) => (item.chartType === type ? 1 : 0),
      planned: planned.chartType === type ? 1 : 0,
    })),
    ...levelsUsed.slice(1).map((level) => ({
      name: `task level: ${level} (vs ${referenceLevel})`,
      field: 'level',
      ofItem: (item: DesignCheckItem) => (item.level === level ? 1 : 0),
      planned: planned.level === level ? 1 : 0,
    })),
    ...designFeatures.flatMap((feature: DesignFeature) => {
      const value = planned.features[feature.key];
      if (value === undefined) return [];
      return [
        {
          name: feature.label,
          field: `features.${feature.key}`,
          ofItem: (item: DesignCheckItem) => featureValue(feature, feature.ofItem(item.features)),
          planned: featureValue(feature, value),
        },
      ];
    }),
  ];
  return { columns, referenceChartType, referenceLevel };
}

function readingOf(pValue: number | null, degreesOfFreedom: number): string {
  if (pValue === null)
    return `The design has as many weights as the items allow (${degreesOfFreedom} degrees of freedom), so the fit cannot be tested.`;
  if (pValue < 0.05)
    return `The features explain item difficulty only in part (LR test against the Rasch model, p ${pValue < 0.001 ? '< 0.001' : `= ${pValue.toFixed(3)}`}): charts with the same features still differ, and the prediction interval says by how much.`;
  return `The Rasch model with one difficulty per item does not fit significantly better than these features (p = ${pValue.toFixed(3)}).`;
}

/**
 * Fits the LLTM on the study's answers with the planned chart's design and predicts its difficulty
 * and each cohort's share likely to read it (the chosen cohort only, when the request names one).
 *
 * Shares: 1 − Φ((b + ln(0.67/0.33) − μ)/σ) for each cohort's N(μ, σ²). The interval is the 95%
 * percentile interval over the calibration's bootstrap replicates of (μ, σ) with the chart's
 * difficulty drawn from N(b̂, SE²_prediction) in each (as `pilotCohortShares` does for pilots); with
 * fewer than 20 replicates, the shares at the two ends of the prediction interval.
 *
 * @throws AppError VALIDATION_FAILED naming body.chartType or body.level when no calibrated item has
 *   it; DESIGN_NOT_ESTIMABLE naming the features that cannot be estimated together;
 *   CALIBRATION_NOT_CONVERGED when the LLTM does not converge; COHORT_NOT_FOUND when the chosen
 *   cohort is not among `cohorts`.
 */
export function designCheck(input: DesignCheckInput): DesignCheck {
  const { matrix, planned } = input;
  const level = designCheckLevel;
  const chosen =
    planned.cohortId === undefined
      ? input.cohorts
      : input.cohorts.filter((c) => c.cohortId === planned.cohortId);
  if (chosen.length === 0) {
    throw new AppError(
      'COHORT_NOT_FOUND',
      `Cohort ${planned.cohortId} is not in calibration ${input.calibrationId}. Its cohorts: ${input.cohorts.map((c) => `${c.cohortId} (${c.label})`).join(', ')}.`,
      { field: 'body.cohortId', cohortId: planned.cohortId },
    );
  }
  const { columns, referenceChartType, referenceLevel } = designColumns(matrix.itemIds, input.items, planned);
  if (columns.length === 0) {
    throw new AppError(
      'DESIGN_NOT_ESTIMABLE',
      'The calibrated items share one chart type and one task level and the request names no feature: there is nothing to weigh. Name at least one feature.',
      { field: 'body.features', fields: ['body.features'], features: [] },
    );
  }
  const p = columns.length;
  const weights = new Float64Array(matrix.itemIds.length * p);
  matrix.itemIds.forEach((id, i) => {
    const item = input.items.get(id)!;
    columns.forEach((column, j) => {
      weights[i * p + j] = column.ofItem(item);
    });
  });
  let lltm: LltmCalibration;
  try {
    lltm = calibrateLltm(matrix, { featureNames: columns.map((c) => c.name), weights });
  } catch (error) {
    if (error instanceof LltmDesignError) {
      const fields = [...new Set(error.features.map((name) => columns.find((c) => c.name === name)!.field))];
      const what = error.message.replace(/^calibrateLltm (design matrix is singular: )?/, '');
      throw new AppError(
        'DESIGN_NOT_ESTIMABLE',
        `These design features cannot be estimated together from the study's ${matrix.itemIds.length} calibrated items: ${what}. Leave out one of ${fields.map((f) => `body.${f}`).join(', ')}.`,
        {
          field: `body.${fields[0]}`,
          fields: fields.map((f) => `body.${f}`),
          features: [...error.features],
        },
      );
    }
    throw new AppError(
      'CALIBRATION_NOT_CONVERGED',
      `The design model cannot be fitted to this study's answers (${(error as Error).message}). More respondents, or fewer features, usually help.`,
    );
  }
  if (!lltm.converged) {
    throw new AppError(
      'CALIBRATION_NOT_CONVERGED',
      `The design model did not converge after ${lltm.iterations} iterations; no prediction is drawn from it. Fewer features usually help.`,
      { iterations: lltm.iterations },
    );
  }
  const prediction = predictDifficulty(
    lltm,
    columns.map((c) => c.planned),
    { level, rp: pilotResponseProbability },
  );
  let calibratedSum = 0;
  for (const id of lltm.itemIds) calibratedSum += input.calibratedDifficulty.get(id)!;
  const shift = calibratedSum / lltm.itemIds.length;
  const difficulty = prediction.difficulty + shift;
  const interval: [number, number] = [
    prediction.predictionInterval[0] + shift,
    prediction.predictionInterval[1] + shift,
  ];
  const bootstrap = pilotCohortShares(
    { difficulty, standardError: prediction.predictionStandardError },
    input.cohorts,
    input.draws,
  );
  const rpOffset = Math.log(pilotResponseProbability / (1 - pilotResponseProbability));
  const usesBootstrap = bootstrap.every((s) => s.interval !== null);
  const shares = chosen.map((cohort): DesignCohortShare => {
    const fromBootstrap = bootstrap.find((s) => s.cohortId === cohort.cohortId)!;
    const range: readonly [number, number] = usesBootstrap
      ? fromBootstrap.interval!
      : [
          shareLikelyToRead(interval[1], cohort.mean, cohort.sd),
          shareLikelyToRead(interval[0], cohort.mean, cohort.sd),
        ];
    return {
      cohortId: cohort.cohortId,
      label: cohort.label,
      share: round(fromBootstrap.share),
      interval: [round(range[0]), round(range[1])],
    };
  });
  const pValue = Number.isNaN(lltm.likelihoodRatio.pValue) ? null : round(lltm.likelihoodRatio.pValue, 4);
  const excluded = matrix.itemIds.length - lltm.itemIds.length;
  return {
    basis: 'model-based',
    statement:
      'A model-based prediction, not a measured difficulty: it is what a chart with these features would be likely to score ' +
      `if it behaved like the study's ${lltm.itemIds.length} calibrated items with the same features. Pilot the chart to measure it.`,
    calibrationId: input.calibrationId,
    planned,
    model: {
      method:
        `Linear logistic test model fitted by conditional maximum likelihood on ${lltm.itemIds.length} calibrated items` +
        `${excluded > 0 ? ` (${excluded} answered all right or all wrong left out)` : ''}: difficulty = sum of feature weights; ` +
        `chart type and task level one-hot against ${referenceChartType} and ${referenceLevel}` +
        `${columns.some((c) => c.field === 'features.marks') ? '; marks enter as ln(marks)' : ''}.`,
      referenceChartType,
      referenceLevel,
      items: lltm.itemIds.length,
      persons: matrix.personIds.length - lltm.excludedPersons.length,
      converged: lltm.converged,
      weights: columns.map((column, j) => ({
        feature: column.name,
        field: column.field,
        weight: round(lltm.weights[j]!),
        standardError: round(lltm.weightStandardErrors[j]!),
      })),
      likelihoodRatio: {
        statistic: round(lltm.likelihoodRatio.statistic),
        degreesOfFreedom: lltm.likelihoodRatio.degreesOfFreedom,
        pValue,
        reading: readingOf(pValue, lltm.likelihoodRatio.degreesOfFreedom),
      },
      residualVariance: round(prediction.residualVariance),
    },
    prediction: {
      difficulty: round(difficulty),
      standardError: round(prediction.standardError),
      predictionStandardError: round(prediction.predictionStandardError),
      level,
      predictionInterval: [round(interval[0]), round(interval[1])],
      rpLocation: round(difficulty + rpOffset),
    },
    scale: {
      shift: round(shift),
      note:
        `On the scale of calibration ${input.calibrationId}: the model's difficulties average 0 over its items, so the ` +
        `prediction was moved by ${shift >= 0 ? '+' : ''}${shift.toFixed(3)} logits, the mean calibrated difficulty of the same items. ` +
        'The uncertainty of that move is not in the intervals.',
    },
    shares,
    shareMethod: usesBootstrap
      ? `Share likely to read it: at least a 0.67 chance of a right answer (RP67), from each cohort's calibrated ability distribution; 95% percentile interval over the calibration's ${input.draws.length} bootstrap replicates of the cohorts, with the chart's difficulty drawn within its prediction SE in each.`
      : `Share likely to read it: at least a 0.67 chance of a right answer (RP67), from each cohort's calibrated ability distribution; the interval is the share at the two ends of the 95% prediction interval (the calibration has no bootstrap replicates).`,
  };
}
