/**
 * Simulation study of adaptive delivery: simulated audiences answer under the Rasch model, once
 * through adaptive attempts and once through fixed forms of the same bank, and the designs are
 * compared on the items needed for the same precision, the error of the final estimate against
 * the truth, and item exposure.
 *
 * Design of the comparison:
 * - Truth: each person's ability is drawn from the audience's N(mean, sd²); answers follow the
 *   Rasch model with the bank's difficulties (no parameter error: the bank is taken as true).
 * - Prior: each audience's own N(mean, sd²), as the cohort estimate of an earlier calibration
 *   would give it, unless `prior` fixes one prior for everyone. Every design uses the same prior.
 * - Fixed forms, one form for all audiences (so the comparison is what a team would run):
 *   `spanning` (spanning-form.ts: content-balanced, items at evenly spaced difficulty quantiles of
 *   each area; the headline comparison), `bestTargeted` (the order in which the selector itself
 *   takes items at the pooled audience mean with k = 1 and the same content balancing: a form
 *   peaked at the centre, the most demanding comparison for the centre audience) and `poolOrder`
 *   (the pool's own order, as the fixed design delivers a pool longer than the form).
 * - Same precision: a fixed design's length is the shortest L whose mean posterior SD over the
 *   audience is at most the adaptive attempts' mean posterior SD. On a fixed form the EAP and its
 *   SD depend on the raw score only, so each L needs only L + 1 EAP evaluations.
 * - Bound: `bound` (information-bound.ts) is the item ratio the bank and the content rule allow
 *   at best: the most informative items at each person's true ability against the spanning form,
 *   both in Fisher information at the truth.
 *
 * @see Weiss, D. J. (1982). Improving measurement quality and efficiency with adaptive testing.
 *   Applied Psychological Measurement 6(4), 473–492 (adaptive tests needing about half the items of
 *   conventional tests for equal reliability).
 * @see Kingsbury, G. G., & Zara, A. R. (1989). Applied Measurement in Education 2(4), 359–375.
 */
import { estimateAbilityEap } from '../../scoring/rasch/estimate-ability-eap.js';
import { seededRandom } from '../../scoring/seeded-random.js';
import type { AdaptiveBank } from './adaptive-bank.js';
import type { AdaptiveSettings } from './adaptive-settings.js';
import { advance, nextStep, type StopReason, startAdaptiveState } from './adaptive-state.js';
import { type InformationBound, informationBound } from './information-bound.js';
import { selectNextItem } from './select-next-item.js';
import { spanningForm } from './spanning-form.js';

/** One simulated audience: label, size and generating ability distribution (logits). */
export interface SimulatedAudience {
  readonly label: string;
  readonly mean: number;
  readonly sd: number;
  readonly persons: number;
}

export interface SimulationInput {
  readonly bank: AdaptiveBank;
  readonly audiences: readonly SimulatedAudience[];
  readonly settings: AdaptiveSettings;
  readonly seed: number;
  /** One prior for everyone; absent = each audience's own N(mean, sd²). */
  readonly prior?: { readonly mean: number; readonly sd: number };
  /** Also run the fixed forms and the information bound (default true; exposure tuning turns it off). */
  readonly compareFixed?: boolean;
}

/** Accuracy of the final estimates of one design for one audience. */
export interface DesignAccuracy {
  /** Mean items per person. */
  readonly items: number;
  /** Mean posterior SD at the end. */
  readonly meanStandardError: number;
  /** √mean (estimate − truth)². */
  readonly rmse: number;
  /** mean (estimate − truth). */
  readonly bias: number;
  /** Share of persons whose final posterior SD is at most the SE target. */
  readonly reachedTarget: number;
  /** Largest share of the audience that saw one item. */
  readonly maxExposure: number;
  /** Share of the bank no one in the audience saw. */
  readonly neverUsed: number;
}

export type FixedFormAccuracy = DesignAccuracy & { readonly length: number };

export type AdaptiveAccuracy = DesignAccuracy & {
  readonly stopReasons: Readonly<Record<StopReason, number>>;
};

/** The fixed designs compared, in table order (see the file comment). */
export const fixedDesigns = ['spanning', 'bestTargeted', 'poolOrder'] as const;
export type FixedDesign = (typeof fixedDesigns)[number];

export interface AudienceResult {
  readonly audience: SimulatedAudience;
  readonly adaptive: AdaptiveAccuracy;
  /** The information bound on the item ratio (null when fixed forms are off). */
  readonly bound: InformationBound | null;
  /** Each fixed design at the adaptive precision; null when even the whole bank does not reach it. */
  readonly fixed: Readonly<Record<FixedDesign, FixedFormAccuracy | null>>;
  /** Adaptive mean items / fixed length, per fixed design (null without such a form). */
  readonly itemRatio: Readonly<Record<FixedDesign, number | null>>;
}

