/**
 * The serialisable state of one adaptive attempt and its two pure transitions:
 * {@link nextStep} (the next item, or why to stop) and {@link advance} (record an answer and
 * update the EAP estimate). The state is plain JSON, so the delivery layer stores it in the
 * attempt's form and rebuilds nothing between requests.
 *
 * Determinism: the random draws of step s come from a generator seeded with (seed, s), so the
 * same state, bank and settings always give the same next item.
 *
 * @see Bock, R. D., & Mislevy, R. J. (1982). Adaptive EAP estimation of ability in a
 *   microcomputer environment. Applied Psychological Measurement 6, 431–444 (EAP after each
 *   response, posterior SD as the standard error).
 * @see Linacre, J. M. (2006). Computer-adaptive tests (CAT), standard errors and stopping rules.
 *   Rasch Measurement Transactions 20:2 (stop on a target SE, with minimum and maximum lengths).
 */
import { estimateAbilityEap } from '../../scoring/rasch/estimate-ability-eap.js';
import { seededRandom } from '../../scoring/seeded-random.js';
import type { AdaptiveBank } from './adaptive-bank.js';
import type { AdaptivePrior } from './adaptive-prior.js';
import type { AdaptiveSettings } from './adaptive-settings.js';
import { selectNextItem } from './select-next-item.js';

/** One item given in the attempt, with the difficulty used at the time. */
export interface AdministeredItem {
  readonly itemId: string;
  readonly area: string;
  readonly difficulty: number;
  readonly score: 0 | 1;
}

export interface AdaptiveState {
  readonly version: 1;
  /** uint32 seed of the attempt's random draws. */
  readonly seed: number;
  readonly prior: AdaptivePrior;
  /** Items given, in order, with their scores. */
  readonly items: readonly AdministeredItem[];
  /** Items exposure control passed over: never offered again in this attempt. */
  readonly passedOver: readonly string[];
  /** Items given per area key. */
  readonly areaCounts: Readonly<Record<string, number>>;
  /** Current EAP estimate, logits (the prior mean before any answer). */
  readonly ability: number;
  /** Current posterior SD (the prior SD before any answer). */
  readonly standardError: number;
}

export const stopReasons = ['time-limit', 'max-items', 'se-target', 'pool-exhausted'] as const;
export type StopReason = (typeof stopReasons)[number];

/** The next item to present: everything {@link advance} needs once it is answered. */
export interface ItemStep {
  readonly kind: 'item';
  readonly itemId: string;
  readonly area: string;
  readonly difficulty: number;
  /** Item ids exposure control passed over on the way. */
  readonly passedOver: readonly string[];
}

export type NextStep = ItemStep | { readonly kind: 'stop'; readonly reason: StopReason };

/**
 * A fresh attempt's state.
 *
 * @param prior the prior (see adaptive-prior.ts).
 * @param seed any integer; taken as uint32.
 * @throws when the prior is not a finite mean with a positive SD.
 * @example
 * startAdaptiveState({ mean: 0, sd: 1.5, source: 'default' }, 7).standardError; // 1.5
 */
export function startAdaptiveState(prior: AdaptivePrior, seed: number): AdaptiveState {
  if (!Number.isFinite(prior.mean) || !(prior.sd > 0) || !Number.isFinite(prior.sd)) {
    throw new Error('startAdaptiveState requires a prior with a finite mean and a positive sd');
  }
  return {
    version: 1,
    seed: seed >>> 0,
    prior,
    items: [],
    passedOver: [],
    areaCounts: {},
    ability: prior.mean,
    standardError: prior.sd,
  };
}

/**
 * Which stop rule, if any, ends the attempt now. Checked in this order: time limit, maximum
 * items, SE target (only once `minItems` are given). "Pool exhausted" is decided by selection.
 *
 * @param state the attempt.
 * @param settings stop rules.
 * @param elapsedSeconds seconds since the attempt's first item was shown.
 * @returns the reason, or null to go on.
 * @example
 * stopReason({ ...state, standardError: 0.44, items: sixItems }, { seTarget: 0.45, minItems: 5,
 *   maxItems: 30, randomesque: 5 }, 60); // 'se-target'
 */
export function stopReason(
  state: Pick<AdaptiveState, 'items' | 'standardError'>,
  settings: AdaptiveSettings,
  elapsedSeconds: number,
): StopReason | null {
  if (settings.timeLimitSeconds !== undefined && elapsedSeconds >= settings.timeLimitSeconds) {
    return 'time-limit';
  }
  const given = state.items.length;
  if (given >= settings.maxItems) return 'max-items';
  if (given >= settings.minItems && state.standardError <= settings.seTarget) return 'se-target';
  return null;
}

