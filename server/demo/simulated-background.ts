import type { BackgroundQuestion } from '../delivery/study-settings.js';
import type { SeededRandom } from '../scoring/seeded-random.js';

/** The demo study's background question (INVENTED); the server adds "prefer not to say". */
export const worksWithDataQuestion = {
  id: 'works-with-data',
  prompt: 'Do you work with data in your job?',
  options: [
    { id: 'yes', text: 'Yes' },
    { id: 'no', text: 'No' },
  ],
} as const satisfies BackgroundQuestion;

/** INVENTED shares of the answers in the simulated audience: yes, no, prefer not to say. */
export const worksWithDataShares = { yes: 0.46, no: 0.46, 'prefer-not-to-say': 0.08 } as const;

export type WorksWithDataAnswer = keyof typeof worksWithDataShares;

/**
 * INVENTED differential item functioning, for the demo only: for people who answer "no", two items
 * are made harder by `shift` logits than the Rasch model with their ability predicts. The Fairness
 * section (reference "yes", focal "no") should flag exactly these two items.
 */
export const injectedDif = { focalAnswer: 'no', shift: 1.5 } as const;

/**
 * The two items given DIF: the pool's items at positions 1 and ⌊n/2⌋ (any fixed rule would do).
 * @throws when the pool has fewer than 4 items
 * @example injectedDifItems(['a', 'b', 'c', 'd', 'e']) // ['b', 'c']
 */
export function injectedDifItems(poolIds: readonly string[]): [string, string] {
  if (poolIds.length < 4) throw new Error('injectedDifItems requires at least 4 items');
  return [poolIds[1]!, poolIds[Math.floor(poolIds.length / 2)]!];
}

/** One simulated person's answer to the background question. */
export function simulateWorksWithData(random: SeededRandom): WorksWithDataAnswer {
  const u = random.uniform();
  if (u < worksWithDataShares.yes) return 'yes';
  if (u < worksWithDataShares.yes + worksWithDataShares.no) return 'no';
  return 'prefer-not-to-say';
}

/**
 * The generating difficulties one simulated person answers with: the common ones, and for the
 * focal answer group the two DIF items shifted by {@link injectedDif}.shift.
 */
export function difficultiesFor(
  answer: WorksWithDataAnswer,
  common: ReadonlyMap<string, number>,
  difItems: readonly string[],
): ReadonlyMap<string, number> {
  if (answer !== injectedDif.focalAnswer) return common;
  const shifted = new Map(common);
  for (const id of difItems) shifted.set(id, (common.get(id) ?? 0) + injectedDif.shift);
  return shifted;
}
