/**
 * How few items any adaptive design could need on this bank, from Fisher information alone: the
 * bound the simulation study compares its item ratio with.
 *
 * For a person of true ability θ the most informative set of n items is the n items with the
 * largest P(1 − P) at θ (under the content rule: each area's quota filled with its own most
 * informative items, quotas as the Kingsbury–Zara rule sets them). Counting the prior's precision
 * 1/σ², that person needs the smallest n with 1/σ² + Σ I_i(θ) ≥ 1/SE², at most `maxItems`. A fixed
 * form gives everyone 1/σ² + I_form(θ). The bound's ratio is the mean n over the audience divided
 * by the length of the spanning form whose mean 1/√(1/σ² + I_form(θ)) is at most the bound's mean
 * SE. No selection rule can do better in information: an adaptive design only approaches it, as
 * its estimate of θ settles.
 *
 * Why not simulate selection at the true θ instead: the SE stop rule reads the posterior SD, which
 * is 1/√(information at the estimate); items chosen at the estimate shrink it faster than items
 * chosen at the truth, so such a simulation can need more items than the adaptive attempts.
 *
 * @see Lord, F. M. (1980). Applications of item response theory to practical testing problems
 *   (information, peaked and adaptive tests; from memory).
 * @see Kingsbury, G. G., & Zara, A. R. (1989). Applied Measurement in Education 2(4), 359–375.
 */
import type { AdaptiveBank } from './adaptive-bank.js';
import { selectNextItem } from './select-next-item.js';
import { spanningForm } from './spanning-form.js';

export interface InformationBound {
  /** Mean items the most informative items at each true ability need, content rule kept. */
  readonly items: number;
  /** Mean SE 1/√(1/σ² + Σ I) those items reach. */
  readonly meanStandardError: number;
  /** Length of the spanning form with a mean SE at most that (null: the whole bank does not). */
  readonly spanningLength: number | null;
  /** items / spanningLength. */
  readonly ratio: number | null;
  /** The same without the content rule (the best items of the whole bank). */
  readonly itemsWithoutContentRule: number;
  readonly ratioWithoutContentRule: number | null;
}

const information = (ability: number, difficulty: number) => {
  const p = 1 / (1 + Math.exp(difficulty - ability));
  return p * (1 - p);
};

/**
 * Computes the bound for one audience.
 *
 * Cost O(persons · maxItems · items) for the selections plus O(persons · L²) for the forms.
 *
 * @param bank the adaptive bank (targets = the content rule).
 * @param truth the audience's true abilities.
 * @param prior the prior SD (its mean does not change information).
 * @param rules the SE target and the largest number of items.
 * @throws when there is no person or the prior SD or SE target is not positive.
 * @example
 * informationBound(bank, truth, { sd: 1 }, { seTarget: 0.45, maxItems: 30 }).ratio; // e.g. 0.83
 */
export function informationBound(
  bank: AdaptiveBank,
  truth: Float64Array,
  prior: { readonly sd: number },
  rules: { readonly seTarget: number; readonly maxItems: number },
): InformationBound {
  if (truth.length === 0) throw new Error('informationBound requires at least one person');
  if (!(prior.sd > 0) || !(rules.seTarget > 0)) {
    throw new Error('informationBound requires a positive prior SD and SE target');
  }
  const start = 1 / (prior.sd * prior.sd);
  const needed = 1 / (rules.seTarget * rules.seTarget);
  const itemCount = bank.ids.length;
  const unavailable = new Uint8Array(itemCount);
  const areaCounts = new Int32Array(bank.areas.length);
  const first = { uniform: () => 0 };
  const sortedInformation = new Float64Array(itemCount);
  let deliverable = 0;
  for (let i = 0; i < itemCount; i++) if (bank.targets[bank.areaOf[i]!]! > 0) deliverable++;
  let items = 0;
  let seSum = 0;
  let freeItems = 0;
  let freeSeSum = 0;
  for (const theta of truth) {
    unavailable.fill(0);
    areaCounts.fill(0);
    let precision = start;
    let n = 0;
    while (precision < needed && n < rules.maxItems) {
      const s = selectNextItem(bank, {
        ability: theta,
        unavailable,
        areaCounts,
        randomesque: 1,
        random: first,
      });
      if (s === null) break;
      unavailable[s.index] = 1;
      areaCounts[s.area]!++;
      precision += information(theta, bank.difficulty[s.index]!);
      n++;
    }
    items += n;
    seSum += 1 / Math.sqrt(precision);
    // Without the rule: every item the study may give (areas with target 0 are never given).
    for (let i = 0; i < itemCount; i++) {
      sortedInformation[i] = bank.targets[bank.areaOf[i]!]! > 0 ? information(theta, bank.difficulty[i]!) : 0;
    }
    sortedInformation.sort().reverse();
    let free = start;
    let m = 0;
    while (free < needed && m < Math.min(rules.maxItems, deliverable)) free += sortedInformation[m++]!;
    freeItems += m;
    freeSeSum += 1 / Math.sqrt(free);
  }
  const persons = truth.length;
  const meanSe = seSum / persons;
  const spanningLength = spanningLengthFor(bank, truth, start, meanSe);
  const freeLength = spanningLengthFor(bank, truth, start, freeSeSum / persons);
  return {
    items: items / persons,
    meanStandardError: meanSe,
    spanningLength,
    ratio: spanningLength === null ? null : items / persons / spanningLength,
    itemsWithoutContentRule: freeItems / persons,
    ratioWithoutContentRule: freeLength === null ? null : freeItems / persons / freeLength,
  };
}

/** Shortest spanning form whose mean 1/√(prior precision + information) is at most `meanSe`. */
function spanningLengthFor(
  bank: AdaptiveBank,
  truth: Float64Array,
  priorPrecision: number,
  meanSe: number,
): number | null {
  const longest = spanningForm(bank, bank.ids.length).length;
  for (let length = 1; length <= longest; length++) {
    const form = spanningForm(bank, length);
    let sum = 0;
    for (const theta of truth) {
      let precision = priorPrecision;
      for (const i of form) precision += information(theta, bank.difficulty[i]!);
      sum += 1 / Math.sqrt(precision);
    }
    if (sum / truth.length <= meanSe) return form.length;
  }
  return null;
}
