/** Box plot items: Sprout Lane bean heights, Corrowen bus delays by route. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, numberOptions, statements } from './draft.js';

const beds: Record<string, readonly number[]> = {
  'Bed A': [30, 35, 38, 41, 45, 48, 52, 55, 62],
  'Bed B': [42, 48, 50, 56, 60, 63, 70, 74, 80],
  'Bed C': [55, 62, 66, 70, 75, 79, 84, 88, 95],
};
const beanHeights: ChartInput = {
  type: 'box-plot',
  title: 'Bean plant heights at Sprout Lane Garden',
  fields: [
    { name: 'bed', kind: 'nominal', label: 'Bed' },
    { name: 'height', kind: 'quantitative', label: 'Plant height', unit: 'cm' },
  ],
  data: Object.entries(beds).flatMap(([bed, heights]) => heights.map((height) => ({ bed, height }))),
  category: 'bed',
  value: 'height',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [20, 100], tickStep: 10 },
  note: 'Nine plants measured in each bed',
};
const beanHeightsAlt =
  'A box plot with three boxes, one for each bed, A, B and C, nine plants each. The vertical axis shows plant height from 20 to 100 centimetres with gridlines every 10.';

const routes: Record<string, readonly number[]> = {
  'Route 1': [0, 1, 1, 2, 2, 3, 3, 3, 4, 4, 5],
  'Route 2': [2, 4, 5, 6, 8, 9, 10, 12, 13, 15, 17],
  'Route 3': [1, 2, 2, 3, 3, 4, 4, 5, 6, 7, 19],
  'Route 4': [5, 6, 6, 7, 7, 8, 8, 9, 9, 10, 11],
  'Route 5': [0, 0, 1, 1, 2, 2, 2, 3, 3, 4, 6],
};
const routeDelays: ChartInput = {
  type: 'box-plot',
  title: 'Corrowen bus delays by route',
  fields: [
    { name: 'route', kind: 'nominal', label: 'Bus route' },
    { name: 'delay', kind: 'quantitative', label: 'Minutes late' },
  ],
  data: Object.entries(routes).flatMap(([route, delays]) => delays.map((delay) => ({ route, delay }))),
  category: 'route',
  value: 'delay',
  orientation: 'horizontal',
  whiskers: 'tukey',
  valueAxis: { scale: 'linear', domain: [0, 20], tickStep: 5 },
};
const routeDelaysAlt =
  'A horizontal box plot with five boxes, one for each bus route, from 11 days of arrivals each. Whiskers reach at most one and a half box lengths beyond the box, and values further out are drawn as single dots. The horizontal axis shows minutes late from 0 to 20.';

export const boxPlotDrafts: readonly Draft[] = [
  {
    id: 'garden-beans-box-plot-read-1',
    scenario: 'garden',
    level: 'read',
    chart: beanHeights,
    prompt: 'What is the median height of the bean plants in bed B, in centimetres?',
    options: numberOptions([45, 50, 60, 70], 'cm'),
    order: 'fixed',
    key: { query: { op: 'box-statistic', box: 'Bed B', statistic: 'median' }, expect: 60 },
    alt: beanHeightsAlt,
    rationale:
      'The line inside the bed B box is at 60 cm. 50 and 70 cm are the bottom and top of the box (the quartiles); 45 cm is the median of bed A.',
    distractors: ['other', 'neighbour'],
  },
  {
    id: 'town-route-delays-box-plot-read-1',
    scenario: 'town',
    level: 'read',
    chart: routeDelays,
    prompt: 'What was the longest delay on Route 3, in minutes?',
    options: numberOptions([4, 7, 19], 'minutes'),
    order: 'fixed',
    key: { query: { op: 'box-statistic', box: 'Route 3', statistic: 'highest' }, expect: 19 },
    alt: routeDelaysAlt,
    rationale:
      'The longest delay on Route 3 is the single dot at 19 minutes, beyond the whisker. The whisker ends at 7 minutes and the median is 4 minutes.',
    distractors: ['other'],
  },
  {
    id: 'town-route-delays-box-plot-read-2',
    scenario: 'town',
    level: 'read',
    chart: routeDelays,
    prompt: 'Which route had the longest median delay?',
    options: categoryOptions(['Route 2', 'Route 3', 'Route 4', 'Route 1']),
    key: { query: { op: 'largest', field: 'delay', by: 'route', aggregate: 'median' }, expect: 'Route 2' },
    alt: routeDelaysAlt,
    rationale:
      'The median line of Route 2 is at 9 minutes, just right of Route 4 at 8 minutes. Route 3 has the longest single delay (the dot at 19), but its median is only 4 minutes.',
    distractors: ['outlier-as-trend', 'neighbour'],
    precision: true,
  },
  {
    id: 'garden-beans-box-plot-interpret-1',
    scenario: 'garden',
    level: 'interpret',
    chart: beanHeights,
    prompt: 'Which sentence compares bed A and bed C correctly?',
    options: statements([
      ['half-c-above-a', 'Half of the bed C plants were taller than every plant in bed A.'],
      ['all-c-above-a', 'Every bed C plant was taller than every plant in bed A.'],
      ['same-heights', 'The plants in bed A and bed C had about the same heights.'],
      ['a-more-varied', 'The bed A plants varied more in height than the bed C plants.'],
    ]),
    key: { option: 'half-c-above-a' },
    alt: beanHeightsAlt,
    rationale:
      "Bed C's median (75 cm) is above bed A's tallest plant (62 cm), so at least half of bed C is taller than all of bed A. Bed C's shortest plant (55 cm) is below bed A's tallest, and bed A's box and whiskers are shorter than bed C's.",
    distractors: ['other'],
  },
  {
    id: 'town-route-delays-box-plot-interpret-1',
    scenario: 'town',
    level: 'interpret',
    chart: routeDelays,
    prompt: 'Which sentence fits the chart?',
    options: statements([
      ['route3-one-long', 'Route 3 was usually a little late, but once it was very late.'],
      ['route3-longest', 'Route 3 had the longest delays on most of the days.'],
      ['route1-spread', 'Route 1 had the most spread-out delays of all the routes.'],
      ['route4-under-5', 'Route 4 was never more than 5 minutes late.'],
    ]),
    key: { option: 'route3-one-long' },
    alt: routeDelaysAlt,
    rationale:
      'Route 3 has a short box from 2.5 to 5.5 minutes and one dot at 19 minutes: one unusual delay, not a pattern. Route 2 has the widest box, and Route 4 is 5 to 11 minutes late.',
    distractors: ['outlier-as-trend', 'other'],
  },
  {
    id: 'garden-beans-box-plot-envision-1',
    scenario: 'garden',
    level: 'envision',
    chart: beanHeights,
    prompt:
      'The garden wants to know whether bed B plants grew taller this year than last year. What would it need?',
    options: statements([
      ['last-year-b', 'The heights of bed B plants measured at the same time last year'],
      ['more-beds', 'The heights of plants in a new bed D this year'],
      ['seed-count', 'The number of bean seeds planted in bed C'],
      ['bigger-boxes', 'The same chart drawn with wider boxes'],
    ]),
    key: { option: 'last-year-b' },
    alt: beanHeightsAlt,
    rationale:
      "A comparison with last year needs last year's heights for bed B, measured in the same way; a box for last year beside this year's would show the change. The chart holds one year only.",
    distractors: ['other'],
  },
  {
    id: 'town-route-delays-box-plot-envision-1',
    scenario: 'town',
    level: 'envision',
    chart: routeDelays,
    prompt: 'Which question can this chart answer?',
    options: statements([
      ['longest-median', 'On which route was the middle delay longest?'],
      ['which-stop', 'At which stop were the buses most often late?'],
      ['why-late', 'Why was one Route 3 bus so very late?'],
      ['riders', 'How many people rode on Route 5?'],
    ]),
    key: { option: 'longest-median' },
    alt: routeDelaysAlt,
    rationale:
      'Each box shows the median delay of a route, so the routes can be compared on it. The chart holds no stops, causes or passenger counts.',
    distractors: ['other'],
  },
];
