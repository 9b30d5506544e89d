/** Histogram items: Sprout Lane tomato weights, Lumen Hall visit lengths, Corrowen bus delays. */
import type { ChartInput, Draft } from './draft.js';
import { numberOptions, statements } from './draft.js';

/**
 * Observations that fill bins with the given counts: whole numbers spread evenly inside each
 * bin (never on its upper edge), so the histogram shows exactly these counts.
 */
export function observationsForBins(binStart: number, binWidth: number, counts: readonly number[]): number[] {
  return counts.flatMap((count, bin) =>
    Array.from({ length: count }, (_, k) =>
      Math.floor(binStart + bin * binWidth + (binWidth * (k + 0.5)) / count),
    ),
  );
}

const tomatoWeights: ChartInput = {
  type: 'histogram',
  title: 'Weights of 40 tomatoes',
  fields: [{ name: 'weight', kind: 'quantitative', label: 'Weight of one tomato', unit: 'g' }],
  data: observationsForBins(60, 20, [3, 8, 14, 9, 4, 2]).map((weight) => ({ weight })),
  value: 'weight',
  binStart: 60,
  binWidth: 20,
  gridlines: true,
  countAxis: { scale: 'linear', domain: [0, 16], tickStep: 2 },
};
const tomatoWeightsAlt =
  'A histogram of the weights of 40 tomatoes, in six bars 20 grams wide from 60 to 180 grams. The vertical axis shows the number of tomatoes from 0 to 16 with gridlines every 2.';

const visitLengths: ChartInput = {
  type: 'histogram',
  title: 'How long 120 visitors stayed at Lumen Hall',
  fields: [{ name: 'minutes', kind: 'quantitative', label: 'Length of visit', unit: 'minutes' }],
  data: observationsForBins(0, 10, [2, 5, 9, 14, 18, 20, 16, 13, 10, 7, 4, 2]).map((minutes) => ({
    minutes,
  })),
  value: 'minutes',
  binStart: 0,
  binWidth: 10,
  countAxis: { scale: 'linear', domain: [0, 25], tickStep: 5 },
};
const visitLengthsAlt =
  'A histogram of the visit lengths of 120 visitors, in twelve bars 10 minutes wide from 0 to 120 minutes. The vertical axis shows the number of visitors from 0 to 25.';

const busDelays: ChartInput = {
  type: 'histogram',
  title: 'How late Corrowen buses were in one week',
  fields: [{ name: 'delay', kind: 'quantitative', label: 'Minutes late' }],
  data: observationsForBins(0, 2, [30, 22, 14, 8, 5, 3, 2, 1, 1]).map((delay) => ({ delay })),
  value: 'delay',
  binStart: 0,
  binWidth: 2,
  countAxis: { scale: 'linear', domain: [0, 35], tickStep: 5 },
  note: '86 bus arrivals at the Old Market stop',
};
const busDelaysAlt =
  'A histogram of how late 86 buses were, in nine bars 2 minutes wide from 0 to 18 minutes late. The vertical axis shows the number of buses from 0 to 35.';

