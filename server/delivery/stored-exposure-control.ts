/**
 * How a stored Sympson–Hetter exposure control applies to live adaptive delivery.
 *
 * Validity: K_i are tuned by simulation on one calibration's difficulties under one set of adaptive
 * settings; under other settings (SE target, item limits, randomesque k, content balance, area
 * targets) the selection rates they correct differ, so a stored control is looked up by its
 * calibration and the SHA-256 of these settings in a fixed key order. Left out on purpose: the time
 * limit (not simulated) and the default prior (used only for cohorts the calibration lacks).
 *
 * Items: K per item id. An item the control does not name (added to the pool after tuning) gets
 * K = 1, i.e. it is given whenever selected, as without exposure control; an item it names that is
 * no longer in the bank is ignored.
 *
 * @see Sympson, J. B., & Hetter, R. D. (1985). Controlling item-exposure rates in computerized
 *   adaptive testing. Proceedings of the 27th annual meeting of the Military Testing Association,
 *   973–977.
 */
import { createHash } from 'node:crypto';
import type { AdaptiveSettings, AdaptiveStudySettings } from './adaptive/adaptive-settings.js';
import type { ContentBalanceMode } from './adaptive/content-area.js';

/** The adaptive settings a stored control holds for. */
export interface ExposureControlSettings {
  readonly seTarget: number;
  readonly minItems: number;
  readonly maxItems: number;
  readonly randomesque: number;
  readonly contentBalance: ContentBalanceMode;
  /** Area targets sorted by key; null = each area's share of the pool. */
  readonly areaTargets: Readonly<Record<string, number>> | null;
}

/**
 * The settings a control tuned (or looked up) for a study holds for.
 *
 * @param adaptive the study's adaptive block (defaults filled in).
 * @param rules the stop rules built from it (`stopRulesFor`; minItems already capped at maxItems).
 * @example
 * exposureControlSettingsOf(adaptiveStudySettingsSchema.parse({}), { seTarget: 0.45, minItems: 5,
 *   maxItems: 20, randomesque: 5 });
 * // { seTarget: 0.45, minItems: 5, maxItems: 20, randomesque: 5, contentBalance: 'level', areaTargets: null }
 */
export function exposureControlSettingsOf(
  adaptive: Pick<AdaptiveStudySettings, 'contentBalance' | 'areaTargets'>,
  rules: Pick<AdaptiveSettings, 'seTarget' | 'minItems' | 'maxItems' | 'randomesque'>,
): ExposureControlSettings {
  const targets = adaptive.areaTargets;
  return {
    seTarget: rules.seTarget,
    minItems: rules.minItems,
    maxItems: rules.maxItems,
    randomesque: rules.randomesque,
    contentBalance: adaptive.contentBalance,
    areaTargets:
      targets === undefined
        ? null
        : Object.fromEntries(
            Object.keys(targets)
              .sort()
              .map((key) => [key, targets[key]!]),
          ),
  };
}

/** The settings as stored: JSON with the keys in the fixed order of {@link exposureControlSettingsOf}. */
export function exposureControlSettingsJson(settings: ExposureControlSettings): string {
  return JSON.stringify(
    exposureControlSettingsOf(
      { contentBalance: settings.contentBalance, areaTargets: settings.areaTargets ?? undefined },
      settings,
    ),
  );
}

/** SHA-256 (hex) of {@link exposureControlSettingsJson}: equal settings, equal hash. */
export function exposureControlSettingsHash(settings: ExposureControlSettings): string {
  return createHash('sha256').update(exposureControlSettingsJson(settings)).digest('hex');
}

/**
 * K per bank item (bank order) from a stored `{ itemId: K }`; items not named get 1.
 *
 * @throws when a value is not a number in [0, 1] (the stored row is damaged).
 * @example
 * alignExposureControl({ b: 0.4, gone: 0.2 }, ['a', 'b']); // Float64Array [1, 0.4]
 */
export function alignExposureControl(
  values: Readonly<Record<string, number>>,
  bankIds: readonly string[],
): Float64Array {
  const aligned = new Float64Array(bankIds.length).fill(1);
  bankIds.forEach((id, i) => {
    if (!Object.hasOwn(values, id)) return;
    const k = values[id]!;
    if (!(typeof k === 'number' && k >= 0 && k <= 1)) {
      throw new Error(`alignExposureControl requires K in [0, 1] (item ${id}: ${String(k)})`);
    }
    aligned[i] = k;
  });
  return aligned;
}
