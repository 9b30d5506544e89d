import { selectResponseMatrix } from '../build-response-matrix.js';
import { type CalibrateCmlOptions, calibrateCml } from '../rasch/calibrate-cml.js';
import type { ItemCalibration } from '../rasch/types.js';
import type { ResponseMatrix } from '../response-matrix.js';
import { standardNormalCdf } from '../statistics/standard-normal-cdf.js';
import { FOCAL_GROUP, REFERENCE_GROUP } from './score-strata.js';

export interface RaschDifContrastOptions extends Omit<CalibrateCmlOptions, 'anchors'> {
  /**
   * Items assumed free of DIF whose mean difficulty is set equal in both groups. Default: every
   * item calibrated in both groups except the studied one.
   */
  readonly anchorItems?: readonly string[];
}

/** One item's group-wise difficulties and their contrast. */
export interface RaschDifItem {
  readonly itemId: string;
  /** b in the reference group, logits, on the aligned scale. */
  readonly referenceDifficulty: number;
  readonly referenceStandardError: number;
  /** b in the focal group, logits, shifted onto the reference scale. */
  readonly focalDifficulty: number;
  readonly focalStandardError: number;
  /** focal − reference; positive means the item is harder for the focal group. */
  readonly contrast: number;
  /** √(SE_R² + SE_F²). */
  readonly standardError: number;
  /** contrast / SE. */
  readonly z: number;
  /** Two-sided normal p-value of z. */
  readonly pValue: number;
}

export interface RaschDifContrast {
  /** Items estimable in both groups, in matrix order. */
  readonly items: readonly RaschDifItem[];
  /** Items left out because one group answered them all right, all wrong or not at all. */
  readonly excludedItems: readonly string[];
  readonly reference: ItemCalibration;
  readonly focal: ItemCalibration;
}

/**
 * Rasch-based DIF contrast: item difficulties calibrated by CML separately in the reference and
 * focal groups, put on one scale, and compared item by item with z = (b_F − b_R) / √(SE_R² + SE_F²).
 *
 * Alignment: each group's CML scale has an arbitrary origin, so for the studied item i the focal
 * scale is shifted to make the mean difficulty of the anchor items (default: all items calibrated
 * in both groups except i) equal in both groups. Leaving the studied item out of its own anchor
 * keeps its DIF from pulling the origin towards itself; with several DIF items the other ones
 * still contaminate the anchor a little, which is why `anchorItems` can name a DIF-free set. The
 * SE ignores the uncertainty of the shift (it is a mean over many items), as the usual
 * separate-calibration t-test does.
 *
 * @see Wright, B. D., & Stone, M. H. (1979). Best Test Design. MESA Press, ch. 4 (separate
 *   calibrations and their difference over the joint SE; from memory for the chapter).
 * @see Fischer, G. H., & Molenaar, I. W. (Eds.) (1995). Rasch Models. Springer, ch. 5 (Glas &
 *   Verhelst, item-level tests of the Rasch model across groups; from memory for the chapter).
 * @param matrix 0/1 responses or MISSING.
 * @param groups per person: 0 reference, 1 focal, any other number to leave out.
 * @param options anchor items and CML options.
 * @returns per-item contrasts and both calibrations.
 * @throws when a group is empty, an anchor item is unknown, or fewer than two items are
 *   estimable in both groups.
 * @example
 * // see test/scoring/dif/rasch-dif-contrast.test.ts: an injected shift of 0.8 logits is recovered within 2 SE
 */
export function raschDifContrast(
  matrix: ResponseMatrix,
  groups: ArrayLike<number>,
  options: RaschDifContrastOptions = {},
): RaschDifContrast {
  const nPersons = matrix.personIds.length;
  if (groups.length !== nPersons) throw new Error('raschDifContrast requires one group per person');
  const referencePersons: number[] = [];
  const focalPersons: number[] = [];
  for (let p = 0; p < nPersons; p++) {
    if (groups[p] === REFERENCE_GROUP) referencePersons.push(p);
    else if (groups[p] === FOCAL_GROUP) focalPersons.push(p);
  }
  if (referencePersons.length === 0)
    throw new Error('raschDifContrast requires persons in the reference group');
  if (focalPersons.length === 0) throw new Error('raschDifContrast requires persons in the focal group');
  const cmlOptions = { maxIterations: options.maxIterations, tolerance: options.tolerance };
  const reference = calibrateCml(selectResponseMatrix(matrix, referencePersons), cmlOptions);
  const focal = calibrateCml(selectResponseMatrix(matrix, focalPersons), cmlOptions);
  const focalIndex = new Map(focal.itemIds.map((id, k) => [id, k]));
  const referenceIndex = new Map(reference.itemIds.map((id, k) => [id, k]));
  const common = matrix.itemIds.filter((id) => focalIndex.has(id) && referenceIndex.has(id));
  if (common.length < 2) throw new Error('raschDifContrast requires two items estimable in both groups');
  const anchors = options.anchorItems ?? common;
  for (const id of anchors) {
    if (!matrix.itemIds.includes(id))
      throw new Error(`raschDifContrast anchor ${id} is not an item of the matrix`);
  }
  const gap = (id: string) =>
    focal.difficulty[focalIndex.get(id)!]! - reference.difficulty[referenceIndex.get(id)!]!;
  const usable = anchors.filter((id) => focalIndex.has(id) && referenceIndex.has(id));
  let gapSum = 0;
  for (const id of usable) gapSum += gap(id);
  const items = common.map((id): RaschDifItem => {
    const inAnchor = usable.includes(id);
    const count = usable.length - (inAnchor ? 1 : 0);
    if (count === 0) throw new Error(`raschDifContrast has no anchor item left for ${id}`);
    const shift = (gapSum - (inAnchor ? gap(id) : 0)) / count;
    const r = referenceIndex.get(id)!;
    const f = focalIndex.get(id)!;
    const referenceDifficulty = reference.difficulty[r]!;
    const focalDifficulty = focal.difficulty[f]! - shift;
    const referenceStandardError = reference.standardError[r]!;
    const focalStandardError = focal.standardError[f]!;
    const contrast = focalDifficulty - referenceDifficulty;
    const standardError = Math.hypot(referenceStandardError, focalStandardError);
    const z = contrast / standardError;
    return {
      itemId: id,
      referenceDifficulty,
      referenceStandardError,
      focalDifficulty,
      focalStandardError,
      contrast,
      standardError,
      z,
      pValue: 2 * standardNormalCdf(-Math.abs(z)),
    };
  });
  return {
    items,
    excludedItems: matrix.itemIds.filter((id) => !common.includes(id)),
    reference,
    focal,
  };
}
