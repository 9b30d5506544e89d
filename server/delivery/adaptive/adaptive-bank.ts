/**
 * The item bank as adaptive selection reads it: calibrated difficulties in one Float64Array, each
 * item's content area, the areas' target proportions, and per-area member lists, so one selection
 * is a short loop over typed arrays.
 */

/** One eligible item: active, in the study's pool, with a calibrated difficulty. */
export interface AdaptiveItem {
  readonly id: string;
  /** Calibrated difficulty, logits. */
  readonly difficulty: number;
  /** Content area key (see content-area.ts). */
  readonly area: string;
}

export interface AdaptiveBank {
  readonly ids: readonly string[];
  readonly difficulty: Float64Array;
  /** Area index of each item. */
  readonly areaOf: Int32Array;
  /** Area keys, in order of first appearance. */
  readonly areas: readonly string[];
  /** Target proportion of each area; they sum to 1. An area with target 0 is never chosen. */
  readonly targets: Float64Array;
  /** Item indices of each area. */
  readonly members: readonly Int32Array[];
  readonly indexOf: ReadonlyMap<string, number>;
}

/**
 * Builds the adaptive bank.
 *
 * Targets: when `targets` is absent each area's target is its share of the items (the attempt
 * mirrors the pool). When given, they are normalised to sum to 1 over the areas that have items;
 * areas of the pool not named get target 0 (their items are never chosen); named areas without
 * items are returned in `emptyAreas` (they cannot be met, so they are left out).
 *
 * @param items the eligible items (ids unique, difficulties finite).
 * @param targets optional target weight per area key (≥ 0).
 * @returns the bank and the named areas that have no items.
 * @throws when there are no items, an id repeats, a difficulty is not finite, a weight is
 *   negative, or no area with items has a positive target.
 * @example
 * const { bank } = buildAdaptiveBank([
 *   { id: 'a', difficulty: -1, area: 'read' },
 *   { id: 'b', difficulty: 0, area: 'read' },
 *   { id: 'c', difficulty: 1, area: 'envision' },
 * ]);
 * bank.targets; // Float64Array [0.666…, 0.333…]
 */
export function buildAdaptiveBank(
  items: readonly AdaptiveItem[],
  targets?: Readonly<Record<string, number>>,
): { bank: AdaptiveBank; emptyAreas: string[] } {
  if (items.length === 0) throw new Error('buildAdaptiveBank requires at least one item');
  const indexOf = new Map<string, number>();
  const areaIndex = new Map<string, number>();
  const areas: string[] = [];
  const difficulty = new Float64Array(items.length);
  const areaOf = new Int32Array(items.length);
  items.forEach((item, i) => {
    if (indexOf.has(item.id)) throw new Error(`buildAdaptiveBank requires unique ids (${item.id} repeats)`);
    if (!Number.isFinite(item.difficulty)) {
      throw new Error(`buildAdaptiveBank requires finite difficulties (${item.id})`);
    }
    indexOf.set(item.id, i);
    difficulty[i] = item.difficulty;
    let a = areaIndex.get(item.area);
    if (a === undefined) {
      a = areas.length;
      areas.push(item.area);
      areaIndex.set(item.area, a);
    }
    areaOf[i] = a;
  });
  const counts = new Int32Array(areas.length);
  for (let i = 0; i < items.length; i++) counts[areaOf[i]!]!++;
  const weights = new Float64Array(areas.length);
  const emptyAreas: string[] = [];
  if (targets === undefined) {
    for (let a = 0; a < areas.length; a++) weights[a] = counts[a]!;
  } else {
    for (const [key, weight] of Object.entries(targets)) {
      if (!(weight >= 0) || !Number.isFinite(weight)) {
        throw new Error(`buildAdaptiveBank requires target weights >= 0 (${key})`);
      }
      const a = areaIndex.get(key);
      if (a === undefined) emptyAreas.push(key);
      else weights[a] = weight;
    }
  }
  const total = weights.reduce((sum, w) => sum + w, 0);
  if (!(total > 0)) throw new Error('buildAdaptiveBank requires a positive target for an area with items');
  const normalised = weights.map((w) => w / total);
  const members = areas.map((_, a) => {
    const list = new Int32Array(counts[a]!);
    let k = 0;
    for (let i = 0; i < items.length; i++) if (areaOf[i] === a) list[k++] = i;
    return list;
  });
  return {
    bank: {
      ids: items.map((item) => item.id),
      difficulty,
      areaOf,
      areas,
      targets: normalised,
      members,
      indexOf,
    },
    emptyAreas,
  };
}
