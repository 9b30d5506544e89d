import { type AdaptiveItem, buildAdaptiveBank } from '../../../server/delivery/adaptive/adaptive-bank.js';
import { seededRandom } from '../../../server/scoring/seeded-random.js';

/** INVENTED bank: `perArea` items in each area, difficulties evenly spaced on [low, high] per area. */
export function spacedBank(
  areas: readonly string[],
  perArea: number,
  low = -3,
  high = 3,
  targets?: Record<string, number>,
  shuffleSeed?: number,
) {
  const items: AdaptiveItem[] = [];
  for (const area of areas) {
    for (let k = 0; k < perArea; k++) {
      items.push({
        id: `${area}-${k}`,
        difficulty: perArea === 1 ? 0 : low + ((high - low) * k) / (perArea - 1),
        area,
      });
    }
  }
  if (shuffleSeed !== undefined) {
    // Bank (pool) order unrelated to difficulty, as in a real bank: seeded Fisher-Yates.
    const random = seededRandom(shuffleSeed);
    for (let i = items.length - 1; i > 0; i--) {
      const j = random.integer(i + 1);
      [items[i], items[j]] = [items[j]!, items[i]!];
    }
  }
  return buildAdaptiveBank(items, targets).bank;
}
