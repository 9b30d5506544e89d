/**
 * The person-by-item score table every scoring method reads.
 *
 * Scores are stored row-major in one `Uint8Array`: person `p`, item `i` sits at
 * `p * itemIds.length + i`. A cell holds the item score (0 or 1 for dichotomous items,
 * 0..m for partial-credit items) or {@link MISSING} when the item was not presented.
 * Missing by design is not wrong: an item a person never saw carries no information about them.
 */
export const MISSING = 255;

export interface ResponseMatrix {
  readonly personIds: readonly string[];
  readonly itemIds: readonly string[];
  readonly scores: Uint8Array;
}
