/** Grouped bar items: Lumen Hall room visits, Orbelle Bikes rentals by type, Corrowen buses. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, numberOptions, statements } from './draft.js';

const roomVisits: ChartInput = {
  type: 'grouped-bar',
  title: 'Visits to four Lumen Hall rooms in one week',
  fields: [
    { name: 'room', kind: 'nominal', label: 'Room' },
    { name: 'group', kind: 'nominal', label: 'Visitor group' },
    { name: 'visits', kind: 'quantitative', label: 'Visits' },
  ],
  data: [
    { room: 'Light Lab', group: 'School groups', visits: 340 },
    { room: 'Light Lab', group: 'Families', visits: 200 },
    { room: 'Sound Room', group: 'School groups', visits: 150 },
    { room: 'Sound Room', group: 'Families', visits: 300 },
    { room: 'Robot Bay', group: 'School groups', visits: 380 },
    { room: 'Robot Bay', group: 'Families', visits: 420 },
    { room: 'Water Table', group: 'School groups', visits: 120 },
    { room: 'Water Table', group: 'Families', visits: 460 },
  ],
  category: 'room',
  series: 'group',
  value: 'visits',
  labelling: 'legend',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 500], tickStep: 100 },
};
const roomVisitsAlt =
  'A grouped bar chart of four rooms, each with two bars: one for school groups and one for families, told apart by colour in a legend. The vertical axis shows visits from 0 to 500 with gridlines every 100.';

const rentalMonths = ['April', 'May', 'June', 'July', 'August', 'September'];
const rentalCounts: Record<string, readonly number[]> = {
  'City bikes': [60, 85, 80, 70, 64, 72],
  'E-bikes': [30, 45, 58, 76, 68, 40],
  'Cargo bikes': [15, 20, 22, 25, 18, 16],
};
const rentalsByType: ChartInput = {
  type: 'grouped-bar',
  title: 'Bikes rented at Hill Street in 2034',
  fields: [
    { name: 'month', kind: 'ordinal', label: 'Month', order: rentalMonths },
    { name: 'bike', kind: 'nominal', label: 'Type of bike' },
    { name: 'rentals', kind: 'quantitative', label: 'Rentals', unit: 'bikes' },
  ],
  data: rentalMonths.flatMap((month, i) =>
    Object.entries(rentalCounts).map(([bike, counts]) => ({ month, bike, rentals: counts[i]! })),
  ),
  category: 'month',
  series: 'bike',
  value: 'rentals',
  labelling: 'legend',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 100], tickStep: 20 },
};
const rentalsByTypeAlt =
  'A grouped bar chart with six months from April to September. Each month has three bars, for city bikes, e-bikes and cargo bikes, told apart by colour in a legend. The vertical axis shows rentals from 0 to 100.';

const busRoutes: ChartInput = {
  type: 'grouped-bar',
  title: 'Corrowen bus passengers: weekday and Saturday',
  fields: [
    { name: 'route', kind: 'nominal', label: 'Bus route' },
    { name: 'day', kind: 'nominal', label: 'Day' },
    { name: 'passengers', kind: 'quantitative', label: 'Passengers' },
  ],
  data: [
    { route: 'Route 1', day: 'Weekday', passengers: 1100 },
    { route: 'Route 1', day: 'Saturday', passengers: 700 },
    { route: 'Route 2', day: 'Weekday', passengers: 650 },
    { route: 'Route 2', day: 'Saturday', passengers: 420 },
    { route: 'Route 3', day: 'Weekday', passengers: 900 },
    { route: 'Route 3', day: 'Saturday', passengers: 500 },
    { route: 'Route 4', day: 'Weekday', passengers: 480 },
    { route: 'Route 4', day: 'Saturday', passengers: 300 },
    { route: 'Route 5', day: 'Weekday', passengers: 380 },
    { route: 'Route 5', day: 'Saturday', passengers: 560 },
  ],
  category: 'route',
  series: 'day',
  value: 'passengers',
  orientation: 'horizontal',
  labelling: 'legend',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 1200], tickStep: 200 },
};
const busRoutesAlt =
  'A horizontal grouped bar chart of five bus routes. Each route has two bars, one for a weekday and one for a Saturday, told apart by colour in a legend. The horizontal axis shows passengers from 0 to 1,200.';

export const groupedBarDrafts: readonly Draft[] = [
  {
    id: 'science-rooms-grouped-bar-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: roomVisits,
    prompt: 'How many family visits did the Sound Room have that week?',
    options: numberOptions([150, 200, 300, 420], 'visits'),
    order: 'fixed',
    key: {
      query: { op: 'value-at', field: 'visits', where: { room: 'Sound Room', group: 'Families' } },
      expect: 300,
    },
    alt: roomVisitsAlt,
    rationale:
      'The families bar for the Sound Room reaches 300. 150 is the school groups bar in the same room (the other legend colour); 200 and 420 are the families bars in the rooms beside it.',
    distractors: ['legend-confusion', 'neighbour'],
  },
  {
    id: 'bikeshop-rentals-grouped-bar-read-1',
    scenario: 'bike-shop',
    level: 'read',
    chart: rentalsByType,
    prompt: 'In which month were the most e-bikes rented at Hill Street?',
    options: categoryOptions(['May', 'June', 'July', 'August']),
    order: 'fixed',
    key: {
      query: { op: 'largest', field: 'rentals', by: 'month', aggregate: 'sum', where: { bike: 'E-bikes' } },
      expect: 'July',
    },
    alt: rentalsByTypeAlt,
    rationale:
      'The e-bike bars are tallest in July (76 rentals). May has the tallest city-bike bar, which is the colour next to it in the legend; June and August are the months beside July.',
    distractors: ['legend-confusion', 'neighbour'],
  },
  {
    id: 'town-buses-grouped-bar-read-1',
    scenario: 'town',
    level: 'read',
    chart: busRoutes,
    prompt: 'How many more passengers did Route 3 carry on the weekday than on the Saturday?',
    options: numberOptions([200, 400, 600, 900], 'passengers'),
    order: 'fixed',
    key: {
      query: {
        op: 'difference',
        a: { op: 'value-at', field: 'passengers', where: { route: 'Route 3', day: 'Weekday' } },
        b: { op: 'value-at', field: 'passengers', where: { route: 'Route 3', day: 'Saturday' } },
        absolute: false,
      },
      expect: 400,
    },
    alt: busRoutesAlt,
    rationale:
      'Route 3 carried 900 passengers on the weekday and 500 on the Saturday: 400 more. 900 is the weekday bar on its own.',
    distractors: ['wrong-operation', 'other'],
    multiStep: true,
  },
  {
    id: 'science-rooms-grouped-bar-interpret-1',
    scenario: 'science-centre',
    level: 'interpret',
    chart: roomVisits,
    prompt: 'Which sentence compares the two visitor groups correctly?',
    options: statements([
      ['families-three', 'Families made more visits than school groups in three of the four rooms.'],
      ['schools-all', 'School groups made more visits than families in all four rooms.'],
      ['families-all', 'Families made more visits than school groups in all four rooms.'],
      ['about-equal', 'The two groups made about the same number of visits in each room.'],
    ]),
    key: { option: 'families-three' },
    alt: roomVisitsAlt,
    rationale:
      'Families made more visits in the Sound Room (300 to 150), Robot Bay (420 to 380) and Water Table (460 to 120). Only the Light Lab had more school visits (340 to 200).',
    distractors: ['other'],
  },
  {
    id: 'town-buses-grouped-bar-interpret-1',
    scenario: 'town',
    level: 'interpret',
    chart: busRoutes,
    prompt: 'Which sentence fits the chart?',
    options: statements([
      ['one-busier-saturday', 'One route carried more passengers on the Saturday than on the weekday.'],
      ['all-busier-weekday', 'Every route carried more passengers on the weekday than on the Saturday.'],
      ['most-busier-saturday', 'Most routes carried more passengers on the Saturday than on the weekday.'],
      ['same-both-days', 'Each route carried about the same number of passengers on both days.'],
    ]),
    key: { option: 'one-busier-saturday' },
    alt: busRoutesAlt,
    rationale:
      'Route 5 carried 560 passengers on the Saturday and 380 on the weekday. The other four routes were busier on the weekday, so "every route" overlooks the exception.',
    distractors: ['outlier-as-trend', 'other'],
  },
  {
    id: 'bikeshop-rentals-grouped-bar-envision-1',
    scenario: 'bike-shop',
    level: 'envision',
    chart: rentalsByType,
    prompt:
      'E-bike rentals fell from July to September. If October goes on in the same way, which number of e-bike rentals is the most reasonable guess for October?',
    options: statements([
      ['about-25', 'About 25 e-bike rentals'],
      ['about-60', 'About 60 e-bike rentals'],
      ['about-80', 'About 80 e-bike rentals'],
      ['about-100', 'About 100 e-bike rentals'],
    ]),
    order: 'fixed',
    key: { option: 'about-25' },
    alt: rentalsByTypeAlt,
    rationale:
      'E-bike rentals went from 76 in July to 68 in August and 40 in September. Carrying on downwards gives a number below 40, so about 25 is the only reasonable guess.',
    distractors: ['other'],
  },
  {
    id: 'science-rooms-grouped-bar-envision-1',
    scenario: 'science-centre',
    level: 'envision',
    chart: roomVisits,
    prompt:
      "The centre wants to show what part of each room's visits came from families. Which chart would show that best?",
    options: statements([
      ['stacked-100', 'A bar for each room split into school and family parts, each bar 100 %'],
      ['line-rooms', 'A line chart with one line for each room across the week'],
      ['one-pie', 'One pie chart of all visits with a slice for each room'],
      ['scatter-groups', 'A scatter plot of school visits against family visits'],
    ]),
    key: { option: 'stacked-100' },
    alt: roomVisitsAlt,
    rationale:
      "A part of each room's total is a part-to-whole question for every room; bars scaled to 100 % show the family share of each room directly. One pie loses the split between groups.",
    distractors: ['other'],
  },
];
