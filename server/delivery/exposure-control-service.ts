/**
 * Tuning a study's Sympson–Hetter exposure control and storing it for live attempts
 * (`POST /api/admin/studies/:studyId/exposure-control` and `plotgauge simulate adaptive --study <id>
 * --save-exposure-control`).
 *
 * What is simulated is what `plotgauge simulate adaptive --study` runs: the adaptive bank a join of
 * the study builds from its latest converged calibration, its adaptive settings (time not
 * simulated), and three audiences N(−1, 1), N(0, 1), N(1, 1) with their own prior. First with
 * randomesque selection alone; then:
 * - its largest exposure is at most the target: nothing to control (`not-needed`, every K = 1);
 * - the mean exposure (mean items / bank size), which no control can push the largest below, is
 *   already at the target: `floor-above-target`, every K = 1 (passing items over would only cut
 *   attempts short with `pool-exhausted`);
 * - otherwise `tuneExposureControl` (its rounds on fresh persons, a sampling margin) and the tuned
 *   K are run once more on the first run's persons: `tuned`, with that run's largest exposure.
 * Every outcome is stored, so the newest row for a calibration and settings always says what live
 * attempts do (K = 1 everywhere is randomesque alone).
 *
 * @see Sympson, J. B., & Hetter, R. D. (1985). Controlling item-exposure rates in computerized
 *   adaptive testing. Proceedings of the 27th annual meeting of the Military Testing Association,
 *   973–977.
 */
import { randomUUID } from 'node:crypto';
import type { Kysely } from 'kysely';
import { AppError } from '../errors.js';
import { insertAuditEntry } from '../storage/audit-repository.js';
import type { Database } from '../storage/database.js';
import { type DbHandle, nowIso } from '../storage/db-handle.js';
import {
  type ExposureControlRecord,
  insertExposureControl,
  listStudyExposureControls,
} from '../storage/exposure-control-repository.js';
import { findStudyById } from '../storage/study-repository.js';
import { runInWorker } from '../workers/run-in-worker.js';
import type { AdaptiveBank } from './adaptive/adaptive-bank.js';
import { type AdaptiveSettings, stopRulesFor } from './adaptive/adaptive-settings.js';
import { type SimulationResult, simulateAdaptive } from './adaptive/simulate-adaptive.js';
import { type ExposureTuning, tuneExposureControl } from './adaptive/tune-exposure-control.js';
import {
  adaptiveSettingsOf,
  findLatestConvergedCalibration,
  loadAdaptiveDelivery,
} from './adaptive-delivery.js';
import { parseStudySettings } from './attempt-service.js';
import type { DeliveryBank } from './delivery-bank.js';
import {
  type ExposureControlSettings,
  exposureControlSettingsHash,
  exposureControlSettingsJson,
  exposureControlSettingsOf,
} from './stored-exposure-control.js';

export const exposureOutcomes = ['tuned', 'not-needed', 'floor-above-target'] as const;
export type ExposureOutcome = (typeof exposureOutcomes)[number];

/** Ability means of the simulated audiences (SD 1), as `plotgauge simulate adaptive`. INVENTED. */
export const exposureAudienceMeans = [-1, 0, 1] as const;

/**
 * The API's bounded work: persons per audience and the most tuning rounds, so at most 10
 * simulations of 300 persons (a few seconds on the 110-item bank, SE target 0.45, 5–30 items, on a
 * 2-core machine; 6.2 s when it was first measured on a busier one). It runs in a worker thread (`runInWorker`), so the server keeps answering
 * respondents meanwhile; the command line takes more persons.
 */
export const apiTuningBudget = { personsPerAudience: 100, rounds: 8 } as const;

/** What one tuning produced, ready to store. */
export interface TunedExposureControl {
  readonly outcome: ExposureOutcome;
  /** K per item id of the bank the tuning ran on. */
  readonly itemParameters: Record<string, number>;
  readonly targetMaxExposure: number;
  /** Largest exposure with the stored K (the randomesque run's when every K is 1). */
  readonly achievedMaxExposure: number;
  readonly simulation: {
    readonly seed: number;
    readonly personsPerAudience: number;
    readonly audienceMeans: readonly number[];
    readonly rounds: number;
    readonly randomesqueMaxExposure: number;
    readonly meanItems: number;
    readonly bankSize: number;
    /** Largest exposure of each tuning round; empty when not tuned. */
    readonly maxExposureByRound: readonly number[];
    readonly tunedFor: number | null;
    readonly bestRound: number | null;
  };
}

