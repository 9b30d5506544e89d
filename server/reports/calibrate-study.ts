/**
 * Calibrates a study: loads its scored responses, fits the Rasch model by MML with the cohorts as
 * groups, measures item fit with persons at their WLE, bootstraps the cohorts' ability distributions
 * with the items held fixed, and stores it all as one calibration.
 *
 * Identification: a free calibration fixes the first cohort's (oldest with responses) mean at 0;
 * every other cohort's mean is its distance from that cohort, in logits. With `anchorTo` (the id of an
 * earlier calibration) the items both share keep their earlier difficulties and every cohort mean is
 * free: the new calibration is then on the earlier one's scale (linking). Free is the default because
 * recalibrating the same study with more answers should improve, not freeze, the earlier values.
 *
 * Minimums (settings with these defaults, stated in every report): at least 30 respondents who
 * finished their attempt, and at least 10 scored answers for an item to be calibrated. Items with
 * fewer answers are listed as not yet calibrated (with how many more they need), never silently
 * dropped; so are items everyone answered right (or wrong), whose difficulty no data can place.
 *
 * The group estimates and the bootstrap replicates are kept in the calibration's settings JSON (so a
 * report reads one stored source and never recomputes a random number).
 *
 * Rubric items: when some answers carry rubric scores (0, 1, 2), every item is calibrated under the
 * partial credit model instead (see partial-credit-study-fit.ts): the scale's origin is then the mean
 * item location, each rubric item's difficulty is its location (mean of its two steps) and its steps
 * are kept in `settings.partialCredit`; persons are estimated with those steps. Without rubric scores
 * nothing changes.
 */
import { randomUUID } from 'node:crypto';
import { AppError } from '../errors.js';
import {
  type CalibrationItemRecord,
  type CalibrationRecord,
  findCalibrationById,
  insertCalibration,
  listCalibrationItems,
  listScoredResponses,
} from '../storage/calibration-repository.js';
import { listCohorts } from '../storage/cohort-repository.js';
import { type DbHandle, nowIso } from '../storage/db-handle.js';
import { listRubricScoredItemIds } from '../storage/rubric-score-repository.js';
import { findStudyById } from '../storage/study-repository.js';
import { runInWorker } from '../workers/run-in-worker.js';
import { fitStudyCalibration, type StudyFit, type StudyFitInput } from './fit-study-calibration.js';
import { studyResponseMatrix } from './study-response-matrix.js';

/** The module `runInWorker` loads for a large study's fit. */
const fitModule = new URL('./fit-study-calibration.ts', import.meta.url).href;

/**
 * Scored answers from which a study is fitted in a worker thread (the demo's 6,240 answers take
 * about 2 s of arithmetic; 2,000 about half a second, more than a worker's start).
 */
export const workerThreshold = 2000;

export interface CalibrateStudyOptions {
  /** Respondents with a finished attempt needed to calibrate (default 30). */
  readonly minRespondents?: number;
  /** Scored answers an item needs to be calibrated (default 10). */
  readonly minAnswersPerItem?: number;
  /** Bootstrap replicates for the report's intervals (default 200; 0 leaves intervals out). */
  readonly replicates?: number;
  /** Seed of the bootstrap (default 1). */
  readonly seed?: number;
  /** Id of an earlier calibration whose item difficulties anchor this one. */
  readonly anchorTo?: string;
  /** MML iterations at most (default 200); tests force non-convergence with 1. */
  readonly maxIterations?: number;
  /** Gauss–Hermite points of the MML fit (default 41). */
  readonly quadraturePoints?: number;
  /** Fit in a worker thread (default: from `workerThreshold` scored answers on). */
  readonly inWorker?: boolean;
}

export const defaultCalibrationSettings = {
  minRespondents: 30,
  minAnswersPerItem: 10,
  replicates: 200,
  seed: 1,
  quadraturePoints: 41,
} as const;

