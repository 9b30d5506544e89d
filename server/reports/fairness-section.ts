/**
 * The report's "Fairness" section: a DIF screen between two groups of respondents (two answers to a
 * background question, or two cohorts), the B and C items explained in words, and the group
 * comparison made again without the flagged items. Pure: no database.
 */
import { FOCAL_GROUP, REFERENCE_GROUP } from '../scoring/dif/score-strata.js';
import { keepColumns, MISSING, type ResponseMatrix } from '../scoring/response-matrix.js';
import { difReport } from './dif-report.js';
import { personEstimates } from './person-estimates.js';

/** How the two groups are formed. */
export type FairnessGrouping =
  | {
      readonly kind: 'background';
      readonly questionId: string;
      /** Option id of the reference group's answer. */
      readonly reference: string;
      /** Option id of the focal group's answer. */
      readonly focal: string;
    }
  | { readonly kind: 'cohorts'; readonly reference: string; readonly focal: string };

export interface FairnessItem {
  readonly itemId: string;
  /**
   * 'A', 'B+', 'B-', 'C+', 'C-', or null when D-DIF cannot be estimated or a group gave the item fewer
   * than {@link minAnswersPerGroupToClass} answers.
   */
  readonly etsClass: string | null;
  /** Answers to the item in the reference and the focal group. */
  readonly referenceAnswers: number;
  readonly focalAnswers: number;
  readonly flagged: boolean;
  /** MH D-DIF = −2.35 ln α_MH; negative: harder for the focal group. Null without an estimate. */
  readonly dDif: number | null;
  readonly dDifStandardError: number | null;
  /** Continuity-corrected MH χ² and its p-value; null when no stratum held both groups. */
  readonly chiSquared: number | null;
  readonly pValue: number | null;
  /** Score strata that held both groups (the others were skipped). */
  readonly strataUsed: number;
  /** Focal minus reference Rasch difficulty after alignment; null when not estimable in a group. */
  readonly raschContrast: number | null;
  readonly raschStandardError: number | null;
  readonly explanation: string | null;
}

/** Mean ability (WLE on the calibration's scale) of each group and the difference focal − reference. */
export interface FairnessComparison {
  readonly itemCount: number;
  readonly referenceMean: number;
  readonly focalMean: number;
  readonly difference: number;
}

export interface FairnessSection {
  readonly grouping: FairnessGrouping;
  readonly referenceLabel: string;
  readonly focalLabel: string;
  readonly referencePersons: number;
  readonly focalPersons: number;
  readonly items: readonly FairnessItem[];
  readonly flaggedItemIds: readonly string[];
  /** The comparison on every calibrated item, and again with the flagged items left out. */
  readonly comparison: {
    readonly allItems: FairnessComparison;
    /** Null when nothing was flagged (the comparison would be the same) or too few items remain. */
    readonly flaggedExcluded: FairnessComparison | null;
  };
  readonly method: string;
  readonly smallStrata: string;
  readonly sentence: string;
}

export interface FairnessInput {
  readonly grouping: FairnessGrouping;
  readonly referenceLabel: string;
  readonly focalLabel: string;
  readonly matrix: ResponseMatrix;
  /** Per matrix row: 0 reference, 1 focal, −1 neither. */
  readonly groups: ArrayLike<number>;
  /** Calibrated difficulty of each matrix column. */
  readonly difficulties: Float64Array;
}

/**
 * Answers an item needs in each group before the screen classes it (a floor chosen here, no source:
 * published practice asks for more, from memory a few hundred per group). With rotated booklets
 * most items fall below it; give the items a fairness check must see to everyone (a common block).
 * Below it, chance alone flags about one item in a hundred (seen in the demo's design), and a few
 * flags among a hundred items would be read as findings.
 */
export const minAnswersPerGroupToClass = 50;

const round = (value: number, digits = 3) => {
  const f = 10 ** digits;
  const r = Math.round(value * f) / f;
  return Object.is(r, -0) ? 0 : r;
};

function compareGroups(
  matrix: ResponseMatrix,
  groups: ArrayLike<number>,
  difficulties: Float64Array,
): FairnessComparison {
  const row = new Map(matrix.personIds.map((id, p) => [id, p]));
  const sums = new Float64Array(2);
  const counts = new Float64Array(2);
  for (const estimate of personEstimates(matrix, difficulties)) {
    const g = groups[row.get(estimate.personId)!];
    if (g !== REFERENCE_GROUP && g !== FOCAL_GROUP) continue;
    sums[g] = sums[g]! + estimate.ability;
    counts[g] = counts[g]! + 1;
  }
  const referenceMean = counts[0]! > 0 ? sums[0]! / counts[0]! : Number.NaN;
  const focalMean = counts[1]! > 0 ? sums[1]! / counts[1]! : Number.NaN;
  return {
    itemCount: matrix.itemIds.length,
    referenceMean: round(referenceMean),
    focalMean: round(focalMean),
    difference: round(focalMean - referenceMean),
  };
}

/**
 * Builds the Fairness section from the responses the report used.
 *
 * The comparison "with flagged items excluded" re-estimates every person's WLE on the remaining
 * items, difficulties held at the calibration's values (so the scale does not move), and compares
 * the group means again: a difference that shrinks without the flagged items was partly made by them.
 *
 * @see Holland, P. W., & Thayer, D. T. (1988), in Wainer & Braun (Eds.), Test Validity, ch. 9 (MH D-DIF).
 * @see Zwick, R. (2012). ETS Research Report RR-12-08 (A/B/C rule; score strata with both groups).
 * @param input matrix, groups (0 reference, 1 focal, other left out), labels, calibrated difficulties
 * @returns the section (numbers rounded to 3 decimals)
 * @throws Error `fairnessSection requires persons in both groups` when a group is empty
 * @example
 * // see test/reports/fairness-section.test.ts: invented data with DIF on i5 and i14 flags those two
 */
