/** Stacked bar items: Corrowen recycling, Velmora Isle visitors, Orbelle Bikes repair jobs. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, numberOptions, statements } from './draft.js';

const recycling: ChartInput = {
  type: 'stacked-bar',
  title: 'Recycling from three wards in May',
  fields: [
    { name: 'ward', kind: 'nominal', label: 'Ward' },
    { name: 'material', kind: 'nominal', label: 'Material' },
    { name: 'tonnes', kind: 'quantitative', label: 'Recycling', unit: 'tonnes' },
  ],
  data: [
    { ward: 'Bellfield', material: 'Paper', tonnes: 30 },
    { ward: 'Bellfield', material: 'Glass', tonnes: 20 },
    { ward: 'Hollins', material: 'Paper', tonnes: 40 },
    { ward: 'Hollins', material: 'Glass', tonnes: 15 },
    { ward: 'Mill Row', material: 'Paper', tonnes: 25 },
    { ward: 'Mill Row', material: 'Glass', tonnes: 35 },
  ],
  category: 'ward',
  series: 'material',
  value: 'tonnes',
  labelling: 'legend',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 70], tickStep: 10 },
};
const recyclingAlt =
  'A stacked bar chart with one bar for each of three wards. Each bar has a paper part at the bottom and a glass part on top, told apart by colour in a legend. The vertical axis shows tonnes from 0 to 70 with gridlines every 10.';

const visitorMonths = ['May', 'June', 'July', 'August', 'September'];
const stays: Record<string, readonly number[]> = {
  'Day trip': [400, 500, 650, 700, 450],
  Campsite: [150, 380, 420, 360, 200],
  Guesthouse: [300, 350, 400, 450, 300],
};
const visitors: ChartInput = {
  type: 'stacked-bar',
  title: 'Visitors to Velmora Isle by where they stayed',
  fields: [
    { name: 'month', kind: 'ordinal', label: 'Month', order: visitorMonths },
    { name: 'stay', kind: 'nominal', label: 'Stayed' },
    { name: 'visitors', kind: 'quantitative', label: 'Visitors' },
  ],
  data: visitorMonths.flatMap((month, i) =>
    Object.entries(stays).map(([stay, counts]) => ({ month, stay, visitors: counts[i]! })),
  ),
  category: 'month',
  series: 'stay',
  value: 'visitors',
  labelling: 'legend',
  valueAxis: { scale: 'linear', domain: [0, 1600], tickStep: 200 },
  note: 'Ferry office survey, 2033',
};
const visitorsAlt =
  'A stacked bar chart with one bar for each month from May to September. Each bar is split into day trips at the bottom, campsite stays in the middle and guesthouse stays on top, told apart by colour in a legend. The vertical axis shows visitors from 0 to 1,600.';

const jobs: Record<string, readonly [number, number]> = {
  Tyres: [45, 24],
  Brakes: [30, 42],
  Gears: [15, 18],
  Other: [10, 36],
};
const repairJobs: ChartInput = {
  type: 'stacked-bar',
  title: 'Repair jobs at Orbelle Bikes, as shares',
  fields: [
    { name: 'workshop', kind: 'nominal', label: 'Workshop' },
    { name: 'job', kind: 'nominal', label: 'Kind of job' },
    { name: 'jobs', kind: 'quantitative', label: 'Jobs' },
  ],
  data: ['Canal Yard', 'Hill Street'].flatMap((workshop, i) =>
    Object.entries(jobs).map(([job, counts]) => ({ workshop, job, jobs: counts[i]! })),
  ),
  category: 'workshop',
  series: 'job',
  value: 'jobs',
  normalised: true,
  labelling: 'legend',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 100], tickStep: 10 },
};
const repairJobsAlt =
  'A stacked bar chart with two bars, one for each workshop, each scaled to 100 per cent. From the bottom, the parts are tyres, brakes, gears and other jobs, told apart by colour in a legend. The vertical axis shows per cent from 0 to 100 with gridlines every 10.';

export const stackedBarDrafts: readonly Draft[] = [
  {
    id: 'town-recycling-stacked-bar-read-1',
    scenario: 'town',
    level: 'read',
    chart: recycling,
    prompt: 'How many tonnes of glass were collected from Bellfield in May?',
    options: numberOptions([20, 30, 35, 50], 'tonnes'),
    order: 'fixed',
    key: {
      query: { op: 'value-at', field: 'tonnes', where: { ward: 'Bellfield', material: 'Glass' } },
      expect: 20,
    },
    alt: recyclingAlt,
    rationale:
      'The glass part of the Bellfield bar runs from 30 to 50 tonnes, so it is 20 tonnes long. 50 is the top of the bar, 30 is the paper part and 35 is the glass part of the Mill Row bar.',
    distractors: ['stacked-top', 'legend-confusion', 'neighbour'],
    multiStep: true,
  },
  {
    id: 'isle-visitors-stacked-bar-read-1',
    scenario: 'isle',
    level: 'read',
    chart: visitors,
    prompt: 'In which month did the most visitors stay at a campsite?',
    options: categoryOptions(['June', 'July', 'August', 'September']),
    order: 'fixed',
    key: {
      query: { op: 'largest', field: 'visitors', by: 'month', aggregate: 'sum', where: { stay: 'Campsite' } },
      expect: 'July',
    },
    alt: visitorsAlt,
    rationale:
      'The middle (campsite) part is longest in July: 420 visitors, against 380 in June and 360 in August. August has the tallest whole bar, but its campsite part is shorter.',
    distractors: ['stacked-top', 'neighbour'],
  },
  {
    id: 'bikeshop-jobs-stacked-bar-read-1',
    scenario: 'bike-shop',
    level: 'read',
    chart: repairJobs,
    prompt: 'What per cent of the jobs at Hill Street were tyre jobs?',
    options: numberOptions([20, 35, 45, 55], '%'),
    order: 'fixed',
    key: {
      query: {
        op: 'share',
        equals: 'Tyres',
        by: 'job',
        field: 'jobs',
        where: { workshop: 'Hill Street' },
        round: 0,
      },
      expect: 20,
    },
    alt: repairJobsAlt,
    rationale:
      'At Hill Street the tyres part runs from 0 to 20 %. 45 % is tyres at Canal Yard, 35 % is the length of the brakes part and 55 % is the top of the brakes part.',
    distractors: ['neighbour', 'legend-confusion', 'stacked-top'],
  },
  {
    id: 'isle-visitors-stacked-bar-interpret-1',
    scenario: 'isle',
    level: 'interpret',
    chart: visitors,
    prompt: 'Which sentence about the summer visitors fits the chart?',
    options: statements([
      ['day-trips-largest', 'Day trips were the largest group in every month.'],
      ['guesthouse-august', 'Guesthouses had the largest group in August.'],
      ['campsites-grew', 'Campsite stays grew in every month from May to September.'],
      ['total-grew', 'The total number of visitors grew in every month.'],
    ]),
    key: { option: 'day-trips-largest' },
    alt: visitorsAlt,
    rationale:
      'The bottom (day trip) part is the longest part of every bar, for example 700 of 1,510 in August. Campsite stays fell after July, and the total fell in September.',
    distractors: ['stacked-top', 'other'],
  },
  {
    id: 'bikeshop-jobs-stacked-bar-interpret-1',
    scenario: 'bike-shop',
    level: 'interpret',
    chart: repairJobs,
    prompt: 'Which sentence compares the two workshops correctly?',
    options: statements([
      ['tyre-share-canal', 'Tyres were a bigger share of the jobs at Canal Yard.'],
      ['fewer-tyres-hill', 'Hill Street repaired fewer tyres in number than Canal Yard.'],
      ['same-total', 'The two workshops did the same number of jobs in total.'],
      ['gears-largest', 'Gears were the largest share of the jobs at Hill Street.'],
    ]),
    key: { option: 'tyre-share-canal' },
    alt: repairJobsAlt,
    rationale:
      'Tyres are 45 % of the Canal Yard bar and 20 % of the Hill Street bar. Because both bars are scaled to 100 %, the chart cannot show numbers of jobs or totals; at Hill Street brakes (35 %) are the largest share.',
    distractors: ['other'],
  },
  {
    id: 'town-recycling-stacked-bar-envision-1',
    scenario: 'town',
    level: 'envision',
    chart: recycling,
    prompt: 'The town wants to know which ward recycles the most for each home. What else is needed?',
    options: statements([
      ['households', 'The number of homes in each ward'],
      ['may-tonnes', 'The paper and glass tonnes for May'],
      ['bin-colour', 'The colour of the bins in each ward'],
      ['all-wards-total', 'The total tonnes for all three wards'],
    ]),
    key: { option: 'households' },
    alt: recyclingAlt,
    rationale:
      'Tonnes for each home means dividing each ward total by its number of homes. The May tonnes are already on the chart, and one grand total cannot compare wards.',
    distractors: ['other'],
  },
  {
    id: 'isle-visitors-stacked-bar-envision-1',
    scenario: 'isle',
    level: 'envision',
    chart: visitors,
    prompt: 'Which question can these data answer?',
    options: statements([
      ['guesthouse-month', 'In which month did the most visitors stay at guesthouses?'],
      ['which-district', 'In which district did the campers put up their tents?'],
      ['length-of-stay', 'How many nights did each visitor stay on the island?'],
      ['come-back', 'How many of the visitors came back the next year?'],
    ]),
    key: { option: 'guesthouse-month' },
    alt: visitorsAlt,
    rationale:
      'The chart counts guesthouse stays for each month, so the month with the most can be found (August). It holds nothing about districts, nights or later years.',
    distractors: ['other'],
  },
];
