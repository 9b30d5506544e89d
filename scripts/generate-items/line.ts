/** Line chart items: Velmora Isle temperatures, Lumen Hall memberships, Orbelle Bikes online orders. */
import type { ChartInput, Draft } from './draft.js';
import { numberOptions, statements } from './draft.js';

const temperatures = [4, 5, 7, 9, 12, 15, 16, 18, 15, 12, 8, 5];
const islandTemperature: ChartInput = {
  type: 'line',
  title: 'Temperature at Lanternpoint, 2033',
  fields: [
    { name: 'month', kind: 'temporal', label: 'Month' },
    { name: 'temperature', kind: 'quantitative', label: 'Average temperature', unit: '°C' },
  ],
  data: temperatures.map((temperature, i) => ({
    month: `2033-${String(i + 1).padStart(2, '0')}`,
    temperature,
  })),
  x: 'month',
  y: 'temperature',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 20], tickStep: 2 },
};
const islandTemperatureAlt =
  'A line chart with one line and a marker for each month of 2033, January to December. The vertical axis shows average temperature from 0 to 20 °C with gridlines every 2 degrees.';

const memberYears = [2029, 2030, 2031, 2032, 2033, 2034];
const members: Record<string, readonly number[]> = {
  Family: [80, 110, 160, 220, 310, 400],
  Adult: [350, 340, 320, 300, 290, 270],
  Child: [150, 160, 150, 140, 160, 150],
};
export const memberships: ChartInput = {
  type: 'line',
  title: "Members of the Lumen Hall members' club",
  fields: [
    { name: 'year', kind: 'temporal', label: 'Year' },
    { name: 'kind', kind: 'nominal', label: 'Membership' },
    { name: 'members', kind: 'quantitative', label: 'Members' },
  ],
  data: Object.entries(members).flatMap(([kind, counts]) =>
    memberYears.map((year, i) => ({ year, kind, members: counts[i]! })),
  ),
  x: 'year',
  y: 'members',
  series: 'kind',
  labelling: 'legend',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 450], tickStep: 50 },
};
export const membershipsAlt =
  'A line chart with three lines, for family, adult and child memberships, told apart by colour in a legend. The horizontal axis shows the years 2029 to 2034; the vertical axis shows members from 0 to 450.';

const onlineOrders: ChartInput = {
  type: 'line',
  title: 'Online orders at Orbelle Bikes each year',
  fields: [
    { name: 'year', kind: 'temporal', label: 'Year' },
    { name: 'orders', kind: 'quantitative', label: 'Online orders' },
  ],
  data: [
    { year: 2029, orders: 10 },
    { year: 2030, orders: 30 },
    { year: 2031, orders: 100 },
    { year: 2032, orders: 300 },
    { year: 2033, orders: 1000 },
    { year: 2034, orders: 3000 },
  ],
  x: 'year',
  y: 'orders',
  gridlines: true,
  valueAxis: { scale: 'log', domain: [1, 10000] },
};
const onlineOrdersAlt =
  'A line chart with one line and a marker for each year from 2029 to 2034. The vertical axis is a log scale from 1 to 10,000 orders, with each labelled step ten times the one below.';