export const histogramDrafts: readonly Draft[] = [
  {
    id: 'garden-tomato-weights-histogram-read-1',
    scenario: 'garden',
    level: 'read',
    chart: tomatoWeights,
    prompt: 'How many tomatoes weighed from 100 up to 120 grams?',
    options: numberOptions([8, 9, 12, 14], 'tomatoes'),
    order: 'fixed',
    key: { query: { op: 'bin-count', from: 100, to: 120 }, expect: 14 },
    alt: tomatoWeightsAlt,
    rationale:
      'The bar from 100 to 120 grams reaches the 14 gridline. 8 and 9 are the bars on either side; 12 is the gridline below the bar top.',
    distractors: ['neighbour', 'gridline'],
  },
  {
    id: 'science-visit-length-histogram-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: visitLengths,
    prompt: 'How many of the 120 visitors stayed less than 30 minutes?',
    options: numberOptions([2, 9, 16], 'visitors'),
    order: 'fixed',
    key: { query: { op: 'bin-count', from: 0, to: 30 }, expect: 16 },
    alt: visitLengthsAlt,
    rationale:
      'Three bars lie below 30 minutes: 2 + 5 + 9 = 16 visitors. 9 is the 20 to 30 minute bar on its own, and 2 is the first bar on its own.',
    distractors: ['wrong-operation', 'neighbour'],
    multiStep: true,
  },
  {
    id: 'science-visit-length-histogram-interpret-1',
    scenario: 'science-centre',
    level: 'interpret',
    chart: visitLengths,
    prompt: 'Which sentence describes the shape of the visit lengths?',
    options: statements([
      ['one-hump', 'One hump: most visits lasted 40 to 80 minutes, with fewer very short or very long.'],
      ['short-tail', 'Most visits were short, with a long tail of a few very long visits.'],
      ['flat', 'Flat: every length of visit was about as common as every other.'],
      ['two-humps', 'Two humps: one group of short visits and one group of long visits.'],
    ]),
    key: { option: 'one-hump' },
    alt: visitLengthsAlt,
    rationale:
      'The bars rise to a single peak at 50 to 60 minutes (20 visitors) and fall away evenly on both sides to 2 visitors at each end.',
    distractors: ['other'],
  },
  {
    id: 'town-bus-delays-histogram-interpret-1',
    scenario: 'town',
    level: 'interpret',
    chart: busDelays,
    prompt: 'Which sentence describes how late the buses were?',
    options: statements([
      ['few-very-late', 'Most buses were a little late, and a few were very late.'],
      ['most-very-late', 'Most buses were very late, and a few were a little late.'],
      ['even-spread', 'The delays were spread evenly from 0 to 18 minutes.'],
      ['two-groups', 'The buses were either on time or very late, with few in between.'],
    ]),
    key: { option: 'few-very-late' },
    alt: busDelaysAlt,
    rationale:
      'The tallest bars are on the left (30 buses up to 2 minutes late, 22 from 2 to 4), and the bars shrink to 1 bus at 16 to 18 minutes: a long tail to the right.',
    distractors: ['other'],
  },
  {
    id: 'garden-tomato-weights-histogram-envision-1',
    scenario: 'garden',
    level: 'envision',
    chart: tomatoWeights,
    prompt:
      'The garden weighs 40 more tomatoes from the same plants and adds them to the chart. What will the new chart most likely look like?',
    options: statements([
      ['same-shape-taller', 'About the same shape, with bars about twice as tall'],
      ['all-in-peak', 'The same bars, with all the new tomatoes in the tallest bar'],
      ['flat', 'A flat chart, with every bar about the same height'],
      ['peak-moves-right', 'A new peak in the 160 to 180 gram bar'],
    ]),
    key: { option: 'same-shape-taller' },
    alt: tomatoWeightsAlt,
    rationale:
      'Tomatoes from the same plants should spread over the weights in about the same way, so each bar roughly doubles and the peak stays at 100 to 120 grams.',
    distractors: ['other'],
  },
  {
    id: 'town-bus-delays-histogram-envision-1',
    scenario: 'town',
    level: 'envision',
    chart: busDelays,
    prompt:
      'The town wants to know whether buses are later at busy times of day. Which further data would help?',
    options: statements([
      ['time-due', 'The time of day each bus was due at the stop'],
      ['bus-colour', 'The colour of each bus'],
      ['seats', 'The number of seats on each bus'],
      ['total-delay', 'The total of all the delays added up'],
    ]),
    key: { option: 'time-due' },
    alt: busDelaysAlt,
    rationale:
      'To link delays to the time of day, each delay needs the time the bus was due. The chart pools all arrivals, and a total delay still says nothing about when.',
    distractors: ['other'],
  },
];
