/**
 * Settings of an adaptive study: stop rules, exposure control and content balancing. The zod
 * schema is the block a study's settings embed (`adaptive: {...}`); the study's own `maxItems` and
 * `timeLimitSeconds` complete the stop rules (see {@link stopRulesFor}).
 */
import { z } from 'zod';
import { contentBalanceModes } from './content-area.js';

export const adaptiveStudySettingsSchema = z.strictObject({
  /** Stop when the posterior SD reaches this, logits (0.45 ≈ reliability 0.8 for an SD-1 audience). */
  seTarget: z.number().min(0.1).max(2).default(0.45),
  /** Never stop on the SE rule before this many items (guards against a narrow prior). */
  minItems: z.number().int().min(1).max(200).default(5),
  /** Randomesque k: the next item is drawn among the k most informative. */
  randomesque: z.number().int().min(1).max(20).default(5),
  /** What the attempt keeps in proportion. */
  contentBalance: z.enum(contentBalanceModes).default('level'),
  /** Target weight per area key (`read`, `bar`, `bar/read`); absent = each area's share of the pool. */
  areaTargets: z.record(z.string(), z.number().min(0)).optional(),
  /** Prior for cohorts the latest calibration does not cover. */
  defaultPrior: z
    .strictObject({ mean: z.number().min(-5).max(5), sd: z.number().min(0.2).max(5) })
    .default({ mean: 0, sd: 1.5 }),
});
export type AdaptiveStudySettings = z.infer<typeof adaptiveStudySettingsSchema>;

/** Everything `nextStep` needs to decide: stop rules and exposure control. */
export interface AdaptiveSettings {
  /** Stop when the posterior SD is at most this (logits). */
  readonly seTarget: number;
  /** The SE rule applies only after this many items. */
  readonly minItems: number;
  /** Stop after this many items. */
  readonly maxItems: number;
  /** Stop when this many seconds have passed since the first item (absent: no limit). */
  readonly timeLimitSeconds?: number;
  /** Randomesque k. */
  readonly randomesque: number;
  /** Sympson–Hetter K_i aligned with the bank (absent: off). */
  readonly exposureControl?: Float64Array;
}

/**
 * The stop rules of a study: the adaptive block plus the study's item and time limits.
 *
 * @example
 * stopRulesFor(adaptiveStudySettingsSchema.parse({}), { maxItems: 20 });
 * // { seTarget: 0.45, minItems: 5, maxItems: 20, timeLimitSeconds: undefined, randomesque: 5 }
 */
export function stopRulesFor(
  adaptive: AdaptiveStudySettings,
  study: { readonly maxItems: number; readonly timeLimitSeconds?: number },
): AdaptiveSettings {
  return {
    seTarget: adaptive.seTarget,
    minItems: Math.min(adaptive.minItems, study.maxItems),
    maxItems: study.maxItems,
    timeLimitSeconds: study.timeLimitSeconds,
    randomesque: adaptive.randomesque,
  };
}