/** One cohort's estimated ability distribution (logits) as stored. */
export interface StoredGroup {
  readonly cohortId: string;
  readonly label: string;
  readonly mean: number;
  readonly sd: number;
  readonly meanStandardError: number;
  readonly sdStandardError: number;
  readonly persons: number;
}

/** An item the calibration could not place, and why. */
export interface UncalibratedItem {
  readonly itemId: string;
  readonly answers: number;
  readonly reason:
    | 'too-few-answers'
    | 'all-correct'
    | 'all-wrong'
    | 'constant-in-every-score-group'
    | 'unobserved-category';
  /** More scored answers needed (too-few-answers only). */
  readonly moreNeeded: number;
}

/** What a calibration stores in its settings JSON. */
export interface StoredCalibrationSettings {
  /** `mean-item-location`: a partial credit calibration (rubric items present), origin = mean item location. */
  readonly identification: 'first-cohort-mean' | 'anchored' | 'mean-item-location';
  readonly anchoredFrom: string | null;
  readonly quadraturePoints: number;
  readonly maxIterations: number;
  readonly minRespondents: number;
  readonly minAnswersPerItem: number;
  readonly groups: readonly StoredGroup[];
  readonly uncalibrated: readonly UncalibratedItem[];
  /** Present when rubric items were calibrated: their steps (logits) under the partial credit model. */
  readonly partialCredit?: {
    readonly items: readonly StoredRubricItem[];
  };
  readonly bootstrap: {
    readonly replicates: number;
    readonly seed: number;
    /** draws[r][g] = [mean, sd] of group g in replicate r (groups in `groups` order). */
    readonly draws: readonly (readonly (readonly [number, number])[])[];
  };
}

/** One rubric item's partial credit steps as stored (δ_1, δ_2; location = their mean = its difficulty). */
export interface StoredRubricItem {
  readonly itemId: string;
  readonly steps: readonly number[];
  readonly stepStandardErrors: readonly number[];
}

/** The partial credit steps of a calibration's rubric items by item id (empty for right/wrong only). */
export function storedRubricSteps(settings: StoredCalibrationSettings): Map<string, readonly number[]> {
  return new Map((settings.partialCredit?.items ?? []).map((item) => [item.itemId, item.steps]));
}