/**
 * The record of a simulation run (shared by the API and the command line, which prints as it goes).
 *
 * @param randomesque the run with randomesque selection alone.
 * @param tuned the tuning and the run with its K, or null when not tuned.
 */
export function tunedExposureControlOf(
  bank: AdaptiveBank,
  target: number,
  run: { seed: number; personsPerAudience: number; rounds: number },
  randomesque: SimulationResult,
  tuned: { tuning: ExposureTuning; evaluated: SimulationResult } | null,
): TunedExposureControl {
  const outcome: ExposureOutcome =
    tuned !== null ? 'tuned' : randomesque.maxExposure <= target ? 'not-needed' : 'floor-above-target';
  const itemParameters: Record<string, number> = {};
  bank.ids.forEach((id, i) => {
    itemParameters[id] = tuned === null ? 1 : tuned.tuning.exposureControl[i]!;
  });
  return {
    outcome,
    itemParameters,
    targetMaxExposure: target,
    achievedMaxExposure: tuned === null ? randomesque.maxExposure : tuned.evaluated.maxExposure,
    simulation: {
      seed: run.seed,
      personsPerAudience: run.personsPerAudience,
      audienceMeans: [...exposureAudienceMeans],
      rounds: run.rounds,
      randomesqueMaxExposure: randomesque.maxExposure,
      meanItems: randomesque.meanItems,
      bankSize: bank.ids.length,
      maxExposureByRound: tuned?.tuning.maxExposureByRound ?? [],
      tunedFor: tuned?.tuning.tunedFor ?? null,
      bestRound: tuned?.tuning.bestRound ?? null,
    },
  };
}

/**
 * Simulates and, when it can help, tunes K for a bank and its rules (pure; see the file comment).
 *
 * @param settings the stop rules without a time limit (its own exposureControl is ignored).
 * @throws when the target is not in (0, 1] or the budget is not positive integers.
 */
export function tuneExposureForBank(
  bank: AdaptiveBank,
  settings: AdaptiveSettings,
  options: { seed: number; target: number; personsPerAudience: number; rounds: number },
): TunedExposureControl {
  const { seed, target, personsPerAudience, rounds } = options;
  if (!(target > 0 && target <= 1)) throw new Error('tuneExposureForBank requires a target in (0, 1]');
  const audiences = exposureAudienceMeans.map((mean) => ({
    label: `mean ${mean}`,
    mean,
    sd: 1,
    persons: personsPerAudience,
  }));
  const input = {
    bank,
    audiences,
    settings: { ...settings, exposureControl: undefined },
    seed,
    compareFixed: false,
  };
  const randomesque = simulateAdaptive(input);
  const floor = randomesque.meanItems / bank.ids.length;
  let tuned: { tuning: ExposureTuning; evaluated: SimulationResult } | null = null;
  if (randomesque.maxExposure > target && floor < target) {
    const tuning = tuneExposureControl(input, { maxExposure: target, rounds });
    const evaluated = simulateAdaptive({
      ...input,
      settings: { ...input.settings, exposureControl: tuning.exposureControl },
    });
    tuned = { tuning, evaluated };
  }
  return tunedExposureControlOf(bank, target, { seed, personsPerAudience, rounds }, randomesque, tuned);
}

/**
 * Stores a tuned control for a study's calibration and settings and audits it
 * (`exposure-control.save`). Call inside a transaction.
 */
