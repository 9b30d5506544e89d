/**
 * The Rasch marginal log-likelihood over score cells, with its gradient, its exact second
 * derivatives (observed information) and the expected counts of the EM algorithm.
 *
 * Abilities of group g are θ = μ_g + σ_g z with z ~ N(0, 1) integrated by Gauss-Hermite
 * quadrature on fixed standard nodes z_q, so μ and σ enter only through θ_q. For one cell
 * (answered items S, raw score r), with P_iq = P(θ_q − b_i) and E_q = Σ_{i∈S} P_iq:
 *   ∂ℓ_q/∂b_i = P_iq,  ∂ℓ_q/∂μ = r − E_q,  ∂ℓ_q/∂σ = z_q (r − E_q),
 * and the second derivatives are −P_iq Q_iq on the item diagonal, P_iq Q_iq (item, μ),
 * z_q P_iq Q_iq (item, σ), −W_q, −z_q W_q, −z_q² W_q for (μ,μ), (μ,σ), (σ,σ), W_q = Σ P_iq Q_iq.
 * Louis' identity gives the Hessian of the cell's marginal log-likelihood as
 * E_post[∇²ℓ_q] + Var_post[∇ℓ_q]; the linear term −Σ x_i b_i drops out of both.
 *
 * @see Bock, R. D., & Aitkin, M. (1981). Marginal maximum likelihood estimation of item
 *   parameters: application of an EM algorithm. Psychometrika 46, 443–459.
 * @see Louis, T. A. (1982). Finding the observed information matrix when using the EM
 *   algorithm. JRSS B 44, 226–233, equation (3.1).
 */
import type { MmlScoreGroups } from './mml-score-groups.js';

/** Parameter vector layout: items 0..I−1, then μ_g at I+2g and σ_g at I+2g+1. */
export interface MmlParameters {
  readonly difficulty: Float64Array;
  readonly mean: Float64Array;
  readonly sd: Float64Array;
}

export interface MmlEvaluation {
  readonly logLikelihood: number;
  /** Gradient over the full layout (length I + 2G). */
  readonly gradient: Float64Array;
  /** Row-major (I + 2G)² Hessian, or null when not asked for. */
  readonly hessian: Float64Array | null;
  /** Expected persons per (item, group, node), index (i·G + g)·Q + q; null unless asked. */
  readonly itemNodeCounts: Float64Array | null;
  /** Per group: persons, Σ posterior z, Σ posterior z²; index 3g..3g+2; null unless asked. */
  readonly groupMoments: Float64Array | null;
}

/**
 * Evaluates the marginal log-likelihood and, on request, its Hessian and the EM counts.
 *
 * @param cells score cells from collectMmlScoreGroups.
 * @param parameters current difficulties, group means and SDs.
 * @param z standard-normal quadrature nodes.
 * @param logWeight log of the standard-normal quadrature weights.
 * @param want which extras to compute.
 * @returns log-likelihood, gradient and the requested extras.
 * @example
 * // One person who got one item at b = 0 right, θ ~ N(0,1): L = 1/2 by symmetry.
 * const cells = collectMmlScoreGroups(
 *   { personIds: ['p'], itemIds: ['a'], scores: Uint8Array.of(1) }, new Int32Array(1), 1, new Set(['a']));
 * const { nodes, weights } = normalQuadrature(41);
 * evaluateMmlMarginal(cells, { difficulty: Float64Array.of(0), mean: Float64Array.of(0),
 *   sd: Float64Array.of(1) }, nodes, weights.map(Math.log), { hessian: false, em: false })
 *   .logLikelihood; // −0.6931471805599453 (= log 0.5)
 */
