/** Treemap items: Orbelle Bikes spending, Lumen Hall budget, Sprout Lane beds. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, numberOptions, statements } from './draft.js';

const spending: ChartInput = {
  type: 'treemap',
  title: 'What Orbelle Bikes spent its money on in 2034',
  fields: [
    { name: 'cost', kind: 'nominal', label: 'Cost' },
    { name: 'amount', kind: 'quantitative', label: 'Spent', unit: 'thousand coins' },
  ],
  data: [
    { cost: 'Wages', amount: 75 },
    { cost: 'Parts', amount: 30 },
    { cost: 'Rent', amount: 21 },
    { cost: 'New bikes', amount: 15 },
    { cost: 'Other', amount: 9 },
  ],
  category: 'cost',
  value: 'amount',
};
const spendingAlt =
  'A treemap: one rectangle divided into five smaller rectangles, one for each kind of cost: wages, parts, rent, new bikes and other. The area of each rectangle shows how much was spent on it.';

const budget: ChartInput = {
  type: 'treemap',
  title: 'Lumen Hall budget for 2034',
  fields: [
    { name: 'item', kind: 'nominal', label: 'Budget line' },
    { name: 'part', kind: 'nominal', label: 'Part of the budget' },
    { name: 'amount', kind: 'quantitative', label: 'Budget', unit: 'thousand coins' },
  ],
  data: [
    { part: 'Exhibits', item: 'New exhibits', amount: 80 },
    { part: 'Exhibits', item: 'Star dome', amount: 40 },
    { part: 'Exhibits', item: 'Repairs', amount: 30 },
    { part: 'People', item: 'Guides', amount: 100 },
    { part: 'People', item: 'Teachers', amount: 20 },
    { part: 'People', item: 'Cafe staff', amount: 15 },
    { part: 'Building', item: 'Heating', amount: 45 },
    { part: 'Building', item: 'Cleaning', amount: 30 },
    { part: 'Building', item: 'Lights', amount: 25 },
    { part: 'Building', item: 'Insurance', amount: 20 },
  ],
  category: 'item',
  group: 'part',
  value: 'amount',
  labelling: 'legend',
};
const budgetAlt =
  "A treemap of ten budget lines in three parts, exhibits, people and building. Each part is a block of rectangles in its own colour, explained in a legend, and each rectangle's area shows the money for that line.";

export const treemapDrafts: readonly Draft[] = [
  {
    id: 'bikeshop-spending-treemap-read-1',
    scenario: 'bike-shop',
    level: 'read',
    chart: spending,
    prompt: 'About what per cent of the spending went on parts?',
    options: numberOptions([10, 20, 50], '%'),
    order: 'fixed',
    key: { query: { op: 'share', equals: 'Parts', round: 0 }, expect: 20 },
    alt: spendingAlt,
    rationale:
      'Parts cost 30 of 150 thousand coins, so the parts rectangle is a fifth of the whole, 20 %. Wages fill half (50 %) and new bikes 10 %.',
    distractors: ['neighbour', 'area-as-length'],
  },
  {
    id: 'science-budget-treemap-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: budget,
    prompt: 'Which part of the budget got the most money in total?',
    options: categoryOptions(['Exhibits', 'People', 'Building']),
    key: { query: { op: 'largest', field: 'amount', by: 'part', aggregate: 'sum' }, expect: 'Exhibits' },
    alt: budgetAlt,
    rationale:
      'Exhibits add up to 150 thousand coins, People to 135 and Building to 120. People holds the largest single rectangle (guides, 100), and Building has the most rectangles, but neither is the largest part.',
    distractors: ['other'],
    multiStep: true,
    precision: true,
  },
  {
    id: 'bikeshop-spending-treemap-interpret-1',
    scenario: 'bike-shop',
    level: 'interpret',
    chart: spending,
    prompt: 'Which sentence about the spending fits the chart?',
    options: statements([
      ['wages-half', 'Wages cost as much as all the other costs together.'],
      ['parts-most', 'Parts cost more than wages did.'],
      ['all-equal', 'All five costs were about the same size.'],
      ['rent-second', 'Rent was the largest cost after wages.'],
    ]),
    key: { option: 'wages-half' },
    alt: spendingAlt,
    rationale:
      'The wages rectangle fills half of the whole (75 of 150 thousand coins), so the other four together fill the other half. Parts (30) are larger than rent (21).',
    distractors: ['area-as-length', 'other'],
  },
  {
    id: 'science-budget-treemap-interpret-1',
    scenario: 'science-centre',
    level: 'interpret',
    chart: budget,
    prompt: 'Which sentence about the budget fits the chart?',
    options: statements([
      ['guides-most-people', 'Most of the money for people went on guides.'],
      ['building-one-line', 'Most of the building money went on one line.'],
      ['even-within', 'Each part shared its money evenly over its lines.'],
      ['teachers-over-dome', 'Teachers got more money than the star dome.'],
    ]),
    key: { option: 'guides-most-people' },
    alt: budgetAlt,
    rationale:
      'Guides take 100 of the 135 thousand coins for people, about three quarters. The building money is spread over four lines (heating, the largest, is 45 of 120), and teachers (20) got half of the star dome (40).',
    distractors: ['other'],
  },
  {
    id: 'bikeshop-spending-treemap-envision-1',
    scenario: 'bike-shop',
    level: 'envision',
    chart: spending,
    prompt:
      "The owner wants to compare this year's spending with last year's, cost by cost. Which chart would show that best?",
    options: statements([
      ['grouped-bars', 'Two bars for each cost, one for each year'],
      ['one-pie', 'One pie chart with both years mixed together'],
      ['network', 'A network with a line between each pair of costs'],
      ['bigger-treemap', 'This treemap drawn twice as large'],
    ]),
    key: { option: 'grouped-bars' },
    alt: spendingAlt,
    rationale:
      'Comparing each cost across two years is easiest with lengths side by side on one scale. Areas in a treemap or pie are hard to compare, and the chart has only one year.',
    distractors: ['other'],
  },
  {
    id: 'science-budget-treemap-envision-1',
    scenario: 'science-centre',
    level: 'envision',
    chart: budget,
    prompt:
      'A new part, Outreach, is added to the budget with 50 thousand coins, and the chart keeps its size. What happens to the chart?',
    options: statements([
      ['others-shrink', 'A new block appears and every other rectangle gets a little smaller.'],
      ['people-grows', 'The People block grows to make room for outreach work.'],
      ['others-same', 'A new block appears and every other rectangle stays the same size.'],
      ['exhibits-go', 'The Exhibits block is taken away to make room.'],
    ]),
    key: { option: 'others-shrink' },
    alt: budgetAlt,
    rationale:
      'A treemap fills a fixed area with the parts of the total. Adding 50 to a total of 405 makes every old line a smaller share, so each old rectangle shrinks a little.',
    distractors: ['other'],
  },
];
