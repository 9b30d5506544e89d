/** Bar chart items: garden harvest, Velmora Isle harbours, Lumen Hall collections, Orbelle Bikes sales. */
import type { ChartInput, Draft } from './draft.js';
import { numberOptions, statements } from './draft.js';

export const harvest: ChartInput = {
  type: 'bar',
  title: 'Sprout Lane Garden harvest this year',
  fields: [
    { name: 'crop', kind: 'nominal', label: 'Crop' },
    { name: 'kg', kind: 'quantitative', label: 'Harvest', unit: 'kg' },
  ],
  data: [
    { crop: 'Potatoes', kg: 320 },
    { crop: 'Beans', kg: 140 },
    { crop: 'Squash', kg: 250 },
    { crop: 'Kale', kg: 90 },
  ],
  category: 'crop',
  value: 'kg',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [0, 350], tickStep: 50 },
};
export const harvestAlt =
  'A vertical bar chart with four bars, one for each crop: potatoes, beans, squash and kale. The vertical axis shows the harvest from 0 to 350 kilograms with gridlines every 50 kilograms.';

const harbours: ChartInput = {
  type: 'bar',
  title: 'Ferry passengers on one Saturday',
  fields: [
    { name: 'harbour', kind: 'nominal', label: 'Harbour' },
    { name: 'passengers', kind: 'quantitative', label: 'Passengers' },
  ],
  data: [
    { harbour: 'Windlow', passengers: 110 },
    { harbour: 'Reedhaven', passengers: 620 },
    { harbour: 'Heronmoor', passengers: 60 },
    { harbour: 'Tidewell', passengers: 310 },
    { harbour: 'Gullstone', passengers: 150 },
    { harbour: 'Pebblewick', passengers: 240 },
    { harbour: 'Driftholm', passengers: 80 },
    { harbour: 'Lanternpoint', passengers: 130 },
  ],
  category: 'harbour',
  value: 'passengers',
  orientation: 'horizontal',
  sort: 'none',
  valueAxis: { scale: 'linear', domain: [0, 700], tickStep: 100 },
  note: 'Velmora Isle harbour office',
};
const harboursAlt =
  'A horizontal bar chart with eight bars, one for each harbour of Velmora Isle, in no particular order. The horizontal axis shows passengers from 0 to 700.';

const collections: ChartInput = {
  type: 'bar',
  title: 'Objects in the Lumen Hall collections',
  fields: [
    { name: 'collection', kind: 'nominal', label: 'Collection' },
    { name: 'objects', kind: 'quantitative', label: 'Objects' },
  ],
  data: [
    { collection: 'Insects', objects: 20000 },
    { collection: 'Shells', objects: 2000 },
    { collection: 'Fossils', objects: 400 },
    { collection: 'Minerals', objects: 100 },
    { collection: 'Meteorites', objects: 10 },
  ],
  category: 'collection',
  value: 'objects',
  gridlines: true,
  valueAxis: { scale: 'log', domain: [1, 100000] },
};
const collectionsAlt =
  'A vertical bar chart with five bars, one for each collection: insects, shells, fossils, minerals and meteorites. The vertical axis is a log scale from 1 to 100,000 objects, with each labelled step ten times the one below.';

const bikeSales: ChartInput = {
  type: 'bar',
  title: 'New bikes sold by Orbelle Bikes each year',
  fields: [
    { name: 'year', kind: 'ordinal', label: 'Year', order: ['2031', '2032', '2033', '2034'] },
    { name: 'bikes', kind: 'quantitative', label: 'Bikes sold' },
  ],
  data: [
    { year: '2031', bikes: 450 },
    { year: '2032', bikes: 458 },
    { year: '2033', bikes: 466 },
    { year: '2034', bikes: 480 },
  ],
  category: 'year',
  value: 'bikes',
  gridlines: true,
  valueAxis: { scale: 'linear', domain: [440, 490], tickStep: 10 },
};
const bikeSalesAlt =
  'A vertical bar chart with four bars, one for each year from 2031 to 2034. The vertical axis starts at 440 bikes, not at 0, and ends at 490 bikes.';

