/**
 * Cholesky factorisation of a symmetric positive-definite matrix, with solve and inverse.
 *
 * @see Golub, G. H., & Van Loan, C. F. (2013). Matrix Computations (4th ed.), Algorithm 4.2.1
 *   (gaxpy Cholesky).
 */

/**
 * Factorises the row-major n × n matrix `a` as L Lᵀ and returns L (row-major, upper part zero),
 * or `null` when a pivot is not positive (the matrix is singular or indefinite).
 *
 * @example
 * Array.from(choleskyDecompose(Float64Array.of(4, 2, 2, 5), 2)!); // [2, 0, 1, 2]
 */
export function choleskyDecompose(a: Float64Array, n: number): Float64Array | null {
  const l = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    let diagonal = a[j * n + j]!;
    for (let k = 0; k < j; k++) diagonal -= l[j * n + k]! ** 2;
    // A pivot that is not clearly positive means a direction with no information.
    if (!(diagonal > 1e-12 * Math.max(1, Math.abs(a[j * n + j]!)))) return null;
    const root = Math.sqrt(diagonal);
    l[j * n + j] = root;
    for (let i = j + 1; i < n; i++) {
      let sum = a[i * n + j]!;
      for (let k = 0; k < j; k++) sum -= l[i * n + k]! * l[j * n + k]!;
      l[i * n + j] = sum / root;
    }
  }
  return l;
}

/** Solves L Lᵀ x = b for x, given the factor from {@link choleskyDecompose}. */
export function choleskySolve(l: Float64Array, n: number, b: Float64Array): Float64Array {
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let sum = b[i]!;
    for (let k = 0; k < i; k++) sum -= l[i * n + k]! * y[k]!;
    y[i] = sum / l[i * n + i]!;
  }
  const x = new Float64Array(n);
  for (let i = n - 1; i >= 0; i--) {
    let sum = y[i]!;
    for (let k = i + 1; k < n; k++) sum -= l[k * n + i]! * x[k]!;
    x[i] = sum / l[i * n + i]!;
  }
  return x;
}

/** The inverse (row-major) of L Lᵀ, column by column. */
export function choleskyInverse(l: Float64Array, n: number): Float64Array {
  const inverse = new Float64Array(n * n);
  const unit = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    unit.fill(0);
    unit[j] = 1;
    const column = choleskySolve(l, n, unit);
    for (let i = 0; i < n; i++) inverse[i * n + j] = column[i]!;
  }
  return inverse;
}
