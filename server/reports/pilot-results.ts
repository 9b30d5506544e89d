/**
 * A pilot item's result: its difficulty on the bank's scale, calibrated by MML with every bank
 * item anchored at its calibrated difficulty (so the pilot cannot move the scale or any
 * respondent's estimate), and the share of each cohort likely to read it.
 *
 * "Likely to read" uses the RP67 convention: a person reads the item when their probability of a
 * right answer is at least 0.67, i.e. θ ≥ b + ln(0.67/0.33). With a cohort's ability N(μ, σ²) the
 * share is 1 − Φ((b + ln(0.67/0.33) − μ)/σ); its interval comes from the calibration's bootstrap
 * replicates of (μ, σ) with the pilot's difficulty drawn within its SE.
 *
 * @see Bock, R. D., & Aitkin, M. (1981). Marginal maximum likelihood estimation of item
 *   parameters: application of an EM algorithm. Psychometrika 46, 443–459 (MML; anchoring by
 *   fixing item parameters: common practice, no source).
 * @see Kolstad, A. (1996). The response probability convention embedded in reporting prose
 *   literacy levels from the 1992 National Adult Literacy Survey (RP80 vs RP67; from memory).
 */

import { calibrateMml } from '../scoring/rasch/calibrate-mml.js';
import { MISSING, type ResponseMatrix } from '../scoring/response-matrix.js';
import { seededRandom } from '../scoring/seeded-random.js';
import { standardNormalCdf } from '../scoring/statistics/standard-normal-cdf.js';
import { percentileInterval } from './percentile-interval.js';

/** RP67: the response probability at which an item counts as "read". */
export const pilotResponseProbability = 0.67;

/** A pilot's calibration on the bank's scale. */
export interface PilotCalibration {
  readonly pilotId: string;
  readonly difficulty: number;
  readonly standardError: number;
  /** Scored answers to the pilot used. */
  readonly responses: number;
  readonly converged: boolean;
  readonly iterations: number;
}

/**
 * Calibrates one pilot item by MML with every other item of the matrix anchored.
 *
 * @param matrix scores of bank items and the pilot (MISSING where not presented).
 * @param pilotId the pilot's column.
 * @param anchors bank item id → calibrated difficulty; must cover every other column.
 * @param options groups of the persons (cohorts), quadrature points, maxIterations, tolerance.
 * @returns the pilot's difficulty and SE, answers used, convergence.
 * @throws when the pilot is not a column, a bank column has no anchor, or the pilot has no answers.
 * @example
 * calibratePilot(matrix, 'pilot-1', anchors).difficulty; // ≈ the generating 0.8 (see the test)
 */
export function calibratePilot(
  matrix: ResponseMatrix,
  pilotId: string,
  anchors: ReadonlyMap<string, number>,
  options: {
    readonly groups?: { readonly index: Int32Array; readonly labels: readonly string[] };
    readonly quadraturePoints?: number;
    readonly maxIterations?: number;
    readonly tolerance?: number;
  } = {},
): PilotCalibration {
  const column = matrix.itemIds.indexOf(pilotId);
  if (column < 0) throw new Error(`calibratePilot requires ${pilotId} to be an item of the matrix`);
  for (const id of matrix.itemIds) {
    if (id !== pilotId && !anchors.has(id)) throw new Error(`calibratePilot requires an anchor for ${id}`);
  }
  let responses = 0;
  const n = matrix.itemIds.length;
  for (let p = 0; p < matrix.personIds.length; p++)
    if (matrix.scores[p * n + column] !== MISSING) responses++;
  if (responses === 0) throw new Error('calibratePilot requires at least one answer to the pilot');
  const fit = calibrateMml(matrix, { ...options, anchors });
  const i = fit.itemIds.indexOf(pilotId);
  return {
    pilotId,
    difficulty: fit.difficulty[i]!,
    standardError: fit.standardError[i]!,
    responses,
    converged: fit.converged,
    iterations: fit.iterations,
  };
}

/**
 * Share of a cohort N(mean, sd²) whose probability of a right answer is at least `rp`.
 *
 * @example
 * shareLikelyToRead(0, 0, 1); // 1 − Φ(ln(0.67/0.33)) = 0.23942
 */
export function shareLikelyToRead(
  difficulty: number,
  mean: number,
  sd: number,
  rp = pilotResponseProbability,
): number {
  if (!(sd > 0) || !(rp > 0 && rp < 1)) throw new Error('shareLikelyToRead requires sd > 0 and 0 < rp < 1');
  const location = difficulty + Math.log(rp / (1 - rp));
  return 1 - standardNormalCdf((location - mean) / sd);
}

/** One cohort's share with its 95% interval. */
export interface PilotCohortShare {
  readonly cohortId: string;
  readonly share: number;
  readonly interval: readonly [number, number] | null;
}

/**
 * Shares of each cohort likely to read the pilot, with percentile intervals over the stored
 * bootstrap replicates of the cohort distributions (the pilot's difficulty drawn N(b, SE²) in each
 * replicate, seeded).
 *
 * @param draws draws[r][g] = [mean, sd] of cohort g in replicate r (as calibrate-study stores them).
 */
export function pilotCohortShares(
  pilot: Pick<PilotCalibration, 'difficulty' | 'standardError'>,
  groups: readonly { readonly cohortId: string; readonly mean: number; readonly sd: number }[],
  draws: readonly (readonly (readonly [number, number])[])[],
  seed = 1,
): PilotCohortShare[] {
  const random = seededRandom(seed);
  const bs = draws.map(() => pilot.difficulty + pilot.standardError * random.normal());
  return groups.map((group, g) => {
    const replicates = draws
      .map((draw, r) => {
        const d = draw[g];
        return d && d[1] > 0 ? shareLikelyToRead(bs[r]!, d[0], d[1]) : Number.NaN;
      })
      .filter(Number.isFinite);
    return {
      cohortId: group.cohortId,
      share: shareLikelyToRead(pilot.difficulty, group.mean, group.sd),
      interval: replicates.length >= 20 ? percentileInterval(replicates, 0.95) : null,
    };
  });
}

/** How many more answers a pilot needs before it is calibrated (0 when it has enough). */
export function pilotResponsesNeeded(answers: number, minResponses: number): number {
  return Math.max(0, minResponses - answers);
}