/**
 * The next step of an attempt: an item, or the reason to stop.
 *
 * Items of the state that are no longer in the bank (retired since) still count toward the
 * area counts and the estimate; they simply cannot be offered again.
 *
 * @param state the attempt.
 * @param bank the study's adaptive bank (eligible, calibrated items).
 * @param settings stop rules, randomesque k, optional Sympson–Hetter K_i.
 * @param elapsedSeconds seconds since the first item was shown (0 before it).
 * @returns `{ kind: 'item', ... }` or `{ kind: 'stop', reason }`.
 * @example
 * nextStep(startAdaptiveState(prior, 1), bank, settings, 0); // { kind: 'item', itemId: ..., ... }
 */
export function nextStep(
  state: AdaptiveState,
  bank: AdaptiveBank,
  settings: AdaptiveSettings,
  elapsedSeconds = 0,
): NextStep {
  const reason = stopReason(state, settings, elapsedSeconds);
  if (reason !== null) return { kind: 'stop', reason };
  const unavailable = new Uint8Array(bank.ids.length);
  for (const item of state.items) {
    const i = bank.indexOf.get(item.itemId);
    if (i !== undefined) unavailable[i] = 1;
  }
  for (const id of state.passedOver) {
    const i = bank.indexOf.get(id);
    if (i !== undefined) unavailable[i] = 1;
  }
  const areaCounts = bank.areas.map((key) => state.areaCounts[key] ?? 0);
  const selection = selectNextItem(bank, {
    ability: state.ability,
    unavailable,
    areaCounts,
    randomesque: settings.randomesque,
    exposureControl: settings.exposureControl,
    random: seededRandom(stepSeed(state.seed, state.items.length)),
  });
  if (selection === null) return { kind: 'stop', reason: 'pool-exhausted' };
  return {
    kind: 'item',
    itemId: bank.ids[selection.index]!,
    area: bank.areas[selection.area]!,
    difficulty: bank.difficulty[selection.index]!,
    passedOver: selection.passedOver.map((i) => bank.ids[i]!),
  };
}

/**
 * Records the answer to an item step and updates the EAP estimate and posterior SD from every
 * answer so far under the attempt's prior.
 *
 * @param state the attempt.
 * @param step the item step that was presented (from {@link nextStep}).
 * @param score 1 right, 0 wrong or "I don't know".
 * @param options Gauss–Hermite points of the EAP (default 21: the rule is centred and scaled on
 *   the posterior mode, and 21 points agree with 41 to 1e-9 logits at a quarter of the cost).
 * @returns the new state (the old one is not changed).
 * @throws when the item was already given or the score is not 0 or 1.
 * @example
 * advance(startAdaptiveState({ mean: 0, sd: 1, source: 'default' }, 1),
 *   { kind: 'item', itemId: 'a', area: 'all', difficulty: 0, passedOver: [] }, 1).ability; // 0.4132
 */
export function advance(
  state: AdaptiveState,
  step: ItemStep,
  score: 0 | 1,
  options: { readonly quadraturePoints?: number } = {},
): AdaptiveState {
  if (score !== 0 && score !== 1) throw new Error('advance requires a score of 0 or 1');
  if (state.items.some((item) => item.itemId === step.itemId)) {
    throw new Error(`advance requires an item not yet given (${step.itemId})`);
  }
  const items = [
    ...state.items,
    { itemId: step.itemId, area: step.area, difficulty: step.difficulty, score },
  ];
  const estimate = estimateAbilityEap(
    Float64Array.from(items, (item) => item.difficulty),
    Uint8Array.from(items, (item) => item.score),
    { mean: state.prior.mean, sd: state.prior.sd, quadraturePoints: options.quadraturePoints ?? 21 },
  );
  return {
    ...state,
    items,
    passedOver: [...state.passedOver, ...step.passedOver],
    areaCounts: { ...state.areaCounts, [step.area]: (state.areaCounts[step.area] ?? 0) + 1 },
    ability: estimate.ability,
    standardError: estimate.standardError,
  };
}

/** Seed of step s's generator: the attempt seed mixed with s (golden-ratio increment). */
export function stepSeed(seed: number, step: number): number {
  return (seed ^ Math.imul(step + 1, 0x9e3779b9)) >>> 0;
}
