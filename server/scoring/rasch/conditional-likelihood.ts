import { bernoulliPrefixes, bernoulliSuffixes, logOnePlusExpNeg } from './elementary-symmetric-functions.js';

/** Log-likelihood, expected item totals and information of the conditional Rasch likelihood. */
export interface ConditionalLikelihoodTerms {
  /** Σ_b Σ_r n_br log γ_r(ε_b) (the likelihood is −Σ_i s_i b_i minus this). */
  logNormaliser: number;
  /** E_i = Σ_b Σ_r n_br π_{i|r}: expected number correct of each item given the scores. */
  readonly expected: Float64Array;
  /** Conditional information Σ_b Σ_r n_br Cov(x_i, x_j | r), row-major items × items, if asked. */
  readonly information: Float64Array | null;
}

/**
 * Adds one booklet's contribution to the conditional log-likelihood, its gradient and the
 * conditional information (the negative Hessian). Everything runs on the probability scale of
 * {@link bernoulliPrefixes}: π_{i|r} = p_i D^{(i)}(r−1) / P(r) and
 * π_{ij|r} = p_i p_j D^{(ij)}(r−2) / P(r), with D the count distributions of the items left over.
 * Sums over r weighted by n_r / P(r) are pushed into suffix recursions, so the expected totals cost
 * O(n²) and the information O(n³) per booklet, all by summation (no subtraction).
 *
 * @see Fischer, G. H. (1995). Derivations of the Rasch model. In G. H. Fischer & I. W. Molenaar
 *   (Eds.), Rasch Models, ch. 3 (CML estimation equations and their Hessian).
 * @param difficulties b of the booklet's items.
 * @param counts n_r, persons with raw score r, r = 0..n.
 * @param slots position of each booklet item in the totals (−1 to skip it in `expected`/`information`).
 * @param terms accumulator; its `information` is width × width when present.
 * @param width side of `information`.
 */
export function addBookletTerms(
  difficulties: Float64Array,
  counts: Float64Array,
  slots: Int32Array,
  terms: ConditionalLikelihoodTerms,
  width: number,
): void {
  const n = difficulties.length;
  let mean = 0;
  for (let k = 0; k < n; k++) mean += difficulties[k]!;
  mean /= n;
  const probabilities = new Float64Array(n);
  let logScale = 0;
  for (let k = 0; k < n; k++) {
    const centred = difficulties[k]! - mean;
    probabilities[k] = 1 / (1 + Math.exp(centred));
    logScale += logOnePlusExpNeg(centred);
  }
  const prefixes = bernoulliPrefixes(probabilities);
  const suffixes = bernoulliSuffixes(probabilities);
  const total = prefixes[n]!; // P(r)
  const weight = new Float64Array(n + 3); // n_r / P(r), zero past n
  for (let r = 0; r <= n; r++) {
    const count = counts[r]!;
    if (count === 0) continue;
    const probability = total[r]!;
    if (!(probability > 0))
      throw new Error('calibrateCml lost precision in the elementary symmetric functions');
    weight[r] = count / probability;
    // γ_r(ε) = γ_r(ε') e^{−r·mean} with ε' the centred parameters
    terms.logNormaliser += count * (Math.log(probability) + logScale - r * mean);
  }
  // first[k*(n+1)+t] = Σ_u n_{t+u+1}/P(t+u+1) S_k(u); second uses t+u+2.
  const stride = n + 1;
  const first = new Float64Array((n + 1) * stride);
  const second = new Float64Array((n + 1) * stride);
  for (let t = 0; t < n; t++) {
    first[n * stride + t] = weight[t + 1]!;
    second[n * stride + t] = weight[t + 2]!;
  }
  for (let k = n - 1; k >= 0; k--) {
    const p = probabilities[k]!;
    const q = 1 - p;
    const here = k * stride;
    const next = (k + 1) * stride;
    for (let t = 0; t < k + 1 && t < n; t++) {
      first[here + t] = q * first[next + t]! + p * first[next + t + 1]!;
      second[here + t] = q * second[next + t]! + p * second[next + t + 1]!;
    }
  }
  const { expected, information } = terms;
  for (let i = 0; i < n; i++) {
    const slot = slots[i]!;
    if (slot < 0) continue;
    const left = prefixes[i]!;
    let sum = 0;
    for (let t = 0; t <= i; t++) sum += left[t]! * first[(i + 1) * stride + t]!;
    expected[slot]! += probabilities[i]! * sum;
  }
  if (information === null) return;

  // π_{i|r} for every item and score, for the Σ_r n_r π_ir π_jr term.
  const conditional = new Float64Array(n * stride);
  for (let i = 0; i < n; i++) {
    const left = prefixes[i]!;
    const right = suffixes[i + 1]!;
    const p = probabilities[i]!;
    for (let r = 1; r <= n; r++) {
      if (weight[r] === 0) continue;
      const s = r - 1;
      let sum = 0;
      const lo = Math.max(0, s - (n - 1 - i));
      const hi = Math.min(i, s);
      for (let t = lo; t <= hi; t++) sum += left[t]! * right[s - t]!;
      conditional[i * stride + r] = (p * sum) / total[r]!;
    }
  }
  const running = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    const slotI = slots[i]!;
    if (slotI < 0) continue;
    const pi = probabilities[i]!;
    // diagonal: Σ_r n_r π_ir (1 − π_ir)
    let diagonal = 0;
    for (let r = 1; r <= n; r++) {
      const c = counts[r]!;
      if (c === 0) continue;
      const v = conditional[i * stride + r]!;
      diagonal += c * v * (1 - v);
    }
    information[slotI * width + slotI]! += diagonal;
    // running = count distribution of items 0..j−1 without i, starting at j = i+1
    running.fill(0);
    running.set(prefixes[i]!);
    let size = i; // highest count held
    for (let j = i + 1; j < n; j++) {
      if (j > i + 1) {
        const p = probabilities[j - 1]!;
        const q = 1 - p;
        size++;
        running[size] = running[size - 1]! * p;
        for (let r = size - 1; r > 0; r--) running[r] = running[r]! * q + running[r - 1]! * p;
        running[0] = running[0]! * q;
      }
      const slotJ = slots[j]!;
      if (slotJ < 0) continue;
      let joint = 0;
      const base = (j + 1) * stride;
      for (let t = 0; t <= size; t++) joint += running[t]! * second[base + t]!;
      joint *= pi * probabilities[j]!;
      let product = 0;
      for (let r = 1; r <= n; r++) {
        const c = counts[r]!;
        if (c === 0) continue;
        product += c * conditional[i * stride + r]! * conditional[j * stride + r]!;
      }
      const covariance = joint - product;
      information[slotI * width + slotJ]! += covariance;
      information[slotJ * width + slotI]! += covariance;
    }
  }
}