export interface SimulationResult {
  readonly audiences: readonly AudienceResult[];
  /** Adaptive exposure rate of each bank item over every simulated person. */
  readonly exposure: Float64Array;
  /** Share of persons for whom the selector chose each item (before the Sympson–Hetter lottery). */
  readonly selectionRate: Float64Array;
  readonly maxExposure: number;
  readonly neverUsed: number;
  /** Mean adaptive items per person over everyone: the mean exposure is this / bank size. */
  readonly meanItems: number;
  /** Bank indices of the best-targeted order. */
  readonly fixedOrder: Int32Array;
  readonly persons: number;
}

/**
 * Runs the simulation study.
 *
 * Cost: persons × adaptive length × (selection + one EAP over the items so far), plus, per audience
 * and fixed design, Σ_L (L + 1) EAP evaluations up to the length found, plus the bound.
 *
 * @param input bank, audiences, adaptive settings, seed, optional common prior.
 * @returns per-audience accuracy of every design and the adaptive exposure rates.
 * @throws when there is no audience or an audience has no persons or a non-positive SD.
 * @example
 * simulateAdaptive({ bank, audiences: [{ label: 'mean 0', mean: 0, sd: 1, persons: 500 }],
 *   settings, seed: 1 }).audiences[0].itemRatio.spanning; // e.g. 0.6
 */
export function simulateAdaptive(input: SimulationInput): SimulationResult {
  const { bank, audiences, settings, seed } = input;
  if (audiences.length === 0) throw new Error('simulateAdaptive requires at least one audience');
  for (const a of audiences) {
    if (!Number.isInteger(a.persons) || a.persons < 1 || !(a.sd > 0)) {
      throw new Error('simulateAdaptive requires audiences with persons >= 1 and sd > 0');
    }
  }
  const itemCount = bank.ids.length;
  const totalPersons = audiences.reduce((sum, a) => sum + a.persons, 0);
  const pooledMean = audiences.reduce((sum, a) => sum + a.mean * a.persons, 0) / totalPersons;
  const fixedOrder = fixedFormOrder(bank, pooledMean);
  const bankOrder = Int32Array.from({ length: itemCount }, (_, i) => i);
  const formsOf: Record<FixedDesign, (length: number) => Int32Array> = {
    spanning: (length) => spanningForm(bank, length),
    bestTargeted: (length) => fixedOrder.subarray(0, length),
    poolOrder: (length) => bankOrder.subarray(0, length),
  };
  const longest: Record<FixedDesign, number> = {
    spanning: spanningForm(bank, itemCount).length,
    bestTargeted: fixedOrder.length,
    poolOrder: itemCount,
  };
  const administeredAll = new Float64Array(itemCount);
  const selectedAll = new Float64Array(itemCount);
  let itemsAll = 0;
  const compare = input.compareFixed ?? true;
  const results = audiences.map((audience, a): AudienceResult => {
    const prior = input.prior ?? { mean: audience.mean, sd: audience.sd };
    const truthRandom = seededRandom(mix(seed, a, 0));
    const truth = Float64Array.from(
      { length: audience.persons },
      () => audience.mean + audience.sd * truthRandom.normal(),
    );
    const adaptive = runAdaptive(bank, settings, truth, prior, mix(seed, a, 1));
    for (let i = 0; i < itemCount; i++) {
      administeredAll[i]! += adaptive.administered[i]!;
      selectedAll[i]! += adaptive.selected[i]!;
    }
    itemsAll += adaptive.accuracy.items * audience.persons;
    const fixedAt = (design: FixedDesign, target: number) =>
      runFixed(
        bank,
        formsOf[design],
        longest[design],
        truth,
        prior,
        target,
        settings.seTarget,
        mix(seed, a, 2),
      );
    const target = adaptive.accuracy.meanStandardError;
    const fixed = {
      spanning: compare ? fixedAt('spanning', target) : null,
      bestTargeted: compare ? fixedAt('bestTargeted', target) : null,
      poolOrder: compare ? fixedAt('poolOrder', target) : null,
    };
    const ratio = (form: FixedFormAccuracy | null) =>
      form === null ? null : adaptive.accuracy.items / form.length;
    return {
      audience,
      adaptive: adaptive.accuracy,
      bound: compare ? informationBound(bank, truth, prior, settings) : null,
      fixed,
      itemRatio: {
        spanning: ratio(fixed.spanning),
        bestTargeted: ratio(fixed.bestTargeted),
        poolOrder: ratio(fixed.poolOrder),
      },
    };
  });
  const exposure = administeredAll.map((count) => count / totalPersons);
  return {
    audiences: results,
    exposure,
    selectionRate: selectedAll.map((count) => count / totalPersons),
    maxExposure: Math.max(...exposure),
    neverUsed: exposure.filter((rate) => rate === 0).length / itemCount,
    meanItems: itemsAll / totalPersons,
    fixedOrder,
    persons: totalPersons,
  };
}

