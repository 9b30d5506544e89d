/**
 * The arithmetic of a study calibration, without the database: the Rasch fit by MML with the
 * cohorts as groups (or the partial credit fit when rubric items are present), item fit with every
 * person at the WLE, and the bootstrap of the cohorts' ability distributions with the items held
 * fixed. `calibrateStudy` (calibrate-study.ts) reads the answers, calls this (in a worker thread for
 * large studies, so respondents keep being answered meanwhile) and stores the result.
 *
 * Pure: the input and the result cross a worker boundary by structured clone (typed arrays, Maps,
 * plain objects).
 */
import { calibrateMml, type MmlGroupEstimate } from '../scoring/rasch/calibrate-mml.js';
import { computeFitStatistics } from '../scoring/rasch/fit-statistics.js';
import { pcmItemFit } from '../scoring/rasch/pcm-item-fit.js';
import type { ResponseMatrix } from '../scoring/response-matrix.js';
import { bootstrapAbilityDistributions } from './bootstrap-ability-distributions.js';
import { fitPartialCreditStudy } from './partial-credit-study-fit.js';
import { personEstimates } from './person-estimates.js';

export interface StudyFitInput {
  readonly matrix: ResponseMatrix;
  readonly groups: { readonly index: Int32Array; readonly labels: readonly string[] };
  /** Item ids with rubric scores: when any, every item is fitted by the partial credit model. */
  readonly rubricItems: ReadonlySet<string>;
  /** Item id -> fixed difficulty (an anchored calibration; right/wrong items only). */
  readonly anchors?: ReadonlyMap<string, number> | undefined;
  readonly quadraturePoints: number;
  readonly maxIterations: number;
  /** Bootstrap replicates (0: none) and their seed. */
  readonly replicates: number;
  readonly seed: number;
}

/** What the fit found, or why the design cannot be fitted at all (`ok: false`). */
export type StudyFit =
  | { readonly ok: false; readonly message: string }
  | {
      readonly ok: true;
      readonly itemIds: readonly string[];
      readonly difficulty: Float64Array;
      readonly standardError: Float64Array;
      readonly groups: readonly MmlGroupEstimate[];
      readonly converged: boolean;
      readonly iterations: number;
      readonly logLikelihood: number;
      readonly excludedItems: readonly { readonly id: string; readonly reason: string }[];
      /** Partial credit steps and their SEs of rubric items (absent without rubric items). */
      readonly partialCredit?: {
        readonly steps: ReadonlyMap<string, readonly number[]>;
        readonly stepStandardErrors: ReadonlyMap<string, readonly number[]>;
      };
      /** Infit and outfit mean-squares by matrix column (NaN where undefined). */
      readonly infit: Float64Array;
      readonly outfit: Float64Array;
      /** draws[r][g] = [mean, sd] of group g in bootstrap replicate r. */
      readonly draws: readonly (readonly [number, number])[][];
    };

function round6(value: number): number {
  return Math.round(value * 1e6) / 1e6;
}

/**
 * Fits a study's answers (see the module comment).
 *
 * @returns the fit, or `{ ok: false, message }` when the model cannot be fitted to the design (the
 *   caller answers CALIBRATION_NOT_CONVERGED with the message).
 */
export function fitStudyCalibration(input: StudyFitInput): StudyFit {
  const { matrix, groups, rubricItems, anchors, quadraturePoints, maxIterations } = input;
  let fit: Pick<
    ReturnType<typeof calibrateMml>,
    'itemIds' | 'difficulty' | 'standardError' | 'groups' | 'converged' | 'iterations' | 'logLikelihood'
  > & { readonly excludedItems: readonly { readonly id: string; readonly reason: string }[] };
  let partialCredit: ReturnType<typeof fitPartialCreditStudy> | undefined;
  try {
    if (rubricItems.size > 0) {
      partialCredit = fitPartialCreditStudy(matrix, rubricItems, groups, { quadraturePoints, maxIterations });
      fit = partialCredit;
    } else {
      fit = calibrateMml(matrix, {
        groups,
        quadraturePoints,
        maxIterations,
        ...(anchors ? { anchors } : {}),
      });
    }
  } catch (error) {
    return { ok: false, message: (error as Error).message };
  }

  // Fit statistics with every person at the WLE given the calibrated difficulties.
  const difficultyOf = new Map(fit.itemIds.map((id, i) => [id, fit.difficulty[i]!]));
  const columnDifficulties = Float64Array.from(matrix.itemIds, (id) => difficultyOf.get(id) ?? Number.NaN);
  const stepsOf = partialCredit?.steps;
  const columnSteps = stepsOf ? matrix.itemIds.map((id) => stepsOf.get(id)) : undefined;
  const persons = personEstimates(matrix, columnDifficulties, columnSteps);
  const abilities = new Float64Array(matrix.personIds.length).fill(Number.NaN);
  const rowOf = new Map(matrix.personIds.map((id, p) => [id, p]));
  for (const person of persons) abilities[rowOf.get(person.personId)!] = person.ability;
  // Rasch mean-squares for right/wrong items (rubric columns skipped as NaN); partial credit
  // mean-squares for rubric items.
  const fitDifficulties = Float64Array.from(matrix.itemIds, (id, c) =>
    stepsOf?.has(id) ? Number.NaN : columnDifficulties[c]!,
  );
  const itemFit = computeFitStatistics(matrix, fitDifficulties, abilities).items;
  const infit = Float64Array.from(itemFit.infit);
  const outfit = Float64Array.from(itemFit.outfit);
  if (columnSteps) {
    const rubricFit = pcmItemFit(matrix, columnSteps, abilities);
    columnSteps.forEach((steps, c) => {
      if (steps === undefined) return;
      infit[c] = rubricFit.infit[c]!;
      outfit[c] = rubricFit.outfit[c]!;
    });
  }

  const draws =
    fit.converged && input.replicates > 0
      ? bootstrapAbilityDistributions(matrix, partialCredit?.dichotomous ?? difficultyOf, groups, {
          replicates: input.replicates,
          seed: input.seed,
        }).map((replicate) => replicate.map((g) => [round6(g.mean), round6(g.sd)] as [number, number]))
      : [];

  return {
    ok: true,
    itemIds: fit.itemIds,
    difficulty: Float64Array.from(fit.difficulty),
    standardError: Float64Array.from(fit.standardError),
    groups: fit.groups.map((g) => ({ ...g })),
    converged: fit.converged,
    iterations: fit.iterations,
    logLikelihood: fit.logLikelihood,
    excludedItems: fit.excludedItems.map((e) => ({ id: e.id, reason: e.reason })),
    ...(partialCredit
      ? {
          partialCredit: { steps: partialCredit.steps, stepStandardErrors: partialCredit.stepStandardErrors },
        }
      : {}),
    infit,
    outfit,
    draws,
  };
}
