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

/**
 * The matrix with only the given item columns, in the given order (same persons, same scores).
 *
 * @example keepColumns(matrix, [2, 0]).itemIds // [matrix.itemIds[2], matrix.itemIds[0]]
 */
export function keepColumns(matrix: ResponseMatrix, columns: readonly number[]): ResponseMatrix {
  const n = matrix.personIds.length;
  const width = matrix.itemIds.length;
  const scores = new Uint8Array(n * columns.length);
  for (let p = 0; p < n; p++) {
    columns.forEach((c, j) => {
      scores[p * columns.length + j] = matrix.scores[p * width + c]!;
    });
  }
  return { personIds: matrix.personIds, itemIds: columns.map((c) => matrix.itemIds[c]!), scores };
}
