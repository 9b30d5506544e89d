import type { SeededRandom } from '../scoring/seeded-random.js';

/** One simulated cohort: its label, size and generating ability distribution (logits). */
export interface SimulatedCohort {
  readonly label: string;
  readonly size: number;
  readonly mean: number;
  readonly sd: number;
}

/**
 * The demo's INVENTED audience of the Lumen Hall science centre. The first cohort's generating mean is
 * 0, matching the calibration's identification (first cohort mean fixed at 0), so estimates and
 * generating values are on the same scale. The course cohorts are the same 60 invented people:
 * "after" is "before" plus a gain of 0.7 logits with person-to-person spread 0.3.
 */
export const demoCohorts = {
  weekday: { label: 'Weekday school groups', size: 200, mean: 0, sd: 1 },
  weekend: { label: 'Weekend families', size: 200, mean: 0.4, sd: 1.2 },
  before: { label: 'Course, before', size: 60, mean: -0.3, sd: 0.9 },
} as const satisfies Record<string, SimulatedCohort>;

/** Gain of the invented course, logits: mean and person-to-person SD. */
export const courseGain = { mean: 0.7, sd: 0.3 } as const;

/** The generating distribution of "Course, after" implied by the gain (normal sum). */
export const courseAfter: SimulatedCohort = {
  label: 'Course, after',
  size: demoCohorts.before.size,
  mean: demoCohorts.before.mean + courseGain.mean,
  sd: Math.sqrt(demoCohorts.before.sd ** 2 + courseGain.sd ** 2),
};

/** Simulated abilities of every cohort, in the order weekday, weekend, before, after. */
export function simulateAbilities(random: SeededRandom): { cohort: SimulatedCohort; abilities: number[] }[] {
  const draw = (c: SimulatedCohort) => Array.from({ length: c.size }, () => c.mean + c.sd * random.normal());
  const before = draw(demoCohorts.before);
  const after = before.map((theta) => theta + courseGain.mean + courseGain.sd * random.normal());
  return [
    { cohort: demoCohorts.weekday, abilities: draw(demoCohorts.weekday) },
    { cohort: demoCohorts.weekend, abilities: draw(demoCohorts.weekend) },
    { cohort: demoCohorts.before, abilities: before },
    { cohort: courseAfter, abilities: after },
  ];
}

/** Share of wrong answers a simulated respondent gives as "I don't know" (invented). */
export const dontKnowShareOfWrong = 0.25;

/**
 * One simulated answer under the Rasch model: right with P = 1/(1 + e^−(θ − b)); a wrong answer is
 * "I don't know" with probability {@link dontKnowShareOfWrong}, otherwise a wrong option.
 */
export function simulateAnswer(
  random: SeededRandom,
  ability: number,
  difficulty: number,
): 'right' | 'wrong' | 'dont-know' {
  if (random.uniform() < 1 / (1 + Math.exp(-(ability - difficulty)))) return 'right';
  return random.uniform() < dontKnowShareOfWrong ? 'dont-know' : 'wrong';
}
