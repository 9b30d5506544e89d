/**
 * Adaptive design in live delivery: joins the pure engine (server/delivery/adaptive/) to the
 * stored study, its latest calibration and the attempt's form JSON.
 *
 * Decision, no calibration: an adaptive study selects on calibrated difficulties, so without a
 * converged calibration of the study it cannot run. It is refused with 409
 * ADAPTIVE_NEEDS_CALIBRATION when the study is created as adaptive (a new study has no responses
 * yet), when it is switched to adaptive before a converged calibration exists, and at join if the
 * calibration is gone or places none of the pool's items. Run the study as fixed or rotated
 * first, calibrate, then switch.
 *
 * Eligible items: in the study's pool, scored on the spot (not short-text: those wait for a
 * rater and cannot move the estimate), and calibrated at the version now delivered. Items of the
 * pool without a calibrated difficulty are listed in `notEligible` (pilot candidates).
 */
import { AppError } from '../errors.js';
import type { StoredCalibrationSettings } from '../reports/calibrate-study.js';
import {
  type CalibrationRecord,
  calibrationRowToRecord,
  findCalibrationById,
  listCalibrationItems,
} from '../storage/calibration-repository.js';
import type { DbHandle } from '../storage/db-handle.js';
import { listCalibrationExposureControls } from '../storage/exposure-control-repository.js';
import { listRetiredItemIds } from '../storage/item-status-repository.js';
import { syncItemVersions } from '../storage/item-version-repository.js';
import { type AdaptiveBank, buildAdaptiveBank } from './adaptive/adaptive-bank.js';
import { choosePrior } from './adaptive/adaptive-prior.js';
import {
  type AdaptiveSettings,
  type AdaptiveStudySettings,
  adaptiveStudySettingsSchema,
  stopRulesFor,
} from './adaptive/adaptive-settings.js';
import { advance, nextStep, startAdaptiveState } from './adaptive/adaptive-state.js';
import { contentAreaOf } from './adaptive/content-area.js';
import type { AttemptForm } from './attempt-form.js';
import type { DeliveryBank } from './delivery-bank.js';
import { selectItemPool } from './select-item-pool.js';
import {
  alignExposureControl,
  exposureControlSettingsHash,
  exposureControlSettingsOf,
} from './stored-exposure-control.js';
import type { StudySettings } from './study-settings.js';

/** The message of ADAPTIVE_NEEDS_CALIBRATION. */
export const needsCalibrationMessage =
  "Adaptive delivery needs a calibration of this study's items. Run the study as fixed or rotated first, then calibrate, then switch it to adaptive.";

/** Everything one adaptive step needs, built from the study and its calibration. */
export interface AdaptiveDelivery {
  readonly calibrationId: string;
  readonly bank: AdaptiveBank;
  readonly rules: AdaptiveSettings;
  readonly adaptive: AdaptiveStudySettings;
  /** Cohort distributions of the calibration (for the prior). */
  readonly groups: readonly { cohortId: string; mean: number; sd: number }[];
  /** Current version of each pool item. */
  readonly versions: ReadonlyMap<string, number>;
  /** Pool items without a calibrated difficulty at their current version, or not auto-scored. */
  readonly notEligible: readonly string[];
  /** Area targets named but without items. */
  readonly emptyAreas: readonly string[];
  /**
   * Id of the stored Sympson–Hetter control a new attempt starts with: the newest tuned on this
   * calibration for these adaptive settings (stored-exposure-control.ts); null = randomesque only.
   */
  readonly exposureControlId: string | null;
  /** K per bank item of every control stored for this calibration, by id (running attempts keep theirs). */
  readonly exposureControls: ReadonlyMap<string, Float64Array>;
}

/** The study's adaptive block with defaults filled in. */
export function adaptiveSettingsOf(settings: StudySettings): AdaptiveStudySettings {
  return settings.adaptive ?? adaptiveStudySettingsSchema.parse({});
}