/** A calibration as the report reads it. */
export interface StudyCalibration {
  readonly record: CalibrationRecord;
  readonly settings: StoredCalibrationSettings;
  readonly items: readonly CalibrationItemRecord[];
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/**
 * Calibrates a study and stores the calibration (also when it did not converge: then it is flagged
 * and reports refuse it).
 *
 * @throws AppError STUDY_NOT_FOUND; TOO_FEW_RESPONSES saying how many more respondents or answers are
 *   needed; CALIBRATION_NOT_CONVERGED when the design cannot be fitted at all (nothing stored).
 */
export async function calibrateStudy(
  db: DbHandle,
  studyId: string,
  options: CalibrateStudyOptions = {},
): Promise<StudyCalibration> {
  const minRespondents = options.minRespondents ?? defaultCalibrationSettings.minRespondents;
  const minAnswers = options.minAnswersPerItem ?? defaultCalibrationSettings.minAnswersPerItem;
  const replicates = options.replicates ?? defaultCalibrationSettings.replicates;
  const seed = options.seed ?? defaultCalibrationSettings.seed;
  const quadraturePoints = options.quadraturePoints ?? defaultCalibrationSettings.quadraturePoints;
  const maxIterations = options.maxIterations ?? 200;

  const study = await findStudyById(db, studyId);
  if (!study) throw new AppError('STUDY_NOT_FOUND', `There is no study ${studyId}.`, { studyId });
  const cohorts = await listCohorts(db, studyId);
  const responses = await listScoredResponses(db, studyId);
  const needs = `A calibration needs at least ${minRespondents} respondents who finished, and at least ${minAnswers} answers to an item before that item is calibrated.`;
  if (responses.length === 0) {
    throw new AppError('TOO_FEW_RESPONSES', `Study "${study.title}" has no scored responses yet. ${needs}`, {
      respondentsFinished: 0,
      respondentsNeeded: minRespondents,
      minAnswersPerItem: minAnswers,
    });
  }
  const finishedAttempts = new Set(
    responses.filter((r) => r.attemptStatus === 'finished').map((r) => r.attemptId),
  ).size;
  if (finishedAttempts < minRespondents) {
    const more = minRespondents - finishedAttempts;
    throw new AppError(
      'TOO_FEW_RESPONSES',
      `Study "${study.title}" has ${plural(finishedAttempts, 'respondent')} who finished; ${more} more ${more === 1 ? 'is' : 'are'} needed. ${needs}`,
      { respondentsFinished: finishedAttempts, respondentsNeeded: minRespondents, moreNeeded: more },
    );
  }

  const answerCount = new Map<string, number>();
  const newestVersion = new Map<string, number>();
  for (const r of responses) {
    answerCount.set(r.itemId, (answerCount.get(r.itemId) ?? 0) + 1);
    newestVersion.set(r.itemId, Math.max(newestVersion.get(r.itemId) ?? 0, r.itemVersion));
  }
  const uncalibrated: UncalibratedItem[] = [];
  for (const [itemId, answers] of [...answerCount].sort(([a], [b]) => (a < b ? -1 : 1))) {
    if (answers < minAnswers)
      uncalibrated.push({ itemId, answers, reason: 'too-few-answers', moreNeeded: minAnswers - answers });
  }
  const tooFew = new Set(uncalibrated.map((u) => u.itemId));
  if (tooFew.size === answerCount.size) {
    throw new AppError(
      'TOO_FEW_RESPONSES',
      `No item of study "${study.title}" has ${minAnswers} answers yet (the most answered has ${Math.max(...answerCount.values())}). ${needs}`,
      { minAnswersPerItem: minAnswers, items: uncalibrated },
    );
  }

  const { matrix, cohortOfPerson } = studyResponseMatrix(responses, (id) => !tooFew.has(id));
  const present = cohorts.filter((c) => cohortOfPerson.includes(c.id));
  const groupOf = new Map(present.map((c, g) => [c.id, g]));
  const groups = {
    index: Int32Array.from(cohortOfPerson, (id) => groupOf.get(id)!),
    labels: present.map((c) => c.id),
  };

  const rubricScored = new Set(await listRubricScoredItemIds(db, studyId));
  const rubricItems = new Set(matrix.itemIds.filter((id) => rubricScored.has(id)));
  if (rubricItems.size > 0 && options.anchorTo !== undefined)
    throw new AppError(
      'CONFLICT',
      `Study "${study.title}" has rubric-scored items; anchoring to an earlier calibration is not available for partial credit calibrations yet. Calibrate without anchoring.`,
      { field: 'anchorTo' },
    );

  let anchors: Map<string, number> | undefined;
  if (options.anchorTo !== undefined) {
    const earlier = await findCalibrationById(db, options.anchorTo);
    if (!earlier || earlier.studyId !== studyId)
      throw new AppError('CONFLICT', `Calibration ${options.anchorTo} is not a calibration of this study.`);
    const known = new Set(matrix.itemIds);
    anchors = new Map(
      (await listCalibrationItems(db, earlier.id))
        .filter((item) => known.has(item.itemId))
        .map((item) => [item.itemId, item.difficulty]),
    );
    if (anchors.size === 0)
      throw new AppError(
        'CONFLICT',
        `Calibration ${options.anchorTo} shares no item with this study's answers.`,
      );
  }

  const input: StudyFitInput = {
    matrix,
    groups,
    rubricItems,
    anchors,
    quadraturePoints,
    maxIterations,
    replicates,
    seed,
  };
  // Seconds of arithmetic for a large study: in a worker thread, so the server keeps answering
  // respondents meanwhile (a report opened during a live session recalibrates). Small studies are
  // fitted here: starting a worker costs more than their fit.
  const inWorker = options.inWorker ?? responses.length >= workerThreshold;
  const fit = inWorker
    ? await runInWorker<StudyFit>(fitModule, 'fitStudyCalibration', [input])
    : fitStudyCalibration(input);
  if (!fit.ok) {
    throw new AppError(
      'CALIBRATION_NOT_CONVERGED',
      `The answers of study "${study.title}" cannot be calibrated yet (${fit.message}). More respondents, or items shared between booklets, usually fix this.`,
    );
  }
  for (const excluded of fit.excludedItems) {
    uncalibrated.push({
      itemId: excluded.id,
      answers: answerCount.get(excluded.id) ?? 0,
      reason:
        excluded.reason === 'no-responses'
          ? 'too-few-answers'
          : (excluded.reason as Exclude<UncalibratedItem['reason'], 'too-few-answers'>),
      moreNeeded: 0,
    });
  }
  const partialCredit = fit.partialCredit;
  const columnOf = new Map(matrix.itemIds.map((id, c) => [id, c]));
  const finite = (value: number) => (Number.isFinite(value) ? value : null);

  const items: CalibrationItemRecord[] = fit.itemIds.map((itemId, i) => {
    const column = columnOf.get(itemId)!;
    return {
      itemId,
      itemVersion: newestVersion.get(itemId) ?? 1,
      difficulty: fit.difficulty[i]!,
      standardError: anchors?.has(itemId) ? null : finite(fit.standardError[i]!),
      infit: finite(fit.infit[column]!),
      outfit: finite(fit.outfit[column]!),
      anchored: anchors?.has(itemId) ?? false,
    };
  });
  const draws = fit.draws;

  const labelOf = new Map(cohorts.map((c) => [c.id, c.label]));
  const settings: StoredCalibrationSettings = {
    identification: partialCredit ? 'mean-item-location' : anchors ? 'anchored' : 'first-cohort-mean',
    anchoredFrom: options.anchorTo ?? null,
    quadraturePoints,
    maxIterations,
    minRespondents,
    minAnswersPerItem: minAnswers,
    groups: fit.groups.map((g) => ({
      cohortId: g.label,
      label: labelOf.get(g.label) ?? g.label,
      mean: g.mean,
      sd: g.sd,
      meanStandardError: g.meanStandardError,
      sdStandardError: g.sdStandardError,
      persons: g.persons,
    })),
    uncalibrated,
    ...(partialCredit
      ? {
          partialCredit: {
            items: [...partialCredit.steps].map(([itemId, steps]) => ({
              itemId,
              steps: steps.map(round6),
              stepStandardErrors: (partialCredit.stepStandardErrors.get(itemId) ?? []).map(round6),
            })),
          },
        }
      : {}),
    bootstrap: { replicates: draws.length, seed, draws },
  };
  const record: CalibrationRecord = {
    id: `cal-${randomUUID()}`,
    studyId,
    method: partialCredit ? 'cml' : 'mml',
    settings,
    converged: fit.converged,
    iterations: fit.iterations,
    logLikelihood: fit.logLikelihood,
    responseCount: responses.length,
    responsesUntil: responses.reduce<string | null>(
      (m, r) => (m === null || r.receivedAt > m ? r.receivedAt : m),
      null,
    ),
    createdAt: nowIso(),
  };
  if (db.isTransaction) await insertCalibration(db, record, items);
  else await db.transaction().execute((trx) => insertCalibration(trx, record, items));
  return { record, settings, items };
}

function round6(value: number): number {
  return Math.round(value * 1e6) / 1e6;
}

/** Reads a stored calibration with its items. */
export async function loadStudyCalibration(
  db: DbHandle,
  record: CalibrationRecord,
): Promise<StudyCalibration> {
  return {
    record,
    settings: record.settings as StoredCalibrationSettings,
    items: await listCalibrationItems(db, record.id),
  };
}
