/**
 * Elementary symmetric functions of the item parameters ε_i = exp(-b_i), the normalising
 * constants of the conditional Rasch likelihood.
 *
 * γ_r(ε) is the sum, over all sets of r items, of the product of their ε. Computed naively the
 * values overflow long before 300 items, so every vector here is kept on a probability scale:
 * with p_i = ε_i / (1 + ε_i), the summation algorithm run on (1 - p_i, p_i) gives the
 * distribution of the number correct of independent Bernoulli(p_i) trials,
 * P(R = r) = γ_r(ε) / Π(1 + ε_i). Each step is a convex combination of numbers in [0, 1], so
 * nothing overflows and no subtraction can cancel; the scale Π(1 + ε_i) is carried as a logarithm.
 *
 * @see Fischer, G. H. (1974). Einführung in die Theorie psychologischer Tests. Huber (summation
 *   algorithm for the γ functions).
 * @see Verhelst, N. D., Glas, C. A. W., & van der Sluis, A. (1984). Estimation problems in the Rasch
 *   model: The basic symmetric functions. Computational Statistics Quarterly 1(3), 245-262
 *   (summation versus difference algorithm; the summation algorithm is the stable one).
 */

/**
 * γ_0..γ_n of one item set, on the probability scale of the centred parameters
 * ε'_i = exp(−(b_i − shift)), shift = mean difficulty: γ_r(ε) = scaled[r] · exp(logScale − r · shift).
 */
export interface ElementarySymmetricFunctions {
  /** γ_r(ε') / Π(1 + ε'_i) for r = 0..n (sums to 1). */
  readonly scaled: Float64Array;
  /** log Π(1 + ε'_i). */
  readonly logScale: number;
  /** Mean difficulty subtracted before the recursion (γ_r(ε) = γ_r(ε') e^{−r·shift}). */
  readonly shift: number;
}

/** γ functions with their first derivatives ∂γ_r/∂ε_i = γ^{(i)}_{r-1}. */
export interface ElementarySymmetricFunctionsWithDerivatives extends ElementarySymmetricFunctions {
  /**
   * Row-major n × (n + 1): entry `i * (n + 1) + r` is γ^{(i)}_{r-1}(ε') / Π(1 + ε'_k), the γ function
   * of order r − 1 of all items but i (0 for r = 0). So π_{i|r} = ε'_i · derivatives[i, r] / scaled[r]
   * and γ^{(i)}_{r-1}(ε) = derivatives[i, r] · exp(logScale − (r − 1) · shift).
   */
  readonly derivatives: Float64Array;
}

/** log(1 + exp(-b)) without overflow. */
export function logOnePlusExpNeg(b: number): number {
  return b > 0 ? Math.log1p(Math.exp(-b)) : -b + Math.log1p(Math.exp(b));
}

/** p = ε / (1 + ε) = 1 / (1 + exp(b)). */
export function successProbability(b: number): number {
  return 1 / (1 + Math.exp(b));
}

/**
 * Runs the summation algorithm over items `from..to-1` (indices into `probabilities`), skipping
 * `skip`, and writes the distribution of the count into `out` (length ≥ count + 1).
 */
export function sumBernoulli(
  probabilities: Float64Array,
  out: Float64Array,
  skip = -1,
  from = 0,
  to = probabilities.length,
): number {
  out[0] = 1;
  let count = 0;
  for (let k = from; k < to; k++) {
    if (k === skip) continue;
    const p = probabilities[k]!;
    const q = 1 - p;
    count++;
    out[count] = out[count - 1]! * p;
    for (let r = count - 1; r > 0; r--) out[r] = out[r]! * q + out[r - 1]! * p;
    out[0] = out[0]! * q;
  }
  return count;
}

/**
 * Elementary symmetric functions γ_0..γ_n of ε_i = exp(-b_i), by the summation algorithm on a
 * probability scale.
 *
 * @param difficulties b_i of the items, logits.
 * @returns the scaled γ vector, its log scale and the shift.
 * @throws if a difficulty is not finite.
 * @example
 * // ε = (1, 1): γ = (1, 2, 1), Π(1 + ε) = 4
 * const esf = elementarySymmetricFunctions(Float64Array.of(0, 0));
 * Array.from(esf.scaled); // [0.25, 0.5, 0.25]
 * Math.exp(esf.logScale); // 4
 */
