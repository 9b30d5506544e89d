/** Area chart items: Sprout Lane rain, Corrowen pool swims, people on Velmora Isle. */
import type { ChartInput, Draft } from './draft.js';
import { numberOptions, statements } from './draft.js';

const rain = [90, 70, 70, 60, 60, 40, 20, 30, 60, 80, 100, 110];
const gardenRain: ChartInput = {
  type: 'area',
  title: 'Rain at Sprout Lane Garden each month, 2033',
  fields: [
    { name: 'month', kind: 'temporal', label: 'Month' },
    { name: 'rain', kind: 'quantitative', label: 'Rain', unit: 'mm' },
  ],
  data: rain.map((mm, i) => ({ month: `2033-${String(i + 1).padStart(2, '0')}`, rain: mm })),
  x: 'month',
  y: 'rain',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 120], tickStep: 20 },
  note: 'Garden rain gauge',
};
const gardenRainAlt =
  'An area chart with one shaded area over the months of 2033, January to December. The vertical axis shows rain from 0 to 120 millimetres with gridlines every 20.';

const poolMonths = ['2034-04', '2034-05', '2034-06', '2034-07', '2034-08', '2034-09'];
const swims: Record<string, readonly number[]> = {
  Adult: [800, 900, 1000, 900, 700, 800],
  Child: [400, 500, 700, 1200, 1300, 500],
  Club: [300, 300, 300, 200, 200, 300],
};
const poolSwims: ChartInput = {
  type: 'area',
  title: 'Swims at Corrowen pool by ticket type, 2034',
  fields: [
    { name: 'month', kind: 'temporal', label: 'Month' },
    { name: 'ticket', kind: 'nominal', label: 'Ticket' },
    { name: 'swims', kind: 'quantitative', label: 'Swims' },
  ],
  data: Object.entries(swims).flatMap(([ticket, counts]) =>
    poolMonths.map((month, i) => ({ month, ticket, swims: counts[i]! })),
  ),
  x: 'month',
  y: 'swims',
  series: 'ticket',
  labelling: 'legend',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 2500], tickStep: 500 },
};
const poolSwimsAlt =
  'A stacked area chart over the months April to September 2034, with adult swims at the bottom, child swims in the middle and club swims on top, told apart by colour in a legend. The vertical axis shows swims from 0 to 2,500.';

const weeks = [23, 24, 25, 26, 27, 28, 29, 30, 31, 32];
const visitorsByWeek = [2000, 2500, 3000, 4000, 7000, 4500, 4500, 4000, 3500, 3000];
const islandPeople: ChartInput = {
  type: 'area',
  title: 'People on Velmora Isle each week of summer 2033',
  fields: [
    { name: 'week', kind: 'quantitative', label: 'Week of the year' },
    { name: 'group', kind: 'nominal', label: 'Group' },
    { name: 'people', kind: 'quantitative', label: 'People' },
  ],
  data: [
    ...weeks.map((week) => ({ week, group: 'Residents', people: 12000 })),
    ...weeks.map((week, i) => ({ week, group: 'Visitors', people: visitorsByWeek[i]! })),
  ],
  x: 'week',
  y: 'people',
  series: 'group',
  labelling: 'direct',
  gridlines: true,
  annotation: { text: 'Music festival', field: 'week', equals: 27 },
  valueAxis: { scale: 'linear', domain: [0, 20000], tickStep: 2000 },
};
const islandPeopleAlt =
  'A stacked area chart over weeks 23 to 32 of 2033, with residents at the bottom and visitors on top, each labelled on the chart. A note marks the week of the music festival. The vertical axis shows people from 0 to 20,000.';