/** The newest converged calibration of a study, or undefined. */
export async function findLatestConvergedCalibration(
  db: DbHandle,
  studyId: string,
): Promise<CalibrationRecord | undefined> {
  const row = await db
    .selectFrom('calibrations')
    .selectAll()
    .where('study_id', '=', studyId)
    .where('converged', '=', 1)
    .orderBy('created_at', 'desc')
    .orderBy('id', 'desc')
    .executeTakeFirst();
  return row ? calibrationRowToRecord(row) : undefined;
}

/**
 * Refuses a study settings change to the adaptive design without a usable calibration.
 *
 * @param studyId undefined for a study being created (never calibrated).
 * @throws AppError ADAPTIVE_NEEDS_CALIBRATION.
 */
export async function requireAdaptiveReady(
  db: DbHandle,
  bank: DeliveryBank,
  studyId: string | undefined,
  settings: StudySettings,
): Promise<void> {
  if (settings.design !== 'adaptive') return;
  if (studyId === undefined) {
    throw new AppError('ADAPTIVE_NEEDS_CALIBRATION', needsCalibrationMessage, {
      reason: 'a new study has no calibration',
    });
  }
  await loadAdaptiveDelivery(db, bank, studyId, settings);
}

/**
 * Builds the adaptive bank of a study from a calibration (the latest converged one unless
 * `calibrationId` names the one an attempt started on).
 *
 * @throws AppError ADAPTIVE_NEEDS_CALIBRATION when there is no such calibration or it places
 *   none of the pool's auto-scored items at their current version; CONFLICT when the area
 *   targets name no area that has items.
 */
export async function loadAdaptiveDelivery(
  db: DbHandle,
  bank: DeliveryBank,
  studyId: string,
  settings: StudySettings,
  calibrationId?: string,
): Promise<AdaptiveDelivery> {
  const calibration =
    calibrationId === undefined
      ? await findLatestConvergedCalibration(db, studyId)
      : await findCalibrationById(db, calibrationId);
  if (!calibration?.converged) {
    throw new AppError('ADAPTIVE_NEEDS_CALIBRATION', needsCalibrationMessage, {
      reason: 'the study has no converged calibration',
    });
  }
  const adaptive = adaptiveSettingsOf(settings);
  // A new attempt (no calibration chosen yet) leaves retired items out; a running attempt keeps
  // the pool it started with, so a stored attempt replays exactly.
  const pool = selectItemPool(
    bank.items.map((entry) => entry.item),
    settings.pool,
    calibrationId === undefined ? await listRetiredItemIds(db) : undefined,
  ).itemIds;
  const versions = await syncItemVersions(
    db,
    pool.map((id) => {
      const entry = bank.get(id)!;
      return { id, contentHash: entry.contentHash, status: entry.item.status };
    }),
    new Date().toISOString(),
  );
  const calibrated = new Map((await listCalibrationItems(db, calibration.id)).map((c) => [c.itemId, c]));
  const items: { id: string; difficulty: number; area: string }[] = [];
  const notEligible: string[] = [];
  for (const id of pool) {
    const entry = bank.get(id)!;
    const record = calibrated.get(id);
    if (
      record === undefined ||
      record.itemVersion !== versions.get(id) ||
      !Number.isFinite(record.difficulty) ||
      entry.item.response.kind === 'short-text'
    ) {
      notEligible.push(id);
      continue;
    }
    const area = contentAreaOf(
      { chartType: entry.item.chart.type, level: entry.item.level },
      adaptive.contentBalance,
    );
    items.push({ id, difficulty: record.difficulty, area });
  }
  if (items.length === 0) {
    throw new AppError('ADAPTIVE_NEEDS_CALIBRATION', needsCalibrationMessage, {
      reason: "the calibration places none of the pool's items at their current version",
    });
  }
  let built: ReturnType<typeof buildAdaptiveBank>;
  try {
    built = buildAdaptiveBank(items, adaptive.areaTargets);
  } catch (error) {
    throw new AppError('CONFLICT', 'The adaptive area targets name no area that has calibrated items.', {
      reason: error instanceof Error ? error.message : String(error),
      field: 'body.settings.adaptive.areaTargets',
    });
  }
  const stored = calibration.settings as Partial<StoredCalibrationSettings> | null;
  const rules = stopRulesFor(adaptive, settings);
  const settingsHash = exposureControlSettingsHash(exposureControlSettingsOf(adaptive, rules));
  const controls = await listCalibrationExposureControls(db, calibration.id);
  return {
    calibrationId: calibration.id,
    bank: built.bank,
    rules,
    adaptive,
    groups: (stored?.groups ?? []).map((g) => ({ cohortId: g.cohortId, mean: g.mean, sd: g.sd })),
    versions,
    notEligible,
    emptyAreas: built.emptyAreas,
    exposureControlId: controls.find((c) => c.settingsHash === settingsHash)?.id ?? null,
    exposureControls: new Map(
      controls.map((c) => [c.id, alignExposureControl(c.itemParameters, built.bank.ids)]),
    ),
  };
}

