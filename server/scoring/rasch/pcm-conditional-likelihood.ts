/** Terms of the conditional PCM likelihood, in the cumulative category parameters ψ_ih = Σ_{k≤h} δ_ik. */
export interface PcmLikelihoodTerms {
  /** Σ_b Σ_r n_br log γ_r. */
  logNormaliser: number;
  /** E(N_ih) = Σ_b Σ_r n_br P(X_i = h | r), stacked like the parameters (h ≥ 1). */
  readonly expected: Float64Array;
  /** Σ_b Σ_r n_br Cov(1[X_i = h], 1[X_j = l] | r), row-major K × K, if asked. */
  readonly information: Float64Array | null;
}

/** Convolution of two score distributions. */
function convolve(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length + b.length - 1);
  for (let s = 0; s < a.length; s++) {
    const v = a[s]!;
    if (v === 0) continue;
    for (let t = 0; t < b.length; t++) out[s + t]! += v * b[t]!;
  }
  return out;
}

/** Adds one item's category distribution `q` to the score distribution `d`. */
function addItem(d: Float64Array, q: Float64Array): Float64Array {
  return convolve(d, q);
}

/**
 * Adds one booklet's contribution to the conditional likelihood of the partial credit model:
 * log γ_r, the expected category counts and the conditional covariance of the category
 * indicators. The elementary symmetric functions of polytomous items are built by the summation
 * algorithm generalised to categories (a convolution of the items' category distributions), on a
 * probability scale: q_ih ∝ exp(h·t − ψ_ih) at a centring ability t, so that
 * γ_r = P_t(R = r) · Π_i Z_i(t) · e^{−r t} and nothing overflows or cancels. With D^{(i)} and
 * D^{(ij)} the score distributions of the other items, P(X_i = h | r) = q_ih D^{(i)}(r − h) / P(r)
 * and P(X_i = h, X_j = l | r) = q_ih q_jl D^{(ij)}(r − h − l) / P(r); sums over r weighted by
 * n_r / P(r) are pushed into suffix recursions so each item pair costs O(R · m²).
 *
 * @see Andersen, E. B. (1977). Sufficient statistics and latent trait models. Psychometrika 42, 69-81.
 * @see Verhelst, N. D., Glas, C. A. W., & van der Sluis, A. (1984). Estimation problems in the Rasch
 *   model: The basic symmetric functions. Computational Statistics Quarterly 1(3), 245-262
 *   (the summation algorithm; its polytomous form as in eRm and psychotools, from memory).
 * @param items kept-item index of each booklet item.
 * @param counts n_r, persons with total score r.
 * @param psi cumulative category parameters of all kept items, stacked by `offsets`.
 * @param offsets start of each kept item's categories in `psi`; item k has offsets[k+1] − offsets[k] categories above 0.
 * @param terms accumulator; `information` is K × K with K = psi.length.
 */
