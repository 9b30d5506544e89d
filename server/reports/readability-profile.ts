import { median } from 'simple-statistics';
import type { ChartType } from '../charts/chart-spec.js';
import { responseProbabilityLocation } from '../scoring/rasch/response-probability-location.js';
import { shareAtOrAbove } from '../scoring/statistics/share-at-or-above.js';
import { type AbilityDistribution, expectedShareCorrect } from './expected-share-correct.js';

export type TaskLevel = 'read' | 'interpret' | 'envision';

/** A calibrated item as the profile needs it. */
export interface ProfileItem {
  readonly itemId: string;
  readonly chartType: ChartType;
  readonly level: TaskLevel;
  /** b in logits, from a stored calibration. */
  readonly difficulty: number;
}

export interface ProfileOptions {
  /** Response probability that counts as "can handle" (default 0.67). */
  readonly responseProbability?: number;
  /** Gauss–Hermite points for the expected share (default 41). */
  readonly quadraturePoints?: number;
}

/** One cell of the readability profile: one chart type at one task level. */
export interface ProfileCell {
  readonly chartType: ChartType;
  readonly level: TaskLevel;
  readonly itemCount: number;
  /** Median difficulty of the cell's items: the "typical item" of the cell. */
  readonly typicalDifficulty: number;
  /** Ability at which the typical item is answered correctly with probability RP. */
  readonly rpLocation: number;
  /** (a) Expected share of answers correct on the cell's items, over the ability distribution. */
  readonly expectedShareCorrect: number;
  /** (b) Share of the audience whose chance on the typical item is at least RP. */
  readonly shareAtRp: number;
}

/**
 * The readability profile: for every chart type and task level with calibrated items,
 * (a) the expected share correct over the audience's ability distribution and (b) the share
 * of the audience at or above the cell's RP location. Cells come back in a stable order
 * (chart type, then level read → interpret → envision).
 *
 * @see Bock & Aitkin (1981) for the marginal expectation; for the RP convention see
 *   `responseProbabilityLocation`.
 * @param items calibrated items (at least one)
 * @param distribution the audience's estimated ability distribution
 * @param options RP (default 0.67) and quadrature points (default 41)
 * @throws when no items are given
 * @example
 * readabilityProfile([{ itemId: 'a', chartType: 'bar', level: 'read', difficulty: 0 }], { mean: 0, sd: 1 })[0].expectedShareCorrect; // 0.5
 */
export function readabilityProfile(
  items: readonly ProfileItem[],
  distribution: AbilityDistribution,
  options: ProfileOptions = {},
): ProfileCell[] {
  if (items.length === 0) throw new Error('readabilityProfile requires at least one item');
  const rp = options.responseProbability ?? 0.67;
  const points = options.quadraturePoints ?? 41;
  const cells = new Map<string, ProfileItem[]>();
  for (const item of items) {
    const key = `${item.chartType}\u0000${item.level}`;
    const list = cells.get(key);
    if (list) list.push(item);
    else cells.set(key, [item]);
  }
  const levelOrder: Record<TaskLevel, number> = { read: 0, interpret: 1, envision: 2 };
  return [...cells.values()]
    .map((cellItems): ProfileCell => {
      const difficulties = cellItems.map((item) => item.difficulty);
      const typicalDifficulty = median(difficulties);
      const rpLocation = responseProbabilityLocation(typicalDifficulty, rp);
      const first = cellItems[0]!;
      return {
        chartType: first.chartType,
        level: first.level,
        itemCount: cellItems.length,
        typicalDifficulty,
        rpLocation,
        expectedShareCorrect: expectedShareCorrect(difficulties, distribution, points),
        shareAtRp: shareAtOrAbove(rpLocation, distribution),
      };
    })
    .sort((a, b) => a.chartType.localeCompare(b.chartType) || levelOrder[a.level] - levelOrder[b.level]);
}
