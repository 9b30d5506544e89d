/**
 * Cross-table of two raters' scores on the same answers: entry [a · k + b] counts answers the first
 * rater scored a and the second b (row-major k × k).
 *
 * @param first scores of the first rater, integers 0..categories − 1.
 * @param second scores of the second rater on the same answers, same order.
 * @param categories k, the number of rubric scores (3 for 0/1/2).
 * @returns the k × k counts.
 * @throws when the lengths differ, there are no answers, or a score is outside 0..k − 1 (named with its position).
 * @example
 * Array.from(agreementTable([0, 1, 2, 2], [0, 2, 2, 1], 3)); // [1, 0, 0, 0, 0, 1, 0, 1, 1]
 */
export function agreementTable(
  first: ArrayLike<number>,
  second: ArrayLike<number>,
  categories: number,
): Float64Array {
  if (!Number.isInteger(categories) || categories < 2)
    throw new Error('agreementTable requires at least two categories');
  if (first.length !== second.length) throw new Error('agreementTable requires two scores per answer');
  if (first.length === 0) throw new Error('agreementTable requires at least one answer');
  const table = new Float64Array(categories * categories);
  for (let k = 0; k < first.length; k++) {
    const a = first[k]!;
    const b = second[k]!;
    for (const score of [a, b]) {
      if (!Number.isInteger(score) || score < 0 || score >= categories)
        throw new Error(
          `agreementTable score ${score} at answer ${k + 1} is outside the rubric 0..${categories - 1}`,
        );
    }
    table[a * categories + b]!++;
  }
  return table;
}