export const barDrafts: readonly Draft[] = [
  {
    id: 'garden-harvest-bar-read-1',
    scenario: 'garden',
    level: 'read',
    chart: harvest,
    prompt: 'How many kilograms of squash did the garden harvest this year?',
    options: numberOptions([140, 200, 250, 320], 'kg'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'kg', where: { crop: 'Squash' } }, expect: 250 },
    alt: harvestAlt,
    rationale:
      'The squash bar ends at the 250 kg gridline. 320 kg and 140 kg are the bars beside it; 200 kg is a gridline below the bar end.',
    distractors: ['neighbour', 'gridline'],
  },
  {
    id: 'isle-harbours-bar-read-1',
    scenario: 'isle',
    level: 'read',
    chart: harbours,
    prompt: 'Counting from the busiest harbour, in which place does Tidewell come?',
    options: [
      { id: 'first', text: '1st', value: 1 },
      { id: 'second', text: '2nd', value: 2 },
      { id: 'third', text: '3rd', value: 3 },
      { id: 'fourth', text: '4th', value: 4 },
    ],
    order: 'fixed',
    key: {
      query: {
        op: 'rank',
        field: 'passengers',
        by: 'harbour',
        equals: 'Tidewell',
        order: 'descending',
        aggregate: 'sum',
      },
      expect: 2,
    },
    alt: harboursAlt,
    rationale:
      'Only Reedhaven (620 passengers) is longer than Tidewell (310). The bars are not sorted, so the reader must compare lengths, not positions; Tidewell is the 4th bar from the top.',
    distractors: ['neighbour', 'other'],
    multiStep: true,
  },
  {
    id: 'science-collections-bar-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: collections,
    prompt: 'The insect collection has how many times as many objects as the shell collection?',
    options: [
      { id: 'n1-5', text: '1.5 times', value: 1.5 },
      { id: 'n10', text: '10 times', value: 10 },
      { id: 'n100', text: '100 times', value: 100 },
    ],
    order: 'fixed',
    key: {
      query: {
        op: 'ratio',
        a: { op: 'value-at', field: 'objects', where: { collection: 'Insects' } },
        b: { op: 'value-at', field: 'objects', where: { collection: 'Shells' } },
        round: 1,
      },
      expect: 10,
    },
    alt: collectionsAlt,
    rationale:
      'Insects reach 20,000 and shells 2,000, so insects have 10 times as many. On a log scale the insect bar is only about 1.3 times as tall (1.5 times is the bar-length answer); 100 times counts two steps of ten instead of one.',
    distractors: ['ignored-log-scale', 'neighbour'],
    multiStep: true,
  },
  {
    id: 'isle-harbours-bar-interpret-1',
    scenario: 'isle',
    level: 'interpret',
    chart: harbours,
    prompt: 'Which sentence about the harbours fits the chart?',
    options: statements([
      ['more-than-two', 'Reedhaven had more passengers than Tidewell and Pebblewick together.'],
      ['twice-two', 'Reedhaven had twice as many as Tidewell and Pebblewick together.'],
      ['all-above-100', 'Every harbour had at least 100 passengers on that Saturday.'],
      ['even-spread', 'The passengers were spread about evenly over the harbours.'],
    ]),
    key: { option: 'more-than-two' },
    alt: harboursAlt,
    rationale:
      'Reedhaven had 620 passengers; Tidewell (310) and Pebblewick (240) together had 550. Twice 550 would be 1,100. Heronmoor (60) and Driftholm (80) had fewer than 100.',
    distractors: ['wrong-operation', 'other'],
  },
  {
    id: 'bikeshop-sales-bar-interpret-1',
    scenario: 'bike-shop',
    level: 'interpret',
    chart: bikeSales,
    prompt: 'How did the number of new bikes sold change from 2031 to 2034?',
    options: statements([
      ['small-rise', 'It rose a little, from about 450 to about 480 bikes.'],
      ['four-times', 'It rose to about four times as many, as the bars show.'],
      ['doubled', 'It about doubled, from about 240 to about 480 bikes.'],
      ['fell', 'It fell a little, from about 480 to about 450 bikes.'],
    ]),
    key: { option: 'small-rise' },
    alt: bikeSalesAlt,
    rationale:
      'The axis starts at 440, so the 2034 bar looks four times as tall as the 2031 bar, but the values are 450 and 480 bikes: a rise of about 7 per cent.',
    distractors: ['truncated-axis', 'other'],
  },
  {
    id: 'garden-harvest-bar-envision-1',
    scenario: 'garden',
    level: 'envision',
    chart: harvest,
    prompt: 'The garden wants to know if its harvest is growing from year to year. What would it need?',
    options: statements([
      ['earlier-years', 'The same four crops weighed in earlier years'],
      ['beds-split', "This year's harvest split up by garden bed"],
      ['pie-chart', "A pie chart of this year's four crops"],
      ['volunteer-count', 'The number of volunteers who picked the crops'],
    ]),
    key: { option: 'earlier-years' },
    alt: harvestAlt,
    rationale:
      'The chart shows one year only. Growth from year to year can only be seen by comparing with the same crops in earlier years; another view of this year cannot show change.',
    distractors: ['other'],
  },
  {
    id: 'isle-harbours-bar-envision-1',
    scenario: 'isle',
    level: 'envision',
    chart: harbours,
    prompt:
      'The harbour office wants to see how passengers at Reedhaven changed hour by hour on that Saturday. Which chart would show this best?',
    options: statements([
      ['line-by-hour', 'A line chart of Reedhaven passengers for each hour'],
      ['sorted-bars', 'This bar chart with the bars sorted by length'],
      ['pie-harbours', 'A pie chart of the passengers at each harbour'],
      ['map-harbours', 'A map of the island with a dot for each harbour'],
    ]),
    key: { option: 'line-by-hour' },
    alt: harboursAlt,
    rationale:
      'A change through the day needs counts for each hour on a time axis, which a line chart shows. The other charts only show the day total for each harbour.',
    distractors: ['other'],
  },
];