/** Deterministic seed for (seed, audience, stream). */
function mix(seed: number, audience: number, stream: number): number {
  let h = (seed >>> 0) ^ Math.imul(audience + 1, 0x85ebca6b) ^ Math.imul(stream + 1, 0xc2b2ae35);
  h = Math.imul(h ^ (h >>> 16), 0x7feb352d);
  return (h ^ (h >>> 15)) >>> 0;
}

/** The whole bank in the order the selector takes it at a fixed ability with k = 1. */
export function fixedFormOrder(bank: AdaptiveBank, ability: number): Int32Array {
  const unavailable = new Uint8Array(bank.ids.length);
  const areaCounts = new Int32Array(bank.areas.length);
  const order: number[] = [];
  const random = { uniform: () => 0 };
  for (;;) {
    const selection = selectNextItem(bank, { ability, unavailable, areaCounts, randomesque: 1, random });
    if (selection === null) break;
    order.push(selection.index);
    unavailable[selection.index] = 1;
    areaCounts[selection.area]!++;
  }
  return Int32Array.from(order);
}

function runAdaptive(
  bank: AdaptiveBank,
  settings: AdaptiveSettings,
  truth: Float64Array,
  prior: { mean: number; sd: number },
  seed: number,
) {
  const itemCount = bank.ids.length;
  const administered = new Float64Array(itemCount);
  const selected = new Float64Array(itemCount);
  const stopReasons: Record<StopReason, number> = {
    'time-limit': 0,
    'max-items': 0,
    'se-target': 0,
    'pool-exhausted': 0,
  };
  const answers = seededRandom(seed);
  let items = 0;
  let seSum = 0;
  let errorSum = 0;
  let squaredSum = 0;
  let reached = 0;
  for (let p = 0; p < truth.length; p++) {
    let state = startAdaptiveState({ ...prior, source: 'cohort' }, mix(seed, p, 3));
    for (;;) {
      const step = nextStep(state, bank, settings, 0);
      if (step.kind === 'stop') {
        stopReasons[step.reason]++;
        break;
      }
      const i = bank.indexOf.get(step.itemId)!;
      administered[i]!++;
      selected[i]!++;
      for (const id of step.passedOver) selected[bank.indexOf.get(id)!]!++;
      const right = answers.uniform() < 1 / (1 + Math.exp(step.difficulty - truth[p]!));
      state = advance(state, step, right ? 1 : 0);
    }
    items += state.items.length;
    seSum += state.standardError;
    const error = state.ability - truth[p]!;
    errorSum += error;
    squaredSum += error * error;
    if (state.standardError <= settings.seTarget) reached++;
  }
  const n = truth.length;
  return {
    administered,
    selected,
    accuracy: {
      items: items / n,
      meanStandardError: seSum / n,
      rmse: Math.sqrt(squaredSum / n),
      bias: errorSum / n,
      reachedTarget: reached / n,
      maxExposure: Math.max(...administered) / n,
      neverUsed: administered.filter((count) => count === 0).length / itemCount,
      stopReasons,
    },
  };
}

function runFixed(
  bank: AdaptiveBank,
  formAt: (length: number) => Int32Array,
  longest: number,
  truth: Float64Array,
  prior: { mean: number; sd: number },
  targetMeanSe: number,
  seTarget: number,
  seed: number,
): FixedFormAccuracy | null {
  const n = truth.length;
  const answers = seededRandom(seed);
  const rawScore = new Int32Array(n);
  for (let length = 1; length <= longest; length++) {
    // Each length is a form of its own (spanning forms are not nested): fresh answers to all of it.
    const form = Float64Array.from(formAt(length), (i) => bank.difficulty[i]!);
    rawScore.fill(0);
    for (let p = 0; p < n; p++) {
      for (let k = 0; k < form.length; k++) {
        if (answers.uniform() < 1 / (1 + Math.exp(form[k]! - truth[p]!))) rawScore[p]!++;
      }
    }
    // EAP and posterior SD for every raw score 0..L on the form.
    const byScore = Array.from({ length: form.length + 1 }, (_, score) => {
      const scores = new Uint8Array(form.length);
      scores.fill(1, 0, score);
      return estimateAbilityEap(form, scores, { mean: prior.mean, sd: prior.sd, quadraturePoints: 21 });
    });
    let seSum = 0;
    for (let p = 0; p < n; p++) seSum += byScore[rawScore[p]!]!.standardError;
    if (seSum / n > targetMeanSe) continue;
    let errorSum = 0;
    let squaredSum = 0;
    let reached = 0;
    for (let p = 0; p < n; p++) {
      const estimate = byScore[rawScore[p]!]!;
      const error = estimate.ability - truth[p]!;
      errorSum += error;
      squaredSum += error * error;
      if (estimate.standardError <= seTarget) reached++;
    }
    return {
      length: form.length,
      items: form.length,
      meanStandardError: seSum / n,
      rmse: Math.sqrt(squaredSum / n),
      bias: errorSum / n,
      reachedTarget: reached / n,
      maxExposure: 1,
      neverUsed: (bank.ids.length - form.length) / bank.ids.length,
    };
  }
  return null;
}