/** The stop rules with the attempt's exposure control (absent id or unknown id: randomesque only). */
function rulesWithExposureControl(delivery: AdaptiveDelivery, exposureControlId: string | null | undefined) {
  const control = exposureControlId ? delivery.exposureControls.get(exposureControlId) : undefined;
  return control === undefined ? delivery.rules : { ...delivery.rules, exposureControl: control };
}

/** The uint32 seed of the adaptive engine taken from the attempt's hex seed. */
export function adaptiveSeedOf(formSeed: string): number {
  const value = Number.parseInt(formSeed.slice(0, 8), 16);
  return Number.isFinite(value) ? value >>> 0 : 0;
}

/**
 * The adaptive part of a new attempt's form: the prior, the first item, and the prior's warning
 * (null when the cohort's own estimate is used; the caller logs it).
 */
export function startAdaptiveForm(
  delivery: AdaptiveDelivery,
  cohortId: string,
  formSeed: string,
): {
  items: AttemptForm['items'];
  adaptive: NonNullable<AttemptForm['adaptive']>;
  warning: string | null;
} {
  const { prior, warning } = choosePrior(cohortId, delivery.groups, delivery.adaptive.defaultPrior);
  const state = startAdaptiveState(prior, adaptiveSeedOf(formSeed));
  const exposureControlId = delivery.exposureControlId;
  const step = nextStep(state, delivery.bank, rulesWithExposureControl(delivery, exposureControlId), 0);
  // The control is recorded only when there is one, so forms without it look as before.
  const pinned = exposureControlId === null ? {} : { exposureControlId };
  if (step.kind === 'stop') {
    return {
      items: [],
      adaptive: { state, pending: null, stop: step.reason, calibrationId: delivery.calibrationId, ...pinned },
      warning,
    };
  }
  return {
    items: [{ itemId: step.itemId, version: delivery.versions.get(step.itemId)! }],
    adaptive: { state, pending: step, stop: null, calibrationId: delivery.calibrationId, ...pinned },
    warning,
  };
}

/**
 * After the pending item is answered: updates the EAP estimate and either appends the next item
 * to `form.items` or records why the attempt stops. Changes `form` in place.
 *
 * @param score the stored score (null counts as 0: only auto-scored items are eligible).
 * @param elapsedSeconds seconds since the first item was shown.
 */
export function advanceAdaptiveForm(
  delivery: AdaptiveDelivery,
  form: AttemptForm,
  score: number | null,
  elapsedSeconds: number,
): void {
  const adaptive = form.adaptive;
  if (adaptive === undefined || adaptive.pending === null) return;
  const state = advance(adaptive.state, adaptive.pending, score === 1 ? 1 : 0);
  // The exposure control the attempt started with, even if a newer one was stored since: a stored
  // attempt replays exactly.
  const rules = rulesWithExposureControl(delivery, adaptive.exposureControlId);
  const step = nextStep(state, delivery.bank, rules, elapsedSeconds);
  if (step.kind === 'item') {
    form.items.push({ itemId: step.itemId, version: delivery.versions.get(step.itemId)! });
    form.presentedAt.push(null);
    form.adaptive = { ...adaptive, state, pending: step, stop: null };
  } else {
    form.adaptive = { ...adaptive, state, pending: null, stop: step.reason };
  }
}