export function addPcmBookletTerms(
  items: Int32Array,
  counts: Float64Array,
  psi: Float64Array,
  offsets: Int32Array,
  terms: PcmLikelihoodTerms,
): void {
  const n = items.length;
  const width = psi.length;
  // centring ability: mean step over the booklet's categories
  let t = 0;
  let steps = 0;
  for (const k of items) {
    const m = offsets[k + 1]! - offsets[k]!;
    t += psi[offsets[k]! + m - 1]!;
    steps += m;
  }
  t /= steps;
  const q: Float64Array[] = [];
  let logScale = 0;
  for (const k of items) {
    const m = offsets[k + 1]! - offsets[k]!;
    const exponents = new Float64Array(m + 1);
    let largest = 0;
    for (let h = 1; h <= m; h++) {
      exponents[h] = h * t - psi[offsets[k]! + h - 1]!;
      largest = Math.max(largest, exponents[h]!);
    }
    let total = 0;
    for (let h = 0; h <= m; h++) total += Math.exp(exponents[h]! - largest);
    logScale += largest + Math.log(total);
    q.push(exponents.map((e) => Math.exp(e - largest) / total));
  }
  const prefixes: Float64Array[] = [Float64Array.of(1)];
  for (let a = 0; a < n; a++) prefixes.push(addItem(prefixes[a]!, q[a]!));
  const suffixes: Float64Array[] = new Array(n + 1);
  suffixes[n] = Float64Array.of(1);
  for (let a = n - 1; a >= 0; a--) suffixes[a] = addItem(suffixes[a + 1]!, q[a]!);
  const total = prefixes[n]!;
  const top = total.length - 1;
  const weight = new Float64Array(top + 1);
  for (let r = 0; r <= top; r++) {
    const c = counts[r]!;
    if (c === 0) continue;
    const probability = total[r]!;
    if (!(probability > 0))
      throw new Error('calibratePcm lost precision in the elementary symmetric functions');
    weight[r] = c / probability;
    terms.logNormaliser += c * (Math.log(probability) + logScale - r * t);
  }
  // conditional[a][h * (top + 1) + r] = P(X_a = h | r) for h ≥ 1, where n_r > 0
  const stride = top + 1;
  const conditional: Float64Array[] = [];
  for (let a = 0; a < n; a++) {
    const others = convolve(prefixes[a]!, suffixes[a + 1]!);
    const m = q[a]!.length - 1;
    const table = new Float64Array((m + 1) * stride);
    for (let h = 1; h <= m; h++) {
      const slot = offsets[items[a]!]! + h - 1;
      let expected = 0;
      for (let r = h; r <= top; r++) {
        if (weight[r] === 0) continue;
        const s = r - h;
        if (s >= others.length) continue;
        const v = (q[a]![h]! * others[s]!) / total[r]!;
        table[h * stride + r] = v;
        expected += counts[r]! * v;
      }
      terms.expected[slot]! += expected;
    }
    conditional.push(table);
  }
  const information = terms.information;
  if (information === null) return;
  // within-item block: Σ_r n_r (δ_hl π_h − π_h π_l)
  for (let a = 0; a < n; a++) {
    const m = q[a]!.length - 1;
    const base = offsets[items[a]!]! - 1;
    const table = conditional[a]!;
    for (let h = 1; h <= m; h++)
      for (let l = 1; l <= m; l++) {
        let sum = 0;
        for (let r = 0; r <= top; r++) {
          const c = counts[r]!;
          if (c === 0) continue;
          const ph = table[h * stride + r]!;
          sum += c * ((h === l ? ph : 0) - ph * table[l * stride + r]!);
        }
        information[(base + h) * width + base + l]! += sum;
      }
  }
  // F_a(s) = Σ_u S_a(u) w(s + u): the weights pulled back through the suffix items a..n−1
  const pulled: Float64Array[] = new Array(n + 1);
  pulled[n] = Float64Array.from(weight);
  for (let a = n - 1; a >= 0; a--) {
    const next = pulled[a + 1]!;
    const qa = q[a]!;
    const here = new Float64Array(top + 1);
    for (let s = 0; s <= top; s++) {
      let sum = 0;
      for (let c = 0; c < qa.length && s + c <= top; c++) sum += qa[c]! * next[s + c]!;
      here[s] = sum;
    }
    pulled[a] = here;
  }
  for (let a = 0; a < n; a++) {
    const ma = q[a]!.length - 1;
    const baseA = offsets[items[a]!]! - 1;
    // running = score distribution of items 0..b−1 without a
    let running = prefixes[a]!;
    for (let b = a + 1; b < n; b++) {
      if (b > a + 1) running = addItem(running, q[b - 1]!);
      const mb = q[b]!.length - 1;
      const baseB = offsets[items[b]!]! - 1;
      const after = pulled[b + 1]!;
      for (let h = 1; h <= ma; h++)
        for (let l = 1; l <= mb; l++) {
          let joint = 0;
          for (let s = 0; s < running.length && s + h + l <= top; s++)
            joint += running[s]! * after[s + h + l]!;
          joint *= q[a]![h]! * q[b]![l]!;
          let product = 0;
          for (let r = 0; r <= top; r++) {
            const c = counts[r]!;
            if (c === 0) continue;
            product += c * conditional[a]![h * stride + r]! * conditional[b]![l * stride + r]!;
          }
          const covariance = joint - product;
          information[(baseA + h) * width + baseB + l]! += covariance;
          information[(baseB + l) * width + baseA + h]! += covariance;
        }
    }
  }
}
