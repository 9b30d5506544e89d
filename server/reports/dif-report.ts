import { type EtsDifClass, etsDifClass } from '../scoring/dif/ets-dif-class.js';
import { type MantelHaenszelResult, mantelHaenszel } from '../scoring/dif/mantel-haenszel.js';
import { type RaschDifItem, raschDifContrast } from '../scoring/dif/rasch-dif-contrast.js';
import { FOCAL_GROUP, REFERENCE_GROUP, scoreStrata } from '../scoring/dif/score-strata.js';
import { keepColumns, type ResponseMatrix } from '../scoring/response-matrix.js';

/** MH of each column, matched on the total over `matching` columns plus the studied one. */
function mantelHaenszelMatched(
  matrix: ResponseMatrix,
  groups: ArrayLike<number>,
  column: number,
  matching: ReadonlySet<number> | null,
): MantelHaenszelResult {
  if (matching === null) return mantelHaenszel(scoreStrata(matrix, groups, column));
  const columns = matrix.itemIds.flatMap((_, c) => (c === column || matching.has(c) ? [c] : []));
  return mantelHaenszel(scoreStrata(keepColumns(matrix, columns), groups, columns.indexOf(column)));
}

export interface DifReportOptions {
  /** Plain name of the reference group, e.g. "Cohort A". Default "the reference group". */
  readonly referenceLabel?: string;
  /** Plain name of the focal group. Default "the focal group". */
  readonly focalLabel?: string;
  /** Items assumed free of DIF for the Rasch alignment (see raschDifContrast). */
  readonly anchorItems?: readonly string[];
  /**
   * Two-stage purification of the matching score (default false): after a first screen, each item's
   * MH strata are formed again from the total score on the items not flagged in the first stage
   * plus the studied item, so large DIF on a few items does not bias the matching of the others.
   */
  readonly purify?: boolean;
}

export interface DifReportItem {
  readonly itemId: string;
  readonly mantelHaenszel: MantelHaenszelResult;
  /** ETS class, or null when D-DIF cannot be estimated for the item. */
  readonly etsClass: EtsDifClass | null;
  /** Group-wise Rasch difficulties, or null when a group answered the item all right or all wrong. */
  readonly rasch: RaschDifItem | null;
  /** Plain-English reading of a B or C flag; null for class A and for items without an estimate. */
  readonly explanation: string | null;
}

export interface DifReport {
  readonly referencePersons: number;
  readonly focalPersons: number;
  readonly items: readonly DifReportItem[];
  /** Items in class B or C, in matrix order: leave them out for a "flagged items excluded" comparison. */
  readonly flaggedItemIds: readonly string[];
  /** How the flags were made, for the report's foot. */
  readonly method: string;
}

const number = (x: number) => (x >= 0 ? `+${x.toFixed(2)}` : x.toFixed(2));

/**
 * DIF screen of every item between two groups (from a background question or two cohorts): the
 * Mantel-Haenszel statistics on total-score strata with the ETS A/B/C class, the Rasch contrast of
 * separately calibrated difficulties, a plain-English explanation of each B or C flag, and the
 * list of flagged items to leave out when comparing the groups again.
 *
 * @see Holland, P. W., & Thayer, D. T. (1988), in Wainer & Braun (Eds.), Test Validity, ch. 9.
 * @see Zwick, R. (2012). ETS Research Report RR-12-08 (A/B/C rule).
 * @see Holland & Thayer (1988), the two-step purification of the matching criterion (`purify`; from memory).
 * @param matrix 0/1 responses or MISSING.
 * @param groups per person: 0 reference, 1 focal, any other number to leave out.
 * @param options group labels for the sentences, anchor items.
 * @returns per-item results, the flagged items and a method sentence.
 * @throws when either group is empty or fewer than two items are estimable in both groups.
 * @example
 * // see test/reports/dif-report.test.ts: invented data with DIF on two items of 20 flags those two
 */
export function difReport(
  matrix: ResponseMatrix,
  groups: ArrayLike<number>,
  options: DifReportOptions = {},
): DifReport {
  const reference = options.referenceLabel ?? 'the reference group';
  const focal = options.focalLabel ?? 'the focal group';
  let referencePersons = 0;
  let focalPersons = 0;
  for (let p = 0; p < groups.length; p++) {
    if (groups[p] === REFERENCE_GROUP) referencePersons++;
    else if (groups[p] === FOCAL_GROUP) focalPersons++;
  }
  if (referencePersons === 0 || focalPersons === 0)
    throw new Error('difReport requires persons in both groups');
  const contrast = raschDifContrast(matrix, groups, { anchorItems: options.anchorItems });
  const raschById = new Map(contrast.items.map((item) => [item.itemId, item]));
  let matching: Set<number> | null = null;
  if (options.purify) {
    const first = matrix.itemIds.map((_, column) =>
      etsDifClass(mantelHaenszel(scoreStrata(matrix, groups, column))),
    );
    matching = new Set(first.flatMap((c, column) => (c === 'A' || c === null ? [column] : [])));
  }
  const items = matrix.itemIds.map((itemId, column): DifReportItem => {
    const result = mantelHaenszelMatched(matrix, groups, column, matching);
    const etsClass = etsDifClass(result);
    const rasch = raschById.get(itemId) ?? null;
    return {
      itemId,
      mantelHaenszel: result,
      etsClass,
      rasch,
      explanation: explain(itemId, result, etsClass, rasch, reference, focal),
    };
  });
  return {
    referencePersons,
    focalPersons,
    items,
    flaggedItemIds: items
      .filter((item) => item.etsClass !== null && item.etsClass !== 'A')
      .map((item) => item.itemId),
    method:
      `Differential item functioning between ${reference} (${referencePersons} people) and ${focal} (${focalPersons} people): ` +
      `Mantel-Haenszel statistics with people matched on their total score${matching ? ' (purified: in a second stage the score leaves out the items flagged in the first, except the studied item)' : ''}, classified A (negligible), B (moderate) or C (large) by the ETS rule; ` +
      'Rasch difficulties calibrated separately in each group and aligned on the other items. ' +
      'A flag says an item worked differently for the two groups at the same score; it does not say why.',
  };
}

function explain(
  itemId: string,
  result: MantelHaenszelResult,
  etsClass: EtsDifClass | null,
  rasch: RaschDifItem | null,
  reference: string,
  focal: string,
): string | null {
  if (etsClass === null || etsClass === 'A' || result.kind !== 'test' || result.effect === null) return null;
  const harder = etsClass.endsWith('-');
  const size = etsClass.startsWith('C') ? 'large' : 'moderate';
  const { dDif, alpha } = result.effect;
  const odds = harder ? alpha : 1 / alpha;
  let sentence =
    `Item ${itemId} shows ${size} DIF (class ${etsClass[0]}): at the same total score, people in ${focal} found it ` +
    `${harder ? 'harder' : 'easier'} than people in ${reference}; their odds of answering it right were ` +
    `${harder ? `${odds.toFixed(1)} times lower` : `${odds.toFixed(1)} times higher`} (MH D-DIF ${number(dDif)}).`;
  if (rasch !== null) {
    const agrees = rasch.contrast > 0 === harder;
    sentence +=
      ` Calibrated separately, its difficulty is ${number(rasch.contrast)} logits for ${focal} relative to ${reference}` +
      ` (SE ${rasch.standardError.toFixed(2)})${agrees ? ', which agrees' : ', which does not agree in direction'}.`;
  }
  return sentence;
}
