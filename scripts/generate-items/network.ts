/** Network items: Velmora Isle ferry routes, who asks whom for help at Orbelle Bikes. */
import type { ChartInput, Draft } from './draft.js';
import { numberOptions, statements } from './draft.js';

const ferries: ChartInput = {
  type: 'network',
  title: 'Ferry routes of Velmora Isle',
  fields: [
    { name: 'from', kind: 'nominal', label: 'From' },
    { name: 'to', kind: 'nominal', label: 'To' },
    { name: 'sailings', kind: 'quantitative', label: 'Sailings each week' },
  ],
  nodes: [
    { id: 'windlow', label: 'Windlow', x: 0.15, y: 0.12 },
    { id: 'gullstone', label: 'Gullstone', x: 0.45, y: 0.05 },
    { id: 'lanternpoint', label: 'Lanternpoint', x: 0.78, y: 0.12 },
    { id: 'heronmoor', label: 'Heronmoor', x: 0.92, y: 0.42 },
    { id: 'tidewell', label: 'Tidewell', x: 0.75, y: 0.7 },
    { id: 'reedhaven', label: 'Reedhaven', x: 0.45, y: 0.72 },
    { id: 'pebblewick', label: 'Pebblewick', x: 0.18, y: 0.65 },
    { id: 'driftholm', label: 'Driftholm', x: 0.06, y: 0.38 },
    { id: 'mainland', label: 'Mainland port', x: 0.6, y: 0.97 },
  ],
  data: [
    { from: 'reedhaven', to: 'mainland', sailings: 21 },
    { from: 'reedhaven', to: 'pebblewick', sailings: 14 },
    { from: 'reedhaven', to: 'tidewell', sailings: 14 },
    { from: 'pebblewick', to: 'driftholm', sailings: 7 },
    { from: 'driftholm', to: 'windlow', sailings: 5 },
    { from: 'windlow', to: 'gullstone', sailings: 5 },
    { from: 'gullstone', to: 'lanternpoint', sailings: 7 },
    { from: 'lanternpoint', to: 'heronmoor', sailings: 7 },
    { from: 'heronmoor', to: 'tidewell', sailings: 7 },
    { from: 'tidewell', to: 'mainland', sailings: 7 },
  ],
  source: 'from',
  target: 'to',
  weight: 'sailings',
  directed: false,
};
const ferriesAlt =
  'A network of nine harbours: eight on Velmora Isle, placed roughly where they are on the island, and the mainland port below them. Lines join harbours with a direct ferry; thicker lines mean more sailings each week.';

const help: ChartInput = {
  type: 'network',
  title: 'Who asks whom for help at Orbelle Bikes',
  fields: [
    { name: 'asker', kind: 'nominal', label: 'Person asking' },
    { name: 'helper', kind: 'nominal', label: 'Person asked' },
  ],
  nodes: [
    { id: 'ada', label: 'Ada', x: 0.5, y: 0.08 },
    { id: 'bo', label: 'Bo', x: 0.88, y: 0.3 },
    { id: 'cyd', label: 'Cyd', x: 0.88, y: 0.72 },
    { id: 'dev', label: 'Dev', x: 0.5, y: 0.92 },
    { id: 'eli', label: 'Eli', x: 0.12, y: 0.72 },
    { id: 'fen', label: 'Fen', x: 0.12, y: 0.3 },
  ],
  data: [
    { asker: 'bo', helper: 'ada' },
    { asker: 'cyd', helper: 'ada' },
    { asker: 'dev', helper: 'ada' },
    { asker: 'fen', helper: 'ada' },
    { asker: 'eli', helper: 'cyd' },
    { asker: 'fen', helper: 'cyd' },
    { asker: 'ada', helper: 'dev' },
    { asker: 'bo', helper: 'dev' },
    { asker: 'eli', helper: 'bo' },
  ],
  source: 'asker',
  target: 'helper',
  directed: true,
  note: 'Each arrow points from the person asking to the person asked',
};
const helpAlt =
  'A network of the six staff of Orbelle Bikes, Ada, Bo, Cyd, Dev, Eli and Fen, placed in a ring. Arrows point from the person who asks for help to the person they ask.';

