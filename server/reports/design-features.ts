/**
 * The design features a design check (LLTM) can use, and the planned chart a user describes with
 * them: chart type and task level (always in the model, one-hot with a reference level dropped) plus
 * the optional features below, each read from the bank's derived features (server/bank/derive-features.ts)
 * for the calibrated items and from the request for the planned chart. Only the features a request
 * names enter the model, so a feature the study's items cannot tell apart can simply be left out.
 */
import { z } from 'zod';
import type { ItemFeatures } from '../bank/derive-features.js';
import { taskLevels } from '../bank/item-schema.js';
import { chartTypes } from '../charts/chart-spec.js';

/** One optional design feature: its key in a request, a plain label, and how it enters the model. */
export interface DesignFeature {
  readonly key: DesignFeatureKey;
  /** What the model's weight is per unit of, in words (reports and error messages). */
  readonly label: string;
  readonly kind: 'count' | 'yes-no';
  /** The feature of a calibrated item, as the bank derives it. */
  readonly ofItem: (features: ItemFeatures) => number | boolean;
}

export const designFeatureKeys = [
  'marks',
  'series',
  'legend',
  'logAxis',
  'truncatedAxis',
  'annotation',
  'gridlines',
  'valueLabels',
  'multiStep',
] as const;
export type DesignFeatureKey = (typeof designFeatureKeys)[number];

/**
 * The features, in the order their columns enter the design matrix. Marks enter as ln(marks): one
 * more mark matters less the more there are (a modelling choice, stated in every answer). Yes/no
 * features enter as 1/0, series as their count.
 */
export const designFeatures: readonly DesignFeature[] = [
  { key: 'marks', label: 'marks (per unit of ln marks)', kind: 'count', ofItem: (f) => f.markCount },
  { key: 'series', label: 'series (per series drawn)', kind: 'count', ofItem: (f) => f.seriesCount },
  { key: 'legend', label: 'legend', kind: 'yes-no', ofItem: (f) => f.legend },
  { key: 'logAxis', label: 'log axis', kind: 'yes-no', ofItem: (f) => f.logAxis },
  { key: 'truncatedAxis', label: 'truncated axis', kind: 'yes-no', ofItem: (f) => f.truncatedAxis },
  { key: 'annotation', label: 'annotation', kind: 'yes-no', ofItem: (f) => f.annotation },
  { key: 'gridlines', label: 'gridlines', kind: 'yes-no', ofItem: (f) => f.gridlines },
  { key: 'valueLabels', label: 'value labels', kind: 'yes-no', ofItem: (f) => f.valueLabels },
  { key: 'multiStep', label: 'several steps', kind: 'yes-no', ofItem: (f) => f.multiStep },
];

/** The value a feature contributes to an item's row of the design matrix. */
export function featureValue(feature: DesignFeature, value: number | boolean): number {
  if (typeof value === 'boolean') return value ? 1 : 0;
  return feature.key === 'marks' ? Math.log(Math.max(value, 1)) : value;
}

const count = (max: number) => z.number().int().min(1).max(max);

/** What the user plans: a chart type, a task level, the features to model, and optionally a cohort. */
export const plannedChartSchema = z.strictObject({
  chartType: z.enum(chartTypes),
  level: z.enum(taskLevels),
  features: z
    .strictObject({
      marks: count(100_000).optional(),
      series: count(1000).optional(),
      legend: z.boolean().optional(),
      logAxis: z.boolean().optional(),
      truncatedAxis: z.boolean().optional(),
      annotation: z.boolean().optional(),
      gridlines: z.boolean().optional(),
      valueLabels: z.boolean().optional(),
      multiStep: z.boolean().optional(),
    })
    .default({}),
  /** The cohort whose share likely to read the chart is wanted; all calibrated cohorts when absent. */
  cohortId: z.string().min(1).max(100).optional(),
});
export type PlannedChart = z.infer<typeof plannedChartSchema>;
export type PlannedChartInput = z.input<typeof plannedChartSchema>;
