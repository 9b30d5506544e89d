/** Bubble chart items: Orbelle Bikes models, Velmora Isle districts. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, statements } from './draft.js';

const models: ChartInput = {
  type: 'bubble',
  title: 'Orbelle Bikes models sold in 2034',
  fields: [
    { name: 'model', kind: 'nominal', label: 'Model' },
    { name: 'price', kind: 'quantitative', label: 'Price', unit: 'coins' },
    { name: 'sold', kind: 'quantitative', label: 'Bikes sold' },
    { name: 'income', kind: 'quantitative', label: 'Income', unit: 'thousand coins' },
  ],
  data: [
    { model: 'Sprite', price: 150, sold: 120, income: 18 },
    { model: 'Lark', price: 250, sold: 90, income: 22.5 },
    { model: 'Pathfinder', price: 400, sold: 60, income: 24 },
    { model: 'Comet', price: 1500, sold: 30, income: 45 },
    { model: 'Haul', price: 2000, sold: 10, income: 20 },
  ],
  x: 'price',
  y: 'sold',
  size: 'income',
  pointLabel: 'model',
  gridlines: true,
  xAxis: { scale: 'linear', domain: [0, 2500], tickStep: 500 },
  yAxis: { scale: 'linear', domain: [0, 140], tickStep: 20 },
};
const modelsAlt =
  'A bubble chart with five labelled bubbles, one for each bike model. The horizontal axis shows the price from 0 to 2,500 coins, the vertical axis shows bikes sold from 0 to 140, and the area of each bubble shows the income from that model.';

const districtData = [
  { district: 'Reedhaven', area: 6, residents: 4200, visitors: 10000 },
  { district: 'Tidewell', area: 9, residents: 1800, visitors: 6000 },
  { district: 'Pebblewick', area: 8, residents: 1300, visitors: 4000 },
  { district: 'Gullstone', area: 11, residents: 1100, visitors: 5000 },
  { district: 'Windlow', area: 12, residents: 900, visitors: 3000 },
  { district: 'Driftholm', area: 10, residents: 650, visitors: 2000 },
  { district: 'Lanternpoint', area: 7, residents: 700, visitors: 16000 },
  { district: 'Heronmoor', area: 13, residents: 500, visitors: 2500 },
  { district: 'Mossridge', area: 14, residents: 800, visitors: 1500 },
  { district: 'Quarrytop', area: 15, residents: 450, visitors: 1000 },
];
const districts: ChartInput = {
  type: 'bubble',
  title: 'Velmora Isle districts in 2033',
  fields: [
    { name: 'district', kind: 'nominal', label: 'District' },
    { name: 'area', kind: 'quantitative', label: 'Land area', unit: 'km²' },
    { name: 'residents', kind: 'quantitative', label: 'Residents', unit: 'people' },
    { name: 'visitors', kind: 'quantitative', label: 'Visitors in the year' },
  ],
  data: districtData,
  x: 'area',
  y: 'residents',
  size: 'visitors',
  pointLabel: 'district',
  xAxis: { scale: 'linear', domain: [4, 16], tickStep: 2 },
  yAxis: { scale: 'linear', domain: [0, 5000], tickStep: 1000 },
};
const districtsAlt =
  'A bubble chart with ten labelled bubbles, one for each district of Velmora Isle. The horizontal axis shows land area from 4 to 16 square kilometres, the vertical axis shows residents from 0 to 5,000, and the area of each bubble shows the visitors in 2033.';

export const bubbleDrafts: readonly Draft[] = [
  {
    id: 'bikeshop-models-bubble-read-1',
    scenario: 'bike-shop',
    level: 'read',
    chart: models,
    prompt: 'Which model sold the most bikes in 2034?',
    options: categoryOptions(['Sprite', 'Comet', 'Lark', 'Haul']),
    key: { query: { op: 'largest', field: 'sold', by: 'model', aggregate: 'sum' }, expect: 'Sprite' },
    alt: modelsAlt,
    rationale:
      'Sprite is highest on the bikes-sold axis (120 bikes). Comet has the biggest bubble, but bubble size shows income, not bikes sold; Haul is furthest to the right, which is price.',
    distractors: ['area-as-length', 'neighbour', 'other'],
  },
  {
    id: 'isle-districts-bubble-read-1',
    scenario: 'isle',
    level: 'read',
    chart: districts,
    prompt: 'Which district had the most visitors in 2033?',
    options: categoryOptions(['Lanternpoint', 'Reedhaven', 'Quarrytop', 'Tidewell']),
    key: {
      query: { op: 'largest', field: 'visitors', by: 'district', aggregate: 'sum' },
      expect: 'Lanternpoint',
    },
    alt: districtsAlt,
    rationale:
      'Lanternpoint has the biggest bubble (16,000 visitors). Reedhaven is the highest point, which shows residents; Quarrytop is furthest right, which shows land area.',
    distractors: ['other', 'neighbour'],
  },
  {
    id: 'bikeshop-models-bubble-read-2',
    scenario: 'bike-shop',
    level: 'read',
    chart: models,
    prompt: 'The income from Comet was about how many times the income from Sprite?',
    options: [
      { id: 'n1-6', text: '1.6 times', value: 1.6 },
      { id: 'n2-5', text: '2.5 times', value: 2.5 },
      { id: 'n6', text: '6 times', value: 6 },
    ],
    order: 'fixed',
    key: {
      query: {
        op: 'ratio',
        a: { op: 'value-at', field: 'income', where: { model: 'Comet' } },
        b: { op: 'value-at', field: 'income', where: { model: 'Sprite' } },
        round: 1,
      },
      expect: 2.5,
    },
    alt: modelsAlt,
    rationale:
      'Income is shown by bubble area: 45 against 18 thousand coins is 2.5 times. The Comet bubble is only about 1.6 times as wide, so comparing widths gives 1.6; squaring the area ratio gives about 6.',
    distractors: ['area-as-length', 'wrong-operation'],
    multiStep: true,
    precision: true,
  },
  {
    id: 'isle-districts-bubble-interpret-1',
    scenario: 'isle',
    level: 'interpret',
    chart: districts,
    prompt: 'What does the chart show about land area and residents?',
    options: statements([
      ['larger-fewer', 'Districts with more land tended to have fewer residents.'],
      ['larger-more', 'Districts with more land tended to have more residents.'],
      ['land-causes', 'Having more land made districts lose residents.'],
      ['visitors-residents', 'Districts with more visitors always had more residents.'],
    ]),
    key: { option: 'larger-fewer' },
    alt: districtsAlt,
    rationale:
      'The bubbles fall from upper left (Reedhaven, 6 km², 4,200 residents) to lower right (Quarrytop, 15 km², 450). The chart shows a link, not what causes it; Lanternpoint has the most visitors but few residents.',
    distractors: ['correlation-as-cause', 'other'],
  },
  {
    id: 'bikeshop-models-bubble-interpret-1',
    scenario: 'bike-shop',
    level: 'interpret',
    chart: models,
    prompt: 'Which sentence fits the chart?',
    options: statements([
      ['cheaper-more', 'Cheaper models sold in larger numbers.'],
      ['most-sold-most-income', 'The model that sold most also brought in most income.'],
      ['price-no-link', 'The price of a model had no link with how many sold.'],
      ['dearest-most-income', 'The dearest model brought in the most income.'],
    ]),
    key: { option: 'cheaper-more' },
    alt: modelsAlt,
    rationale:
      'The bubbles fall from left to right: Sprite (150 coins) sold 120 and Haul (2,000 coins) sold 10. Sprite has one of the smallest bubbles (18 thousand coins), and Comet, not the dearest model Haul, has the largest.',
    distractors: ['area-as-length', 'other'],
  },
  {
    id: 'bikeshop-models-bubble-envision-1',
    scenario: 'bike-shop',
    level: 'envision',
    chart: models,
    prompt:
      "The owner wants to see each model's income in each of the last five years. Which chart would show that best?",
    options: statements([
      ['line-per-model', 'A line chart with one line for each model'],
      ['bigger-bubbles', 'This bubble chart with the bubbles drawn larger'],
      ['one-pie', "One pie chart of this year's income by model"],
      ['buyer-map', 'A map showing where the buyers live'],
    ]),
    key: { option: 'line-per-model' },
    alt: modelsAlt,
    rationale:
      'Change over five years needs a time axis. A line for each model shows each model across the years; the other charts show one year only.',
    distractors: ['other'],
  },
  {
    id: 'isle-districts-bubble-envision-1',
    scenario: 'isle',
    level: 'envision',
    chart: districts,
    prompt:
      "A new campsite doubles the number of visitors to Windlow next year. How would the Windlow bubble change on next year's chart?",
    options: statements([
      ['area-doubles', 'Its area would double and it would stay in the same place.'],
      ['moves-up', 'It would move up the chart to twice the height.'],
      ['width-doubles', 'Its width would double, so it would look four times as big.'],
      ['moves-right', 'It would move to the right, towards the larger districts.'],
    ]),
    key: { option: 'area-doubles' },
    alt: districtsAlt,
    rationale:
      'Visitors are shown by bubble area, so doubling them doubles the area. Residents (height) and land area (left to right) do not change, so the bubble stays where it is.',
    distractors: ['area-as-length', 'other'],
  },
];