export function elementarySymmetricFunctions(difficulties: Float64Array): ElementarySymmetricFunctions {
  const n = difficulties.length;
  let shift = 0;
  for (const b of difficulties) {
    if (!Number.isFinite(b)) throw new Error('elementarySymmetricFunctions requires finite difficulties');
    shift += b;
  }
  shift = n === 0 ? 0 : shift / n;
  const probabilities = new Float64Array(n);
  let logScale = 0;
  for (let i = 0; i < n; i++) {
    const centred = difficulties[i]! - shift;
    probabilities[i] = successProbability(centred);
    logScale += logOnePlusExpNeg(centred);
  }
  const scaled = new Float64Array(n + 1);
  sumBernoulli(probabilities, scaled);
  return { scaled, logScale, shift };
}

/**
 * log γ_r for r = 0..n (−Infinity only where γ_r underflows: a score whose probability at the
 * mean difficulty is below about 1e-308).
 *
 * @example
 * Array.from(logElementarySymmetricFunctions(Float64Array.of(0, 0, 0)), Math.exp); // [1, 3, 3, 1]
 */
export function logElementarySymmetricFunctions(difficulties: Float64Array): Float64Array {
  const { scaled, logScale, shift } = elementarySymmetricFunctions(difficulties);
  return scaled.map((g, r) => Math.log(g) + logScale - r * shift);
}

/**
 * γ functions and their first derivatives γ^{(i)}_{r-1}, each leave-one-out vector computed by
 * convolving prefix and suffix summation results (no subtraction, so no cancellation).
 * Cost O(n^2) for the prefixes and suffixes plus O(n^2) per item.
 *
 * @param difficulties b_i of the items, logits.
 * @returns the scaled γ vector, its log scale, the shift and the n × (n + 1) derivative table.
 * @example
 * // ε = (1, 1, 1): γ^{(i)} = (1, 2, 1) for each i; scale Π(1 + ε) = 8
 * const esf = elementarySymmetricFunctionsWithDerivatives(Float64Array.of(0, 0, 0));
 * Array.from(esf.derivatives.subarray(0, 4), (d) => d * 8); // [0, 1, 2, 1]
 */
export function elementarySymmetricFunctionsWithDerivatives(
  difficulties: Float64Array,
): ElementarySymmetricFunctionsWithDerivatives {
  const n = difficulties.length;
  const base = elementarySymmetricFunctions(difficulties);
  const probabilities = difficulties.map((b) => successProbability(b - base.shift));
  // prefix[k] = distribution over items 0..k-1 (length k+1), suffix[k] over items k..n-1.
  const prefix = bernoulliPrefixes(probabilities);
  const suffix = bernoulliSuffixes(probabilities);
  const width = n + 1;
  const derivatives = new Float64Array(n * width);
  for (let i = 0; i < n; i++) {
    const left = prefix[i]!; // items 0..i-1, counts 0..i
    const right = suffix[i + 1]!; // items i+1..n-1, counts 0..n-1-i
    // Leave-one-out distribution D(s), s = 0..n-1; derivative at r is D(r-1) / (1 + ε'_i)
    // because Π_{k≠i}(1 + ε'_k) = Π(1 + ε') / (1 + ε'_i) and 1 / (1 + ε'_i) = 1 - p_i.
    const q = 1 - probabilities[i]!;
    for (let s = 0; s < n; s++) {
      let sum = 0;
      const lo = Math.max(0, s - (n - 1 - i));
      const hi = Math.min(i, s);
      for (let t = lo; t <= hi; t++) sum += left[t]! * right[s - t]!;
      derivatives[i * width + s + 1] = sum * q;
    }
  }
  return { ...base, derivatives };
}

/** Distributions of the count over items 0..k-1 for k = 0..n. */
export function bernoulliPrefixes(probabilities: Float64Array): Float64Array[] {
  const n = probabilities.length;
  const out: Float64Array[] = [Float64Array.of(1)];
  for (let k = 0; k < n; k++) {
    const prev = out[k]!;
    const next = new Float64Array(k + 2);
    const p = probabilities[k]!;
    const q = 1 - p;
    next[0] = prev[0]! * q;
    for (let r = 1; r <= k; r++) next[r] = prev[r]! * q + prev[r - 1]! * p;
    next[k + 1] = prev[k]! * p;
    out.push(next);
  }
  return out;
}

/** Distributions of the count over items k..n-1 for k = 0..n. */
export function bernoulliSuffixes(probabilities: Float64Array): Float64Array[] {
  const n = probabilities.length;
  const out: Float64Array[] = new Array(n + 1);
  out[n] = Float64Array.of(1);
  for (let k = n - 1; k >= 0; k--) {
    const prev = out[k + 1]!;
    const m = n - k; // items in the new suffix
    const next = new Float64Array(m + 1);
    const p = probabilities[k]!;
    const q = 1 - p;
    next[0] = prev[0]! * q;
    for (let r = 1; r < m; r++) next[r] = prev[r]! * q + prev[r - 1]! * p;
    next[m] = prev[m - 1]! * p;
    out[k] = next;
  }
  return out;
}
