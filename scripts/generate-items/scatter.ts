/** Scatter plot items: Lumen Hall exhibits, Sprout Lane tomatoes, Velmora Isle boats and districts. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, numberOptions, statements } from './draft.js';

const exhibits: ChartInput = {
  type: 'scatter',
  title: 'Lumen Hall rooms: time spent and visitor score',
  fields: [
    { name: 'room', kind: 'nominal', label: 'Room' },
    { name: 'minutes', kind: 'quantitative', label: 'Average time in the room', unit: 'minutes' },
    { name: 'score', kind: 'quantitative', label: 'Average visitor score', unit: 'points out of 10' },
  ],
  data: [
    { room: 'Light Lab', minutes: 12, score: 7.5 },
    { room: 'Sound Room', minutes: 8, score: 6 },
    { room: 'Weather Wall', minutes: 5, score: 5 },
    { room: 'Body Works', minutes: 10, score: 7 },
    { room: 'Robot Bay', minutes: 18, score: 9 },
    { room: 'Water Table', minutes: 15, score: 8 },
  ],
  x: 'minutes',
  y: 'score',
  pointLabel: 'room',
  gridlines: true,
  xAxis: { scale: 'linear', domain: [0, 20], tickStep: 2 },
  yAxis: { scale: 'linear', domain: [0, 10], tickStep: 1 },
};
const exhibitsAlt =
  'A scatter plot with six labelled points, one for each room. The horizontal axis shows average time in the room from 0 to 20 minutes; the vertical axis shows the average visitor score from 0 to 10.';

const plants: ReadonlyArray<readonly [number, number]> = [
  [3, 1.2],
  [3.5, 2.1],
  [3.5, 1],
  [4, 2.6],
  [4, 1.6],
  [4.5, 3.1],
  [4.5, 2.2],
  [5, 2.9],
  [5, 4.6],
  [5.5, 3.4],
  [5.5, 2.5],
  [6, 4.4],
  [6, 3.3],
  [6.5, 3.6],
  [6.5, 5.1],
  [7, 4.8],
  [7, 3.5],
  [7.5, 5.6],
  [8, 4.9],
  [8, 6],
];
export const tomatoes: ChartInput = {
  type: 'scatter',
  title: 'Sun and tomatoes for 20 plants',
  fields: [
    { name: 'sun', kind: 'quantitative', label: 'Sun each day', unit: 'hours' },
    { name: 'tomatoes', kind: 'quantitative', label: 'Tomatoes picked', unit: 'kg' },
  ],
  data: plants.map(([sun, kg]) => ({ sun, tomatoes: kg })),
  x: 'sun',
  y: 'tomatoes',
  gridlines: true,
  xAxis: { scale: 'linear', domain: [2, 10], tickStep: 1 },
  yAxis: { scale: 'linear', domain: [0, 8], tickStep: 1 },
};
export const tomatoesAlt =
  'A scatter plot with 20 unlabelled points, one for each tomato plant. The horizontal axis shows hours of sun each day from 2 to 10; the vertical axis shows kilograms of tomatoes picked from 0 to 8, with gridlines every kilogram.';

const boats: ChartInput = {
  type: 'scatter',
  title: 'Boats at Reedhaven: length and weight',
  fields: [
    { name: 'boat', kind: 'nominal', label: 'Boat' },
    { name: 'length', kind: 'quantitative', label: 'Length', unit: 'm' },
    { name: 'weight', kind: 'quantitative', label: 'Weight', unit: 'tonnes' },
  ],
  data: [
    { boat: 'Skua', length: 5, weight: 2 },
    { boat: 'Minnow', length: 6, weight: 3 },
    { boat: 'Tern', length: 8, weight: 6 },
    { boat: 'Kittiwake', length: 10, weight: 10 },
    { boat: 'Cormorant', length: 14, weight: 30 },
    { boat: 'Gannet', length: 20, weight: 100 },
    { boat: 'Island Star', length: 35, weight: 300 },
  ],
  x: 'length',
  y: 'weight',
  pointLabel: 'boat',
  gridlines: true,
  xAxis: { scale: 'linear', domain: [0, 40], tickStep: 5 },
  yAxis: { scale: 'log', domain: [1, 1000] },
};
const boatsAlt =
  'A scatter plot with seven labelled points, one for each boat. The horizontal axis shows length from 0 to 40 metres. The vertical axis is a log scale of weight from 1 to 1,000 tonnes, with each labelled step ten times the one below.';

const districts: ChartInput = {
  type: 'scatter',
  title: 'Velmora Isle: residents and ferry passengers',
  fields: [
    { name: 'district', kind: 'nominal', label: 'District' },
    { name: 'residents', kind: 'quantitative', label: 'Residents', unit: 'people' },
    { name: 'passengers', kind: 'quantitative', label: 'Ferry passengers each week' },
  ],
  data: [
    { district: 'Reedhaven', residents: 4200, passengers: 5200 },
    { district: 'Tidewell', residents: 1800, passengers: 2300 },
    { district: 'Pebblewick', residents: 1300, passengers: 1700 },
    { district: 'Gullstone', residents: 1100, passengers: 1400 },
    { district: 'Windlow', residents: 900, passengers: 1200 },
    { district: 'Driftholm', residents: 650, passengers: 900 },
    { district: 'Lanternpoint', residents: 700, passengers: 3100 },
    { district: 'Heronmoor', residents: 500, passengers: 650 },
  ],
  x: 'residents',
  y: 'passengers',
  pointLabel: 'district',
  xAxis: { scale: 'linear', domain: [0, 5000], tickStep: 1000 },
  yAxis: { scale: 'linear', domain: [0, 6000], tickStep: 1000 },
};
const districtsAlt =
  'A scatter plot with eight labelled points, one for each district with a ferry harbour. The horizontal axis shows residents from 0 to 5,000; the vertical axis shows ferry passengers each week from 0 to 6,000.';

export const scatterDrafts: readonly Draft[] = [
  {
    id: 'science-rooms-scatter-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: exhibits,
    prompt: 'On average, how many minutes do visitors spend in the Robot Bay?',
    options: numberOptions([9, 15, 18, 20], 'minutes'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'minutes', where: { room: 'Robot Bay' } }, expect: 18 },
    alt: exhibitsAlt,
    rationale:
      'The Robot Bay point lies above 18 on the minutes axis. 9 is its score on the other axis, 15 is the Water Table point beside it and 20 is the end of the axis.',
    distractors: ['other', 'neighbour', 'gridline'],
  },
  {
    id: 'garden-tomatoes-scatter-read-1',
    scenario: 'garden',
    level: 'read',
    chart: tomatoes,
    prompt: 'How many plants gave more than 4 kg of tomatoes?',
    options: numberOptions([3, 5, 7], 'plants'),
    order: 'fixed',
    key: { query: { op: 'count', field: 'tomatoes', above: 4 }, expect: 7 },
    alt: tomatoesAlt,
    rationale:
      'Seven points lie above the 4 kg gridline. Counting only the points above 5 kg gives 3; stopping at 7 hours of sun gives 5.',
    distractors: ['gridline', 'other'],
    multiStep: true,
  },
  {
    id: 'isle-boats-scatter-read-1',
    scenario: 'isle',
    level: 'read',
    chart: boats,
    prompt: 'How heavy is the boat called Gannet, in tonnes?',
    options: numberOptions([10, 30, 100, 1000], 'tonnes'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'weight', where: { boat: 'Gannet' } }, expect: 100 },
    alt: boatsAlt,
    rationale:
      'The Gannet point sits on the 100 tonnes line of the log scale. 30 tonnes is the Cormorant beside it; 10 and 1,000 are the labelled steps one below and one above.',
    distractors: ['neighbour', 'ignored-log-scale'],
  },
  {
    id: 'garden-tomatoes-scatter-interpret-1',
    scenario: 'garden',
    level: 'interpret',
    chart: tomatoes,
    prompt: 'What does the chart show about sun and tomatoes?',
    options: statements([
      ['more-sun-more', 'Plants with more sun tended to give more tomatoes.'],
      ['every-plant', 'Each extra hour of sun gave every plant more tomatoes.'],
      ['more-sun-less', 'Plants with more sun tended to give fewer tomatoes.'],
      ['no-link', 'There is no link between sun and the tomatoes picked.'],
    ]),
    key: { option: 'more-sun-more' },
    alt: tomatoesAlt,
    rationale:
      'The points rise from lower left to upper right, but they spread out: at 7 hours one plant gave 3.5 kg and another 4.8 kg. So more sun goes with more tomatoes on the whole, not for every plant.',
    distractors: ['correlation-as-cause', 'other'],
  },
  {
    id: 'isle-districts-scatter-interpret-1',
    scenario: 'isle',
    level: 'interpret',
    chart: districts,
    prompt: 'Which district does not follow the pattern of the others?',
    options: categoryOptions(['Lanternpoint', 'Reedhaven', 'Heronmoor', 'Tidewell']),
    key: { option: 'lanternpoint' },
    alt: districtsAlt,
    rationale:
      'For most districts, passengers rise in step with residents, about 1.3 passengers for each resident. Lanternpoint has only 700 residents but 3,100 passengers. Reedhaven is the largest, but it lies on the same line as the rest.',
    distractors: ['other'],
  },
  {
    id: 'isle-districts-scatter-envision-1',
    scenario: 'isle',
    level: 'envision',
    chart: districts,
    prompt:
      'Lanternpoint has few residents but many ferry passengers. Which further data would best help to explain this?',
    options: statements([
      ['visitors', 'How many visitors travel to Lanternpoint each week'],
      ['district-area', 'The land area of each district in square kilometres'],
      ['reedhaven-residents', 'The number of residents in Reedhaven'],
      ['last-year-heronmoor', "Last year's number of residents in Heronmoor"],
    ]),
    key: { option: 'visitors' },
    alt: districtsAlt,
    rationale:
      'Passengers who are not residents must be visitors or people passing through. Visitor counts would test that; the other data are about other districts or about land, not travel.',
    distractors: ['other'],
  },
  {
    id: 'garden-tomatoes-scatter-envision-1',
    scenario: 'garden',
    level: 'envision',
    chart: tomatoes,
    prompt:
      'The garden adds a plant that gets 9 hours of sun each day. Which harvest is the most reasonable guess for it?',
    options: statements([
      ['about-1', 'About 1 kg of tomatoes'],
      ['about-3', 'About 3 kg of tomatoes'],
      ['about-6-5', 'About 6.5 kg of tomatoes'],
      ['about-15', 'About 15 kg of tomatoes'],
    ]),
    order: 'fixed',
    key: { option: 'about-6-5' },
    alt: tomatoesAlt,
    rationale:
      'The points rise by a bit under 1 kg for each extra hour; at 8 hours they are at 4.9 and 6 kg. Going one hour further gives about 6 to 7 kg. 15 kg is far above anything the trend suggests.',
    distractors: ['other'],
  },
];
