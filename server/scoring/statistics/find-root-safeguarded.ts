/**
 * Newton-Raphson kept inside a bracket, falling back to bisection when a Newton step leaves it
 * or shrinks the bracket too slowly ("rtsafe").
 *
 * @see Press, W. H., Teukolsky, S. A., Vetterling, W. T., & Flannery, B. P. (2007). Numerical Recipes
 *   (3rd ed.), §9.4, routine rtsafe.
 */
export interface RootResult {
  readonly root: number;
  readonly iterations: number;
  readonly converged: boolean;
}

/**
 * Finds x in [low, high] with f(x) = 0 for a decreasing or increasing f that changes sign there.
 *
 * @param evaluate returns [f(x), f'(x)].
 * @param low lower end of the bracket.
 * @param high upper end of the bracket.
 * @param start first guess (clamped into the bracket).
 * @param maxIterations at most this many evaluations after the first.
 * @param tolerance stop when the step or the bracket is below this.
 * @throws if f does not change sign over the bracket.
 * @example
 * findRootSafeguarded((x) => [x * x - 2, 2 * x], 0, 2, 1, 50, 1e-12).root; // 1.4142135623730951
 */
export function findRootSafeguarded(
  evaluate: (x: number) => readonly [number, number],
  low: number,
  high: number,
  start: number,
  maxIterations: number,
  tolerance: number,
): RootResult {
  const [fLow] = evaluate(low);
  const [fHigh] = evaluate(high);
  if (fLow === 0) return { root: low, iterations: 0, converged: true };
  if (fHigh === 0) return { root: high, iterations: 0, converged: true };
  if (Math.sign(fLow) === Math.sign(fHigh)) throw new Error('findRootSafeguarded requires a sign change');
  // orient so that f(negativeSide) < 0
  let negativeSide = fLow < 0 ? low : high;
  let positiveSide = fLow < 0 ? high : low;
  let x = Math.min(Math.max(start, low), high);
  let [f, derivative] = evaluate(x);
  let previousStep = Math.abs(high - low);
  for (let iteration = 1; iteration <= maxIterations; iteration++) {
    const newton = x - f / derivative;
    let step: number;
    const inside = (newton - negativeSide) * (newton - positiveSide) <= 0;
    if (Number.isFinite(newton) && inside && Math.abs(f / derivative) < previousStep / 2) {
      step = x - newton;
      x = newton;
    } else {
      const middle = (negativeSide + positiveSide) / 2;
      step = x - middle;
      x = middle;
    }
    previousStep = Math.abs(step);
    [f, derivative] = evaluate(x);
    if (f < 0) negativeSide = x;
    else positiveSide = x;
    if (Math.abs(step) < tolerance || f === 0) return { root: x, iterations: iteration, converged: true };
  }
  return { root: x, iterations: maxIterations, converged: false };
}