export function fairnessSection(input: FairnessInput): FairnessSection {
  const { matrix, groups, difficulties } = input;
  if (difficulties.length !== matrix.itemIds.length)
    throw new Error('fairnessSection requires one difficulty per item');
  let reference = 0;
  let focal = 0;
  for (let p = 0; p < groups.length; p++) {
    if (groups[p] === REFERENCE_GROUP) reference++;
    else if (groups[p] === FOCAL_GROUP) focal++;
  }
  if (reference === 0 || focal === 0) throw new Error('fairnessSection requires persons in both groups');
  const dif = difReport(matrix, groups, {
    referenceLabel: input.referenceLabel,
    focalLabel: input.focalLabel,
    purify: true,
  });
  const width = matrix.itemIds.length;
  const answers = (column: number, group: number) => {
    let n = 0;
    for (let p = 0; p < groups.length; p++)
      if (groups[p] === group && matrix.scores[p * width + column] !== MISSING) n++;
    return n;
  };
  const counts = matrix.itemIds.map(
    (_, c) => [answers(c, REFERENCE_GROUP), answers(c, FOCAL_GROUP)] as const,
  );
  const enough = (c: number) => Math.min(...counts[c]!) >= minAnswersPerGroupToClass;
  const flagged = new Set(dif.flaggedItemIds.filter((id) => enough(matrix.itemIds.indexOf(id))));
  const flaggedItemIds = dif.flaggedItemIds.filter((id) => flagged.has(id));
  const items: FairnessItem[] = dif.items.map((item, column) => {
    const mh = item.mantelHaenszel;
    const effect = mh.kind === 'test' ? mh.effect : null;
    return {
      itemId: item.itemId,
      etsClass: enough(column) ? item.etsClass : null,
      referenceAnswers: counts[column]![0],
      focalAnswers: counts[column]![1],
      flagged: flagged.has(item.itemId),
      dDif: effect ? round(effect.dDif) : null,
      dDifStandardError: effect ? round(effect.dDifStandardError) : null,
      chiSquared: mh.kind === 'test' ? round(mh.chiSquaredCorrected) : null,
      pValue: mh.kind === 'test' ? round(mh.pValueCorrected, 4) : null,
      strataUsed: mh.strataUsed,
      raschContrast: item.rasch ? round(item.rasch.contrast) : null,
      raschStandardError: item.rasch ? round(item.rasch.standardError) : null,
      explanation: flagged.has(item.itemId) ? item.explanation : null,
    };
  });
  const allItems = compareGroups(matrix, groups, difficulties);
  const kept = matrix.itemIds.flatMap((id, c) => (flagged.has(id) ? [] : [c]));
  let flaggedExcluded: FairnessComparison | null = null;
  if (flagged.size > 0 && kept.length >= 2) {
    const sub = keepColumns(matrix, kept);
    const answered = (p: number) => {
      for (let j = 0; j < kept.length; j++) if (sub.scores[p * kept.length + j] !== MISSING) return true;
      return false;
    };
    // persons who answered only flagged items drop out of this comparison
    const subGroups = Int8Array.from({ length: groups.length }, (_, p) => (answered(p) ? groups[p]! : -1));
    flaggedExcluded = compareGroups(
      sub,
      subGroups,
      Float64Array.from(kept, (c) => difficulties[c]!),
    );
  }
  const names = (ids: readonly string[]) => ids.join(', ');
  const sentence =
    flaggedItemIds.length === 0
      ? `No item was flagged: at the same total score, ${input.focalLabel} and ${input.referenceLabel} found every item about equally hard.`
      : `${flaggedItemIds.length} item${flaggedItemIds.length === 1 ? '' : 's'} flagged (${names(flaggedItemIds)}). ` +
        `On all ${allItems.itemCount} items, ${input.focalLabel} minus ${input.referenceLabel} is ${allItems.difference.toFixed(2)} logits` +
        (flaggedExcluded
          ? `; without the flagged items it is ${flaggedExcluded.difference.toFixed(2)} logits (${flaggedExcluded.itemCount} items).`
          : '.');
  return {
    grouping: input.grouping,
    referenceLabel: input.referenceLabel,
    focalLabel: input.focalLabel,
    referencePersons: dif.referencePersons,
    focalPersons: dif.focalPersons,
    items,
    flaggedItemIds: flaggedItemIds,
    comparison: { allItems, flaggedExcluded },
    method: dif.method,
    smallStrata:
      'People are matched on their total score (the studied item included; with rotated booklets, the same booklet and score). ' +
      'A score stratum holding only one group carries no information and is skipped; empty cells inside a used stratum are kept as they are (no 0.5 added). ' +
      'When every stratum lacks one group the item has no estimate and is not classed. ' +
      'B or C needs both a large enough D-DIF and statistical significance, so small groups flag only large effects. ' +
      `An item is classed only when each group gave it at least ${minAnswersPerGroupToClass} answers; with rotated booklets, put the items to check in the study's common block (commonItems) so everyone answers them.`,
    sentence,
  };
}
