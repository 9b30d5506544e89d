/** Pie and donut items: Sprout Lane land use, Orbelle Bikes income, Lumen Hall visitor ages. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, numberOptions, statements } from './draft.js';

const landUse: ChartInput = {
  type: 'pie',
  title: 'How the land at Sprout Lane Garden is used',
  fields: [
    { name: 'use', kind: 'nominal', label: 'Use' },
    { name: 'area', kind: 'quantitative', label: 'Area', unit: 'm²' },
  ],
  data: [
    { use: 'Vegetable beds', area: 300 },
    { use: 'Flower beds', area: 180 },
    { use: 'Paths and sheds', area: 120 },
  ],
  category: 'use',
  value: 'area',
  sliceLabels: 'category-and-percent',
};
const landUseAlt =
  'A pie chart with three slices for vegetable beds, flower beds, and paths and sheds. Each slice is labelled with its name and its per cent of the garden.';

const income: ChartInput = {
  type: 'pie',
  title: 'Income of Orbelle Bikes in 2034',
  fields: [
    { name: 'source', kind: 'nominal', label: 'Source' },
    { name: 'income', kind: 'quantitative', label: 'Income', unit: 'thousand coins' },
  ],
  data: [
    { source: 'Rentals', income: 42 },
    { source: 'Repairs', income: 30 },
    { source: 'New bikes', income: 24 },
    { source: 'Parts', income: 12 },
    { source: 'Lessons', income: 6 },
    { source: 'Gift cards', income: 6 },
  ],
  category: 'source',
  value: 'income',
  sliceLabels: 'category',
};
const incomeAlt =
  'A pie chart with six slices, one for each source of income: rentals, repairs, new bikes, parts, lessons and gift cards. Each slice is labelled with its name only, without numbers.';

const ages: ChartInput = {
  type: 'pie',
  title: 'Ages of visitors to Lumen Hall in one month',
  fields: [
    {
      name: 'age',
      kind: 'ordinal',
      label: 'Age group',
      order: ['Under 5', '5 to 11', '12 to 17', '18 to 34', '35 to 54', '55 and over'],
    },
    { name: 'visitors', kind: 'quantitative', label: 'Visitors' },
  ],
  data: [
    { age: 'Under 5', visitors: 400 },
    { age: '5 to 11', visitors: 1500 },
    { age: '12 to 17', visitors: 700 },
    { age: '18 to 34', visitors: 600 },
    { age: '35 to 54', visitors: 1200 },
    { age: '55 and over', visitors: 600 },
  ],
  category: 'age',
  value: 'visitors',
  donut: true,
  labelling: 'legend',
  sliceLabels: 'none',
};
const agesAlt =
  'A donut chart with six slices, one for each age group from under 5 to 55 and over. The slices are told apart only by colour, with a legend beside the chart.';

export const pieDrafts: readonly Draft[] = [
  {
    id: 'garden-land-pie-read-1',
    scenario: 'garden',
    level: 'read',
    chart: landUse,
    prompt: 'What per cent of the garden is used for flower beds?',
    options: numberOptions([20, 30, 50], '%'),
    order: 'fixed',
    key: { query: { op: 'share', equals: 'Flower beds', round: 0 }, expect: 30 },
    alt: landUseAlt,
    rationale:
      'Flower beds cover 180 of 600 m², which is 30 %, as the slice label says. 50 % is vegetable beds and 20 % is paths and sheds.',
    distractors: ['neighbour'],
  },
  {
    id: 'bikeshop-income-pie-read-1',
    scenario: 'bike-shop',
    level: 'read',
    chart: income,
    prompt: 'About what per cent of the income came from repairs?',
    options: numberOptions([10, 25, 35, 50], '%'),
    order: 'fixed',
    key: { query: { op: 'share', equals: 'Repairs', round: 0 }, expect: 25 },
    alt: incomeAlt,
    rationale:
      'The repairs slice is a quarter of the circle (a right angle at the centre), so 25 %. Rentals, the slice beside it, is 35 %; parts is 10 %.',
    distractors: ['neighbour', 'angle-as-length'],
  },
  {
    id: 'science-ages-pie-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: ages,
    prompt: 'Which age group made up the largest part of the visitors?',
    options: categoryOptions(['5 to 11', '12 to 17', '35 to 54', 'Under 5'], (a) => `${a} years`),
    key: { query: { op: 'largest', field: 'visitors', by: 'age', aggregate: 'sum' }, expect: '5 to 11' },
    alt: agesAlt,
    rationale:
      'The 5 to 11 slice (1,500 visitors) is the biggest. The 35 to 54 slice (1,200) is the next biggest; 12 to 17 and under 5 sit next to 5 to 11 in the legend.',
    distractors: ['angle-as-length', 'legend-confusion'],
  },
  {
    id: 'bikeshop-income-pie-interpret-1',
    scenario: 'bike-shop',
    level: 'interpret',
    chart: income,
    prompt: "Which sentence about the shop's income fits the chart?",
    options: statements([
      ['rent-repair-half', 'Rentals and repairs together brought in more than half.'],
      ['new-bikes-most', 'Selling new bikes brought in more than any other source.'],
      ['all-equal', 'All six sources brought in about the same amount.'],
      ['lessons-over-parts', 'Lessons brought in more than parts did.'],
    ]),
    key: { option: 'rent-repair-half' },
    alt: incomeAlt,
    rationale:
      'Rentals (35 %) and repairs (25 %) make 60 % of the circle. New bikes are only 20 %, although a bike shop might be expected to earn most from selling bikes; lessons (5 %) are half of parts (10 %).',
    distractors: ['everyday-expectation', 'other'],
  },
  {
    id: 'science-ages-pie-interpret-1',
    scenario: 'science-centre',
    level: 'interpret',
    chart: ages,
    prompt: 'Which sentence about the visitors fits the chart?',
    options: statements([
      ['over-half-young', 'More than half of the visitors were under 18 years old.'],
      ['most-18-34', 'Most of the visitors were between 18 and 34 years old.'],
      ['groups-equal', 'Each age group made up about the same part of the visitors.'],
      ['few-under-12', 'Fewer than a quarter of the visitors were under 12 years old.'],
    ]),
    key: { option: 'over-half-young' },
    alt: agesAlt,
    rationale:
      'Under 5, 5 to 11 and 12 to 17 together are 2,600 of 5,000 visitors, 52 %. 18 to 34 is only 12 %, and under 12 alone is 38 %, more than a quarter.',
    distractors: ['other'],
    multiStep: true,
  },
  {
    id: 'garden-land-pie-envision-1',
    scenario: 'garden',
    level: 'envision',
    chart: landUse,
    prompt:
      'The garden wants to compare how its land is used now with five years ago. Which chart would show that best?',
    options: statements([
      ['two-stacked-bars', 'Two bars, one for each year, each split into the three uses'],
      ['one-big-pie', 'One pie chart with six slices, three for each year'],
      ['flower-line', 'A line chart of the flower beds on their own'],
      ['plain-plan', 'A plan of the garden with no numbers on it'],
    ]),
    key: { option: 'two-stacked-bars' },
    alt: landUseAlt,
    rationale:
      'Two bars split the same way, side by side, let the reader compare each use between the years on a common scale. One pie with six slices mixes the two years into one whole.',
    distractors: ['other'],
  },
  {
    id: 'bikeshop-income-pie-envision-1',
    scenario: 'bike-shop',
    level: 'envision',
    chart: income,
    prompt:
      'The owner wants to know which source makes the most profit, not just the most income. What else is needed?',
    options: statements([
      ['costs', 'What each source costs the shop to run'],
      ['staff-days', 'The number of staff at work on each day'],
      ['past-income', 'The income from each source in earlier years'],
      ['bigger-pie', 'A larger drawing of the same pie chart'],
    ]),
    key: { option: 'costs' },
    alt: incomeAlt,
    rationale:
      'Profit is income minus cost. The chart shows income only, so the cost of each source is the missing piece; earlier income or a bigger drawing still shows no costs.',
    distractors: ['other'],
  },
];