export const networkDrafts: readonly Draft[] = [
  {
    id: 'isle-ferries-network-read-1',
    scenario: 'isle',
    level: 'read',
    chart: ferries,
    prompt: 'How many direct ferry routes start or end at Tidewell?',
    options: numberOptions([2, 3, 4], 'routes'),
    order: 'fixed',
    key: { query: { op: 'degree', node: 'tidewell', direction: 'all' }, expect: 3 },
    alt: ferriesAlt,
    rationale:
      'Three lines touch Tidewell: to Reedhaven, to Heronmoor and to the mainland port. Missing the line to the mainland gives 2.',
    distractors: ['other'],
  },
  {
    id: 'bikeshop-help-network-read-1',
    scenario: 'bike-shop',
    level: 'read',
    chart: help,
    prompt: 'Which person is asked for help by the most people?',
    options: [
      { id: 'ada', text: 'Ada', value: 'ada' },
      { id: 'fen', text: 'Fen', value: 'fen' },
      { id: 'cyd', text: 'Cyd', value: 'cyd' },
      { id: 'dev', text: 'Dev', value: 'dev' },
    ],
    key: { query: { op: 'most-connected', direction: 'in' }, expect: 'ada' },
    alt: helpAlt,
    rationale:
      'Four arrows point to Ada (from Bo, Cyd, Dev and Fen). Fen sends out arrows but receives none, which is the opposite direction; Cyd and Dev each receive two.',
    distractors: ['other'],
  },
  {
    id: 'bikeshop-help-network-read-2',
    scenario: 'bike-shop',
    level: 'read',
    chart: help,
    prompt: 'How many people ask Cyd for help?',
    options: numberOptions([1, 2, 3], 'people'),
    order: 'fixed',
    key: { query: { op: 'degree', node: 'cyd', direction: 'in' }, expect: 2 },
    alt: helpAlt,
    rationale:
      'Two arrows point to Cyd, from Eli and from Fen. One arrow leaves Cyd (to Ada), so counting all three lines that touch Cyd gives 3, and counting only the arrow out gives 1.',
    distractors: ['other'],
  },
  {
    id: 'isle-ferries-network-interpret-1',
    scenario: 'isle',
    level: 'interpret',
    chart: ferries,
    prompt: 'Which sentence about the ferry network is right?',
    options: statements([
      ['all-reachable', 'Every harbour can be reached from Reedhaven, some by changing ferries.'],
      ['windlow-mainland', 'Windlow can be reached only by a direct ferry from the mainland.'],
      ['same-routes', 'Every harbour has the same number of direct routes.'],
      ['gullstone-mainland', 'Gullstone has a direct ferry to the mainland port.'],
    ]),
    key: { option: 'all-reachable' },
    alt: ferriesAlt,
    rationale:
      'The island harbours form one ring joined to Reedhaven, so following the lines reaches every harbour. Windlow has no line to the mainland, Reedhaven has three routes and Windlow two, and Gullstone has no line to the mainland.',
    distractors: ['other'],
  },
  {
    id: 'bikeshop-help-network-interpret-1',
    scenario: 'bike-shop',
    level: 'interpret',
    chart: help,
    prompt: 'What does the network suggest about Ada?',
    options: statements([
      ['many-turn-to-ada', 'Many of the staff turn to Ada when they need help.'],
      ['ada-asks-all', 'Ada asks most of the other staff for help.'],
      ['ada-alone', 'Ada works alone and talks to none of the staff.'],
      ['ada-never-asks', 'Ada never asks anyone else for help.'],
    ]),
    key: { option: 'many-turn-to-ada' },
    alt: helpAlt,
    rationale:
      'Four of the five other staff have arrows pointing to Ada. Ada sends one arrow, to Dev, so Ada does ask for help, but rarely.',
    distractors: ['other'],
  },
  {
    id: 'isle-ferries-network-envision-1',
    scenario: 'isle',
    level: 'envision',
    chart: ferries,
    prompt:
      'The ferry between Windlow and Gullstone stops for a month of repairs. What happens to trips to Gullstone?',
    options: statements([
      ['other-way', 'Gullstone can still be reached, by going the other way round the ring.'],
      ['gullstone-cut', 'Gullstone can no longer be reached by ferry at all.'],
      ['windlow-cut', 'Windlow can no longer be reached by ferry at all.'],
      ['no-change', 'Nothing changes for any trip, since every route stays the same.'],
    ]),
    key: { option: 'other-way' },
    alt: ferriesAlt,
    rationale:
      'Without that line, Gullstone is still joined to Lanternpoint, Heronmoor, Tidewell and Reedhaven, and Windlow is still joined to Driftholm. Some trips take longer but none are cut off.',
    distractors: ['other'],
  },
  {
    id: 'bikeshop-help-network-envision-1',
    scenario: 'bike-shop',
    level: 'envision',
    chart: help,
    prompt:
      'The shop wants the chart to show how often each person asks each other person. What should be added?',
    options: statements([
      ['line-weights', 'Thicker arrows for pairs who ask more often, with a count'],
      ['more-colours', 'A different colour for each person in the ring'],
      ['new-layout', 'The same people placed in a straight line instead'],
      ['bigger-names', 'Larger letters for the names of the staff'],
    ]),
    key: { option: 'line-weights' },
    alt: helpAlt,
    rationale:
      'How often is a number for each arrow, so each link needs a weight, shown by line width or a label. Colours, layout and letter size add no counts.',
    distractors: ['other'],
  },
];
