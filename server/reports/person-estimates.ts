import { estimateAbilityPcm } from '../scoring/rasch/estimate-ability-pcm.js';
import { estimateAbilityWle } from '../scoring/rasch/estimate-ability-wle.js';
import { MISSING, type ResponseMatrix } from '../scoring/response-matrix.js';

/** One person's ability on the calibration's scale. */
export interface PersonEstimate {
  readonly personId: string;
  /** WLE θ̂ in logits; finite also for zero and perfect scores. */
  readonly ability: number;
  readonly standardError: number;
  /** Calibrated items the person answered, and how many correctly. */
  readonly answered: number;
  readonly rawScore: number;
}

/**
 * Warm's WLE of every person of a matrix with item difficulties held at calibrated values. Persons
 * with no answered calibrated item get no estimate (left out). WLE is chosen over the MLE because
 * it is finite for zero and perfect scores, so every respondent can be placed on the person-item map.
 *
 * @see Warm, T. A. (1989). Weighted likelihood estimation of ability in item response theory.
 *   Psychometrika 54(3), 427-450.
 * @param matrix responses (0/1, MISSING)
 * @param difficulties b of each matrix column; NaN marks an item without a calibrated difficulty
 * @param steps partial credit steps of each column scored 0-1-2 (undefined for right/wrong columns):
 *   a person who answered such an item is estimated by the partial credit WLE (estimateAbilityPcm,
 *   which equals the Rasch WLE on right/wrong items)
 * @returns the estimates of persons with at least one calibrated answer, in matrix order
 * @example
 * personEstimates({ personIds: ['a'], itemIds: ['x', 'y'], scores: Uint8Array.of(1, 0) },
 *   Float64Array.of(0, 0))[0].ability; // 0 (one right, one wrong on two equal items)
 */
export function personEstimates(
  matrix: ResponseMatrix,
  difficulties: Float64Array,
  steps?: readonly (readonly number[] | undefined)[],
): PersonEstimate[] {
  const itemCount = matrix.itemIds.length;
  if (difficulties.length !== itemCount) throw new Error('personEstimates requires one difficulty per item');
  const out: PersonEstimate[] = [];
  const answeredDifficulties = new Float64Array(itemCount);
  matrix.personIds.forEach((personId, p) => {
    let answered = 0;
    let rawScore = 0;
    let partialCredit = false;
    const itemSteps: (readonly number[])[] = [];
    const itemScores: number[] = [];
    for (let i = 0; i < itemCount; i++) {
      const x = matrix.scores[p * itemCount + i]!;
      const b = difficulties[i]!;
      if (x === MISSING || Number.isNaN(b)) continue;
      answeredDifficulties[answered++] = b;
      rawScore += x;
      const own = steps?.[i];
      if (own !== undefined) partialCredit = true;
      itemSteps.push(own ?? [b]);
      itemScores.push(x);
    }
    if (answered === 0) return;
    const estimate = partialCredit
      ? (estimateAbilityPcm(itemSteps, itemScores) as { estimate: number; standardError: number })
      : estimateAbilityWle(answeredDifficulties.slice(0, answered), rawScore);
    out.push({
      personId,
      ability: estimate.estimate,
      standardError: estimate.standardError,
      answered,
      rawScore,
    });
  });
  return out;
}