export function evaluateMmlMarginal(
  cells: MmlScoreGroups,
  parameters: MmlParameters,
  z: Float64Array,
  logWeight: Float64Array,
  want: { hessian: boolean; em: boolean },
): MmlEvaluation {
  const itemCount = cells.itemIds.length;
  const groupCount = parameters.mean.length;
  const dim = itemCount + 2 * groupCount;
  const nodes = z.length;
  const b = parameters.difficulty;
  const gradient = new Float64Array(dim);
  const hessian = want.hessian ? new Float64Array(dim * dim) : null;
  const itemNodeCounts = want.em ? new Float64Array(itemCount * groupCount * nodes) : null;
  const groupMoments = want.em ? new Float64Array(3 * groupCount) : null;

  let maxItems = 0;
  for (const unit of cells.units) maxItems = Math.max(maxItems, unit.items.length);
  // P(θ_gq − b_i) and log(1 + e^(θ_gq − b_i)) depend only on (group, item, node): tabulate them
  // once, so a cell only sums table rows (adaptive data have about one cell per person).
  const tableSize = itemCount * nodes;
  const probTable = new Float64Array(groupCount * tableSize);
  const softplusTable = new Float64Array(groupCount * tableSize);
  for (let g = 0; g < groupCount; g++) {
    const mu = parameters.mean[g]!;
    const sigma = parameters.sd[g]!;
    for (let i = 0; i < itemCount; i++) {
      const row = g * tableSize + i * nodes;
      const bi = b[i]!;
      for (let q = 0; q < nodes; q++) {
        const x = mu + sigma * z[q]! - bi;
        if (x > 0) {
          const e = Math.exp(-x);
          probTable[row + q] = 1 / (1 + e);
          softplusTable[row + q] = x + Math.log1p(e);
        } else {
          const e = Math.exp(x);
          probTable[row + q] = e / (1 + e);
          softplusTable[row + q] = Math.log1p(e);
        }
      }
    }
  }
  const theta = new Float64Array(nodes);
  const base = new Float64Array(nodes);
  const expected = new Float64Array(nodes);
  const info = new Float64Array(nodes);
  const post = new Float64Array(nodes);
  const sumA = new Float64Array(nodes);
  const sumB = new Float64Array(nodes);
  const sumC = new Float64Array(nodes);
  const meanScore = new Float64Array(maxItems + 2);
  const globalIndex = new Int32Array(maxItems + 2);
  const rowOf = new Int32Array(maxItems);

  let logLikelihood = 0;
  for (const unit of cells.units) {
    const items = unit.items;
    const k = items.length;
    const g = unit.group;
    const mu = parameters.mean[g]!;
    const sigma = parameters.sd[g]!;
    for (let q = 0; q < nodes; q++) {
      theta[q] = mu + sigma * z[q]!;
      base[q] = logWeight[q]!;
      expected[q] = 0;
      info[q] = 0;
      sumA[q] = 0;
      sumB[q] = 0;
      sumC[q] = 0;
    }
    for (let j = 0; j < k; j++) {
      const row = g * tableSize + items[j]! * nodes;
      rowOf[j] = row;
      for (let q = 0; q < nodes; q++) {
        const p = probTable[row + q]!;
        base[q]! -= softplusTable[row + q]!;
        expected[q]! += p;
        info[q]! += p * (1 - p);
      }
    }
    const muIndex = itemCount + 2 * g;
    const sdIndex = muIndex + 1;
    for (let j = 0; j < k; j++) globalIndex[j] = items[j]!;
    globalIndex[k] = muIndex;
    globalIndex[k + 1] = sdIndex;

    const counts = unit.counts;
    for (let r = 0; r <= k; r++) {
      const n = counts[r]!;
      if (n === 0) continue;
      let top = -Infinity;
      for (let q = 0; q < nodes; q++) {
        const v = base[q]! + r * theta[q]!;
        post[q] = v;
        if (v > top) top = v;
      }
      let total = 0;
      for (let q = 0; q < nodes; q++) {
        const e = Math.exp(post[q]! - top);
        post[q] = e;
        total += e;
      }
      logLikelihood += n * (top + Math.log(total));
      const inv = 1 / total;
      let gMu = 0;
      let gSd = 0;
      let m1 = 0;
      let m2 = 0;
      for (let q = 0; q < nodes; q++) {
        const w = post[q]! * inv;
        post[q] = w;
        const resid = r - expected[q]!;
        gMu += w * resid;
        gSd += w * z[q]! * resid;
        m1 += w * z[q]!;
        m2 += w * z[q]! * z[q]!;
        const nw = n * w;
        sumA[q]! += nw;
        sumB[q]! += nw * resid;
        sumC[q]! += nw * resid * resid;
      }
      for (let j = 0; j < k; j++) {
        const row = rowOf[j]!;
        let m = 0;
        for (let q = 0; q < nodes; q++) m += post[q]! * probTable[row + q]!;
        meanScore[j] = m;
        gradient[items[j]!]! += n * m;
      }
      meanScore[k] = gMu;
      meanScore[k + 1] = gSd;
      gradient[muIndex]! += n * gMu;
      gradient[sdIndex]! += n * gSd;
      if (groupMoments) {
        groupMoments[3 * g]! += n;
        groupMoments[3 * g + 1]! += n * m1;
        groupMoments[3 * g + 2]! += n * m2;
      }
      if (hessian) {
        // − n ḡ ḡᵀ (the posterior mean of the score, squared).
        for (let a = 0; a < k + 2; a++) {
          const rowOffset = globalIndex[a]! * dim;
          const va = n * meanScore[a]!;
          for (let c = 0; c < k + 2; c++) hessian[rowOffset + globalIndex[c]!]! -= va * meanScore[c]!;
        }
      }
    }

    if (itemNodeCounts) {
      for (let j = 0; j < k; j++) {
        const offset = (items[j]! * groupCount + g) * nodes;
        for (let q = 0; q < nodes; q++) itemNodeCounts[offset + q]! += sumA[q]!;
      }
    }
    if (hessian) {
      // Σ_q Σ_r n_r post_rq (g_q g_qᵀ + ∇²ℓ_q), aggregated over raw scores.
      let muMu = 0;
      let muSd = 0;
      let sdSd = 0;
      for (let q = 0; q < nodes; q++) {
        const v = sumC[q]! - sumA[q]! * info[q]!;
        muMu += v;
        muSd += z[q]! * v;
        sdSd += z[q]! * z[q]! * v;
      }
      hessian[muIndex * dim + muIndex]! += muMu;
      hessian[muIndex * dim + sdIndex]! += muSd;
      hessian[sdIndex * dim + muIndex]! += muSd;
      hessian[sdIndex * dim + sdIndex]! += sdSd;
      for (let j = 0; j < k; j++) {
        const rowJ = rowOf[j]!;
        const gj = items[j]!;
        let withMu = 0;
        let withSd = 0;
        let diagonal = 0;
        for (let q = 0; q < nodes; q++) {
          const p = probTable[rowJ + q]!;
          const pq = p * (1 - p);
          const v = sumB[q]! * p + sumA[q]! * pq;
          withMu += v;
          withSd += z[q]! * v;
          diagonal += sumA[q]! * (p * p - pq);
        }
        hessian[gj * dim + muIndex]! += withMu;
        hessian[muIndex * dim + gj]! += withMu;
        hessian[gj * dim + sdIndex]! += withSd;
        hessian[sdIndex * dim + gj]! += withSd;
        hessian[gj * dim + gj]! += diagonal;
        for (let l = j + 1; l < k; l++) {
          const rowL = rowOf[l]!;
          let v = 0;
          for (let q = 0; q < nodes; q++) v += sumA[q]! * probTable[rowJ + q]! * probTable[rowL + q]!;
          const gl = items[l]!;
          hessian[gj * dim + gl]! += v;
          hessian[gl * dim + gj]! += v;
        }
      }
    }
  }
  for (let i = 0; i < itemCount; i++) {
    const s = cells.itemCorrect[i]!;
    logLikelihood -= s * b[i]!;
    gradient[i]! -= s;
  }
  return { logLikelihood, gradient, hessian, itemNodeCounts, groupMoments };
}
