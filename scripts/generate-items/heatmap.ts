/** Heatmap items: Lumen Hall visitors by day and time, Corrowen library visits by day and hour. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, numberOptions, statements } from './draft.js';

const slots = ['10:00–12:00', '12:00–14:00', '14:00–16:00', '16:00–18:00'];
const centreDays = ['Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
const centreCounts: Record<string, readonly number[]> = {
  Tuesday: [320, 180, 210, 90],
  Wednesday: [340, 200, 230, 110],
  Thursday: [300, 170, 260, 120],
  Friday: [280, 220, 250, 140],
  Saturday: [150, 380, 410, 260],
};
const centreWeek: ChartInput = {
  type: 'heatmap',
  title: 'Visitors arriving at Lumen Hall in one week',
  fields: [
    { name: 'slot', kind: 'ordinal', label: 'Time', order: slots },
    { name: 'day', kind: 'ordinal', label: 'Day', order: centreDays },
    { name: 'visitors', kind: 'quantitative', label: 'Visitors' },
  ],
  data: centreDays.flatMap((day) =>
    slots.map((slot, i) => ({ slot, day, visitors: centreCounts[day]![i]! })),
  ),
  x: 'slot',
  y: 'day',
  value: 'visitors',
  cellLabels: true,
  classes: 5,
};
const centreWeekAlt =
  'A heatmap grid with five rows, Tuesday to Saturday, and four columns of two-hour times from 10:00 to 18:00. Darker cells mean more visitors, and each cell shows its number.';

const hours = ['10:00', '11:00', '12:00', '13:00', '14:00', '15:00', '16:00'];
const libraryDays = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
const libraryCounts: Record<string, readonly number[]> = {
  Monday: [20, 25, 30, 25, 35, 70, 85],
  Tuesday: [15, 20, 35, 30, 40, 75, 90],
  Wednesday: [20, 30, 40, 35, 45, 80, 95],
  Thursday: [10, 20, 30, 30, 40, 70, 80],
  Friday: [25, 30, 35, 40, 50, 65, 75],
  Saturday: [70, 120, 90, 60, 50, 40, 30],
};
const libraryWeek: ChartInput = {
  type: 'heatmap',
  title: 'Visits to Corrowen library in one week',
  fields: [
    { name: 'hour', kind: 'ordinal', label: 'Hour starting', order: hours },
    { name: 'day', kind: 'ordinal', label: 'Day', order: libraryDays },
    { name: 'visits', kind: 'quantitative', label: 'Visits' },
  ],
  data: libraryDays.flatMap((day) =>
    hours.map((hour, i) => ({ hour, day, visits: libraryCounts[day]![i]! })),
  ),
  x: 'hour',
  y: 'day',
  value: 'visits',
  labelling: 'legend',
  cellLabels: false,
  classes: 5,
};
const libraryWeekAlt =
  'A heatmap grid with six rows, Monday to Saturday, and seven columns, one for each hour from 10:00 to 16:00. Cells are shaded in five steps from light (few visits) to dark (many visits), explained in a legend; the cells show no numbers.';

export const heatmapDrafts: readonly Draft[] = [
  {
    id: 'science-week-heatmap-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: centreWeek,
    prompt: 'How many visitors arrived on Thursday between 12:00 and 14:00?',
    options: numberOptions([170, 220, 260, 300], 'visitors'),
    order: 'fixed',
    key: {
      query: { op: 'value-at', field: 'visitors', where: { day: 'Thursday', slot: '12:00–14:00' } },
      expect: 170,
    },
    alt: centreWeekAlt,
    rationale:
      'The Thursday row and the 12:00–14:00 column meet at 170. 300 and 260 are the cells to its left and right; 220 is Friday in the same column.',
    distractors: ['neighbour'],
  },
  {
    id: 'town-library-heatmap-read-1',
    scenario: 'town',
    level: 'read',
    chart: libraryWeek,
    prompt: 'On Saturday, in which hour did the library have the most visits?',
    options: categoryOptions(['10:00', '11:00', '12:00', '16:00'], (h) => `The hour starting ${h}`),
    order: 'fixed',
    key: {
      query: { op: 'largest', field: 'visits', by: 'hour', aggregate: 'sum', where: { day: 'Saturday' } },
      expect: '11:00',
    },
    alt: libraryWeekAlt,
    rationale:
      'The darkest cell in the Saturday row is the hour starting 11:00 (120 visits). 12:00 is the next darkest; 16:00 is the busiest hour on the other days, not on Saturday.',
    distractors: ['neighbour', 'other'],
  },
  {
    id: 'town-library-heatmap-interpret-1',
    scenario: 'town',
    level: 'interpret',
    chart: libraryWeek,
    prompt: 'Which pattern does the chart show?',
    options: statements([
      ['weekday-afternoon', 'Weekdays were busiest late in the afternoon, Saturday late in the morning.'],
      ['all-ten', 'Every day was busiest in the first hour, starting at 10:00.'],
      ['saturday-quiet', 'Saturday was quiet all day compared with the weekdays.'],
      ['same-all-hours', 'The library had about the same number of visits every hour.'],
    ]),
    key: { option: 'weekday-afternoon' },
    alt: libraryWeekAlt,
    rationale:
      'Monday to Friday the darkest cells are at 15:00 and 16:00 (65 to 95 visits). On Saturday the darkest cell is at 11:00 (120 visits) and the afternoon is light.',
    distractors: ['other'],
  },
  {
    id: 'science-week-heatmap-interpret-1',
    scenario: 'science-centre',
    level: 'interpret',
    chart: centreWeek,
    prompt: 'Which sentence fits the chart?',
    options: statements([
      ['weekday-mornings', 'On weekdays the mornings were busiest; on Saturday the afternoons were.'],
      ['always-morning', 'Every day, the most visitors came between 10:00 and 12:00.'],
      ['saturday-quietest', 'Saturday was the quietest day of the week.'],
      ['last-slot-busiest', 'Every day, the most visitors came in the last slot, after 16:00.'],
    ]),
    key: { option: 'weekday-mornings' },
    alt: centreWeekAlt,
    rationale:
      'Tuesday to Friday the 10:00–12:00 cell is the largest in its row (280 to 340). On Saturday the 14:00–16:00 cell is the largest (410), and Saturday is the busiest day overall.',
    distractors: ['other'],
  },
  {
    id: 'town-library-heatmap-envision-1',
    scenario: 'town',
    level: 'envision',
    chart: libraryWeek,
    prompt: 'The library wants to know whether rainy days bring more visits. Which further data would help?',
    options: statements([
      ['rain-each-day', 'How much rain fell on each day the visits were counted'],
      ['books-owned', 'How many books the library owns'],
      ['darker-colours', 'The same chart in darker colours'],
      ['opening-hours', 'The hours the library is open each day'],
    ]),
    key: { option: 'rain-each-day' },
    alt: libraryWeekAlt,
    rationale:
      'To compare rainy and dry days, each day of counts needs its rain. One week is also only a few days, so more weeks with rain records would help further.',
    distractors: ['other'],
  },
  {
    id: 'science-week-heatmap-envision-1',
    scenario: 'science-centre',
    level: 'envision',
    chart: centreWeek,
    prompt: "Which chart would best show how each day's total number of visitors compares with the others?",
    options: statements([
      ['day-totals-bars', "A bar chart with one bar for each day's total"],
      ['slot-pie', 'A pie chart of the visitors in each time slot'],
      ['saturday-line', 'A line chart of Saturday on its own'],
      ['more-colours', 'This grid with more shades of colour'],
    ]),
    key: { option: 'day-totals-bars' },
    alt: centreWeekAlt,
    rationale:
      'Comparing day totals means adding each row and comparing lengths on one scale, which a bar per day does. The grid makes the reader add four numbers in their head for each day.',
    distractors: ['other'],
  },
];