export async function saveExposureControl(
  db: DbHandle,
  input: {
    studyId: string;
    calibrationId: string;
    settings: ExposureControlSettings;
    tuned: TunedExposureControl;
  },
  actor: string,
): Promise<ExposureControlRecord & { outcome: ExposureOutcome }> {
  const { tuned } = input;
  const settingsJson = exposureControlSettingsJson(input.settings);
  const record = {
    id: randomUUID(),
    studyId: input.studyId,
    calibrationId: input.calibrationId,
    settings: JSON.parse(settingsJson) as Record<string, unknown>,
    settingsHash: exposureControlSettingsHash(input.settings),
    itemParameters: tuned.itemParameters,
    targetMaxExposure: tuned.targetMaxExposure,
    achievedMaxExposure: tuned.achievedMaxExposure,
    simulation: { outcome: tuned.outcome, ...tuned.simulation },
    createdAt: nowIso(),
    createdBy: actor,
  };
  await insertExposureControl(db, { ...record, settingsJson });
  const values = Object.values(tuned.itemParameters);
  await insertAuditEntry(db, {
    id: randomUUID(),
    at: record.createdAt,
    actor,
    action: 'exposure-control.save',
    subject: input.studyId,
    details: {
      exposureControlId: record.id,
      calibrationId: input.calibrationId,
      outcome: tuned.outcome,
      targetMaxExposure: tuned.targetMaxExposure,
      achievedMaxExposure: tuned.achievedMaxExposure,
      itemsBelowOne: values.filter((k) => k < 1).length,
      items: values.length,
    },
  });
  return { ...record, outcome: tuned.outcome };
}

/**
 * Tunes a stored study's control on its latest converged calibration within the API's budget and
 * stores it.
 *
 * @throws AppError STUDY_NOT_FOUND; CALIBRATION_NEEDED without a converged calibration;
 *   ADAPTIVE_NEEDS_CALIBRATION when the calibration places none of the pool's items; CONFLICT
 *   when the area targets name no area with items.
 */
export async function tuneStudyExposureControl(
  db: Kysely<Database>,
  bank: DeliveryBank,
  studyId: string,
  options: { seed: number; target: number },
  actor: string,
): Promise<ExposureControlRecord & { outcome: ExposureOutcome }> {
  const study = await findStudyById(db, studyId);
  if (study === undefined) {
    throw new AppError('STUDY_NOT_FOUND', `No study "${studyId}".`, { field: 'params.studyId' });
  }
  if ((await findLatestConvergedCalibration(db, studyId)) === undefined) {
    throw new AppError(
      'CALIBRATION_NEEDED',
      `Study "${studyId}" has no converged calibration to tune exposure control on; calibrate it first (plotgauge calibrate --study ${studyId}).`,
      { field: 'params.studyId' },
    );
  }
  const settings = parseStudySettings(study);
  const delivery = await loadAdaptiveDelivery(db, bank, studyId, settings);
  // In a worker thread: the simulation takes seconds, and respondents keep answering meanwhile.
  const tuned = await runInWorker<TunedExposureControl>(import.meta.url, 'tuneExposureForBank', [
    delivery.bank,
    { ...delivery.rules, timeLimitSeconds: undefined },
    { seed: options.seed, target: options.target, ...apiTuningBudget },
  ]);
  return db.transaction().execute((trx) =>
    saveExposureControl(
      trx,
      {
        studyId,
        calibrationId: delivery.calibrationId,
        settings: exposureControlSettingsOf(delivery.adaptive, delivery.rules),
        tuned,
      },
      actor,
    ),
  );
}

/**
 * A study's stored controls, newest first, and the id of the one a new attempt would start with
 * now (tuned on the latest converged calibration for the study's current adaptive settings), or
 * null: randomesque only.
 *
 * @throws AppError STUDY_NOT_FOUND.
 */
export async function studyExposureControls(
  db: DbHandle,
  studyId: string,
): Promise<{ inUse: string | null; controls: ExposureControlRecord[] }> {
  const study = await findStudyById(db, studyId);
  if (study === undefined) {
    throw new AppError('STUDY_NOT_FOUND', `No study "${studyId}".`, { field: 'params.studyId' });
  }
  const controls = await listStudyExposureControls(db, studyId);
  const calibration = await findLatestConvergedCalibration(db, studyId);
  if (calibration === undefined) return { inUse: null, controls };
  const settings = parseStudySettings(study);
  const adaptive = adaptiveSettingsOf(settings);
  const hash = exposureControlSettingsHash(
    exposureControlSettingsOf(adaptive, stopRulesFor(adaptive, settings)),
  );
  const inUse = controls.find((c) => c.calibrationId === calibration.id && c.settingsHash === hash);
  return { inUse: inUse?.id ?? null, controls };
}
