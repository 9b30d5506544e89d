import { calibrateMml } from '../scoring/rasch/calibrate-mml.js';
import type { ResponseMatrix } from '../scoring/response-matrix.js';
import { seededRandom } from '../scoring/seeded-random.js';

/** One group's normal ability distribution, logits. */
export interface GroupDistribution {
  readonly label: string;
  readonly mean: number;
  readonly sd: number;
}

export interface BootstrapOptions {
  /** Number of bootstrap replicates (default 200). */
  readonly replicates?: number;
  /** Seed of the resampling (default 1), so a report is reproducible. */
  readonly seed?: number;
  /** Quadrature points of each refit (default 21: the refits only estimate two numbers per group). */
  readonly quadraturePoints?: number;
}

/**
 * Nonparametric bootstrap over respondents with item parameters held fixed: persons are resampled
 * with replacement within each group, and each group's normal ability distribution (mean, SD) is
 * re-estimated by MML with every item anchored at its calibrated difficulty. The spread of the
 * replicates gives intervals for anything computed from the distributions (profile shares, the
 * difference between cohorts) without assuming those quantities are normal.
 *
 * @see Efron, B., & Tibshirani, R. J. (1993). An Introduction to the Bootstrap. Chapman & Hall,
 *   ch. 6 (the bootstrap estimate of standard error) and ch. 13 (percentile intervals).
 * @param matrix responses (0/1, MISSING for not presented)
 * @param difficulties calibrated difficulty of each item to keep fixed (items not listed are dropped)
 * @param groups group index of each person and the labels; default one group
 * @param options replicates (200), seed (1), quadrature points (21)
 * @returns one array of group distributions per replicate, in label order
 * @throws when no item of the matrix has a difficulty, or a group has no persons
 */
export function bootstrapAbilityDistributions(
  matrix: ResponseMatrix,
  difficulties: ReadonlyMap<string, number>,
  groups: { readonly index: Int32Array; readonly labels: readonly string[] } | undefined,
  options: BootstrapOptions = {},
): GroupDistribution[][] {
  const replicates = options.replicates ?? 200;
  const random = seededRandom(options.seed ?? 1);
  const personCount = matrix.personIds.length;
  const itemCount = matrix.itemIds.length;
  const labels = groups?.labels ?? ['all'];
  const groupIndex = groups?.index ?? new Int32Array(personCount);
  const keptColumns = matrix.itemIds
    .map((id, column) => (difficulties.has(id) ? column : -1))
    .filter((c) => c >= 0);
  if (keptColumns.length === 0) throw new Error('bootstrapAbilityDistributions requires calibrated items');
  const itemIds = keptColumns.map((column) => matrix.itemIds[column]!);
  const anchors = new Map(itemIds.map((id) => [id, difficulties.get(id)!]));

  const members: number[][] = labels.map(() => []);
  for (let p = 0; p < personCount; p++) members[groupIndex[p]!]!.push(p);
  members.forEach((list, g) => {
    if (list.length === 0) throw new Error(`bootstrapAbilityDistributions group ${labels[g]} has no persons`);
  });

  const results: GroupDistribution[][] = [];
  const scores = new Uint8Array(personCount * keptColumns.length);
  const index = new Int32Array(personCount);
  const personIds = matrix.personIds.map((_, p) => `r${p}`);
  // A resample can be unfittable (e.g. an SD collapsing in a small group); such a replicate is
  // drawn again, at most `replicates` extra times in all, so the loop stays bounded.
  let redraws = 0;
  for (let r = 0; r < replicates; r++) {
    let row = 0;
    members.forEach((list, g) => {
      for (let k = 0; k < list.length; k++) {
        const source = list[random.integer(list.length)]!;
        for (let c = 0; c < keptColumns.length; c++) {
          scores[row * keptColumns.length + c] = matrix.scores[source * itemCount + keptColumns[c]!]!;
        }
        index[row] = g;
        row++;
      }
    });
    let fit: ReturnType<typeof calibrateMml>;
    try {
      fit = calibrateMml(
        { personIds, itemIds, scores },
        { anchors, groups: { index, labels }, quadraturePoints: options.quadraturePoints ?? 21 },
      );
    } catch (error) {
      if (++redraws > replicates) throw error;
      r--;
      continue;
    }
    results.push(fit.groups.map((group) => ({ label: group.label, mean: group.mean, sd: group.sd })));
  }
  return results;
}
