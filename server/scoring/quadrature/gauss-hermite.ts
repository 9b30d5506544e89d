/**
 * Gauss-Hermite quadrature: nodes x_i and weights w_i with
 * ∫ f(x) e^(−x²) dx ≈ Σ w_i f(x_i).
 *
 * The nodes are the eigenvalues of the symmetric tridiagonal Jacobi matrix of the
 * Hermite polynomials (zero diagonal, off-diagonal √(k/2)), as in Golub and Welsch. Each
 * eigenvalue is bracketed by Sturm-sequence bisection, then polished by a few Newton steps on
 * the three-term recurrence of the orthonormal Hermite polynomials; the weight follows from
 * the Christoffel function, w = 1 / Σ_{k<n} p_k(x)², with p_k orthonormal for e^(−x²).
 *
 * @see Golub, G. H., & Welsch, J. H. (1969). Calculation of Gauss quadrature rules.
 *   Mathematics of Computation 23(106), 221–230.
 * @see Abramowitz, M., & Stegun, I. A. (1964). Handbook of Mathematical Functions, Table 25.10.
 *
 * @param n number of points, 1..200 (beyond about 150 the outermost weights underflow to 0).
 * @returns ascending nodes and their weights; the weights sum to √π.
 * @throws when n is not an integer in 1..200.
 * @example
 * gaussHermite(5).nodes[2]; // 0
 * gaussHermite(5).weights[2]; // 0.945308720482942
 */
export function gaussHermite(n: number): { nodes: Float64Array; weights: Float64Array } {
  if (!Number.isInteger(n) || n < 1 || n > MAX_POINTS) {
    throw new Error('gaussHermite requires an integer number of points in 1..200');
  }
  // The rule depends on n alone: computed once per n, handed out as copies so no caller can change
  // another's (EAP runs it once per answer in adaptive delivery and simulation).
  let rule = computedRules.get(n);
  if (rule === undefined) {
    rule = computeRule(n);
    computedRules.set(n, rule);
  }
  return { nodes: rule.nodes.slice(), weights: rule.weights.slice() };
}

const computedRules = new Map<number, { nodes: Float64Array; weights: Float64Array }>();

function computeRule(n: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  // Off-diagonal of the Jacobi matrix: beta_k = sqrt(k / 2), k = 1..n-1.
  const beta = new Float64Array(n);
  for (let k = 1; k < n; k++) beta[k] = Math.sqrt(k / 2);
  // Gershgorin bound on every eigenvalue.
  const bound = n === 1 ? 1 : 2 * Math.sqrt((n - 1) / 2) + 1;
  const half = Math.floor(n / 2);
  // Eigenvalue j (ascending, 0-based) for the upper half; the lower half mirrors it.
  for (let j = n - half; j < n; j++) {
    let lo = 0;
    let hi = bound;
    for (let step = 0; step < 200 && hi - lo > 1e-15 * Math.max(1, hi); step++) {
      const mid = 0.5 * (lo + hi);
      // Number of eigenvalues below mid, from the Sturm sequence of T - mid I.
      if (countBelow(beta, n, mid) > j) hi = mid;
      else lo = mid;
    }
    const x = polishNode(0.5 * (lo + hi), n);
    nodes[j] = x;
    nodes[n - 1 - j] = -x;
  }
  if (n % 2 === 1) nodes[half] = 0;
  for (let j = 0; j < n; j++) {
    const w = christoffelWeight(nodes[j]!, n);
    weights[j] = w;
  }
  // Exact symmetry of the weights.
  for (let j = 0; j < half; j++) {
    const w = 0.5 * (weights[j]! + weights[n - 1 - j]!);
    weights[j] = w;
    weights[n - 1 - j] = w;
  }
  return { nodes, weights };
}

/** Largest supported number of points. */
export const MAX_POINTS = 200;

/** Count of eigenvalues of the Hermite Jacobi matrix below x (Sturm sequence, LDLᵀ pivots). */
function countBelow(beta: Float64Array, n: number, x: number): number {
  let count = 0;
  let d = -x;
  if (d < 0) count++;
  for (let k = 1; k < n; k++) {
    const b = beta[k]!;
    const prev = d === 0 ? 1e-300 : d;
    d = -x - (b * b) / prev;
    if (d < 0) count++;
  }
  return count;
}

/**
 * Orthonormal Hermite values p_{n}(x), p_{n-1}(x) for the weight e^(−x²) and the sum Σ_{k<n} p_k².
 * Recurrence: p_0 = π^(−1/4), p_k = x √(2/k) p_{k−1} − √((k−1)/k) p_{k−2}.
 */
function hermiteOrthonormal(x: number, n: number): { pn: number; pn1: number; sumSquares: number } {
  let pPrev = 0;
  let p = Math.PI ** -0.25;
  let sumSquares = 0;
  for (let k = 1; k <= n; k++) {
    sumSquares += p * p;
    const next = x * Math.sqrt(2 / k) * p - Math.sqrt((k - 1) / k) * pPrev;
    pPrev = p;
    p = next;
  }
  return { pn: p, pn1: pPrev, sumSquares };
}

/** Newton steps on p_n, using p_n' = √(2n) p_{n−1}; at most 5, stops when the step is below 1 ulp-ish. */
function polishNode(x: number, n: number): number {
  for (let step = 0; step < 5; step++) {
    const { pn, pn1 } = hermiteOrthonormal(x, n);
    const derivative = Math.sqrt(2 * n) * pn1;
    if (derivative === 0) break;
    const dx = pn / derivative;
    x -= dx;
    if (Math.abs(dx) <= 1e-16 * Math.max(1, Math.abs(x))) break;
  }
  return x;
}

function christoffelWeight(x: number, n: number): number {
  return 1 / hermiteOrthonormal(x, n).sumSquares;
}

/**
 * Nodes and weights for E[f(θ)] with θ ~ N(mean, sd): θ_i = mean + sd·√2·x_i and
 * weights w_i/√π, which sum to 1.
 *
 * @see Abramowitz & Stegun (1964), 25.4.46 with the change of variable θ = μ + √2 σ x.
 * @param n number of Gauss-Hermite points (41 is the calibration default).
 * @param mean mean of the normal distribution.
 * @param sd standard deviation, > 0.
 * @returns nodes on the θ scale and weights that sum to 1.
 * @throws when sd is not positive and finite.
 * @example
 * normalQuadrature(5).nodes[4]; // 2.8569700138728056 (= √(5 + √10))
 * normalQuadrature(5).weights[2]; // 0.5333333333333333 (= 8/15)
 */
export function normalQuadrature(n = 41, mean = 0, sd = 1): { nodes: Float64Array; weights: Float64Array } {
  if (!(sd > 0) || !Number.isFinite(sd) || !Number.isFinite(mean)) {
    throw new Error('normalQuadrature requires a finite mean and a positive sd');
  }
  const rule = gaussHermite(n);
  const scale = Math.SQRT2 * sd;
  const invSqrtPi = 1 / Math.sqrt(Math.PI);
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    nodes[i] = mean + scale * rule.nodes[i]!;
    weights[i] = rule.weights[i]! * invSqrtPi;
  }
  return { nodes, weights };
}