export const lineDrafts: readonly Draft[] = [
  {
    id: 'isle-weather-line-read-1',
    scenario: 'isle',
    level: 'read',
    chart: islandTemperature,
    prompt: 'What was the average temperature at Lanternpoint in October 2033, in °C?',
    options: numberOptions([8, 12, 15, 18], '°C'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'temperature', where: { month: '2033-10' } }, expect: 12 },
    alt: islandTemperatureAlt,
    rationale:
      'The October marker sits on the 12 °C gridline. 15 °C is September and 8 °C is November, the months beside it; 18 °C is the highest point of the year.',
    distractors: ['neighbour', 'other'],
  },
  {
    id: 'science-members-line-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: memberships,
    prompt: 'How many family members did the club have in 2032?',
    options: numberOptions([140, 160, 220, 300], 'members'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'members', where: { year: 2032, kind: 'Family' } }, expect: 220 },
    alt: membershipsAlt,
    rationale:
      'The family line is at 220 in 2032. 140 and 300 are the child and adult lines in 2032 (the other legend colours); 160 is the family line one year earlier.',
    distractors: ['legend-confusion', 'neighbour'],
  },
  {
    id: 'bikeshop-orders-line-read-1',
    scenario: 'bike-shop',
    level: 'read',
    chart: onlineOrders,
    prompt: 'How many online orders did Orbelle Bikes get in 2032?',
    options: numberOptions([100, 300, 550, 1000], 'orders'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'orders', where: { year: 2032 } }, expect: 300 },
    alt: onlineOrdersAlt,
    rationale:
      'On a log scale the point for 2032 lies about half way between 100 and 1,000 in height, which stands for about 300, not 550. Reading it as half way in number (550) ignores the log scale; 100 and 1,000 are the labelled steps on either side.',
    distractors: ['ignored-log-scale', 'gridline'],
    precision: true,
  },
  {
    id: 'isle-weather-line-interpret-1',
    scenario: 'isle',
    level: 'interpret',
    chart: islandTemperature,
    prompt: 'Which sentence describes the temperature at Lanternpoint over 2033?',
    options: statements([
      ['peak-august', 'It rose until August and then fell.'],
      ['peak-july', 'It rose until July and then fell.'],
      ['rose-all-year', 'It rose in every month of the year.'],
      ['flat', 'It stayed about the same all year.'],
    ]),
    key: { option: 'peak-august' },
    alt: islandTemperatureAlt,
    rationale:
      'The line climbs from 4 °C in January to its highest point, 18 °C, in August, then falls to 5 °C in December. July (16 °C) is lower than August, although many people expect July to be warmest.',
    distractors: ['everyday-expectation', 'other'],
  },
  {
    id: 'science-members-line-interpret-1',
    scenario: 'science-centre',
    level: 'interpret',
    chart: memberships,
    prompt: 'Which sentence fits the chart?',
    options: statements([
      ['family-passed-adult', 'Family members went past adult members in 2033.'],
      ['adult-grew', 'Adult members grew in number every year.'],
      ['child-fastest', 'Child members grew faster than the other two kinds.'],
      ['same-rate', 'All three kinds of members grew at the same rate.'],
    ]),
    key: { option: 'family-passed-adult' },
    alt: membershipsAlt,
    rationale:
      'In 2032 there were 220 family and 300 adult members; in 2033 there were 310 family and 290 adult members, so the lines cross. The adult line falls and the child line stays near 150.',
    distractors: ['legend-confusion', 'other'],
  },
  {
    id: 'bikeshop-orders-line-envision-1',
    scenario: 'bike-shop',
    level: 'envision',
    chart: onlineOrders,
    prompt: 'If online orders keep growing in the same way, about how many would you expect in 2035?',
    options: statements([
      ['about-3500', 'About 3,500 orders'],
      ['about-5000', 'About 5,000 orders'],
      ['about-9000', 'About 9,000 orders'],
      ['about-30000', 'About 30,000 orders'],
    ]),
    order: 'fixed',
    key: { option: 'about-9000' },
    alt: onlineOrdersAlt,
    rationale:
      'Each year the orders are about three times the year before (1,000 then 3,000), which is a straight line on a log scale. Three times 3,000 is 9,000. Adding the last step (2,000) gives 5,000 and ignores the log scale.',
    distractors: ['ignored-log-scale', 'other'],
  },
  {
    id: 'science-members-line-envision-1',
    scenario: 'science-centre',
    level: 'envision',
    chart: memberships,
    prompt:
      'The centre raised the price of adult membership in 2030. What can this chart tell you about that?',
    options: statements([
      ['no-cause', 'It shows adult members fell after 2030, but not why they fell.'],
      ['proves-price', 'It proves the price rise made adult members leave the club.'],
      ['families-cause', 'It proves the price rise made families join instead.'],
      ['adults-rose', 'It shows adult members rose after 2030, so price did not matter.'],
    ]),
    key: { option: 'no-cause' },
    alt: membershipsAlt,
    rationale:
      'The adult line falls from 340 in 2030 to 270 in 2034. The chart shows when it fell, but a fall after an event does not show the event caused it; other changes could explain it.',
    distractors: ['correlation-as-cause', 'other'],
  },
];