export const areaDrafts: readonly Draft[] = [
  {
    id: 'garden-rain-area-read-1',
    scenario: 'garden',
    level: 'read',
    chart: gardenRain,
    prompt: 'How much rain fell at the garden in June 2033, in millimetres?',
    options: numberOptions([20, 40, 60], 'mm'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'rain', where: { month: '2033-06' } }, expect: 40 },
    alt: gardenRainAlt,
    rationale:
      'The top of the area is at 40 mm above June. 60 mm is May and 20 mm is July, the months beside it.',
    distractors: ['neighbour'],
  },
  {
    id: 'town-pool-area-read-1',
    scenario: 'town',
    level: 'read',
    chart: poolSwims,
    prompt: 'How many child swims were there at the pool in August 2034?',
    options: numberOptions([700, 1300, 2000], 'swims'),
    order: 'fixed',
    key: {
      query: { op: 'value-at', field: 'swims', where: { month: '2034-08', ticket: 'Child' } },
      expect: 1300,
    },
    alt: poolSwimsAlt,
    rationale:
      'In August the child band runs from 700 to 2,000 swims, so it is 1,300 swims thick. 2,000 is the top of the band and 700 is the adult band below it.',
    distractors: ['stacked-top', 'legend-confusion'],
    multiStep: true,
  },
  {
    id: 'isle-people-area-read-1',
    scenario: 'isle',
    level: 'read',
    chart: islandPeople,
    prompt: 'How many visitors were on the island in the week of the music festival?',
    options: numberOptions([4000, 7000, 12000, 19000], 'visitors'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'people', where: { week: 27, group: 'Visitors' } }, expect: 7000 },
    alt: islandPeopleAlt,
    rationale:
      'In week 27 the visitors band runs from 12,000 to 19,000 people, so there were 7,000 visitors. 19,000 is the top of the stack, 12,000 is the residents band and 4,000 is the week before.',
    distractors: ['stacked-top', 'legend-confusion', 'neighbour'],
    multiStep: true,
  },
  {
    id: 'town-pool-area-interpret-1',
    scenario: 'town',
    level: 'interpret',
    chart: poolSwims,
    prompt: 'Which sentence describes the child swims over the summer?',
    options: statements([
      ['peak-then-drop', 'They rose to a peak in August and then dropped sharply.'],
      ['steady', 'They stayed about the same from April to September.'],
      ['highest-april', 'They were highest in April and fell after that.'],
      ['rose-throughout', 'They rose in every month from April to September.'],
    ]),
    key: { option: 'peak-then-drop' },
    alt: poolSwimsAlt,
    rationale:
      'The child band grows from 400 swims in April to 1,300 in August and shrinks to 500 in September. The thickness of the middle band, not its top edge, shows this.',
    distractors: ['stacked-top', 'other'],
  },
  {
    id: 'garden-rain-area-interpret-1',
    scenario: 'garden',
    level: 'interpret',
    chart: gardenRain,
    prompt: 'Which sentence describes the rain at the garden over 2033?',
    options: statements([
      ['wet-winter', 'It was wettest in the winter months and driest in July.'],
      ['wet-summer', 'It was wettest in the summer months and driest in January.'],
      ['even', 'About the same amount of rain fell in every month.'],
      ['rising', 'Each month had more rain than the month before it.'],
    ]),
    key: { option: 'wet-winter' },
    alt: gardenRainAlt,
    rationale:
      'The area is highest at the two ends (90 mm in January, 110 mm in December) and lowest in July (20 mm).',
    distractors: ['other'],
  },
  {
    id: 'isle-people-area-envision-1',
    scenario: 'isle',
    level: 'envision',
    chart: islandPeople,
    prompt:
      "The council wants to plan extra ferries for next year's festival week. Which further data would help most?",
    options: statements([
      ['past-festivals', 'Visitor numbers in the festival week of earlier years'],
      ['district-residents', 'The number of residents in each district'],
      ['festival-weather', "The temperature in this year's festival week"],
      ['visitor-pie', "A pie chart of this year's visitors and residents"],
    ]),
    key: { option: 'past-festivals' },
    alt: islandPeopleAlt,
    rationale:
      'One festival week shows one jump to 7,000 visitors. Several years of festival weeks would show whether the jump repeats and whether it is growing, which is what planning needs.',
    distractors: ['outlier-as-trend', 'other'],
  },
  {
    id: 'town-pool-area-envision-1',
    scenario: 'town',
    level: 'envision',
    chart: poolSwims,
    prompt: 'Which chart would show more clearly how the share of club swims changed from month to month?',
    options: statements([
      ['stacked-100', 'A bar for each month split by ticket type, each bar 100 %'],
      ['one-pie', 'One pie chart of all the swims over the summer'],
      ['ward-map', 'A map of Corrowen with the pool marked on it'],
      ['adult-line', 'A line chart of the adult swims on their own'],
    ]),
    key: { option: 'stacked-100' },
    alt: poolSwimsAlt,
    rationale:
      'A share changing over time needs one whole for each month. Bars scaled to 100 % show the club part of each month directly; one pie mixes all months together.',
    distractors: ['other'],
  },
];
