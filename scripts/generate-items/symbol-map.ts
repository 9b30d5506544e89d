/** Proportional symbol map items on the invented maps: Velmora Isle boats, Corrowen bus boardings. */
import { isleDistricts, regionOptions } from './choropleth-map.js';
import type { ChartInput, Draft } from './draft.js';
import { statements } from './draft.js';

const boats: Record<string, number> = {
  reedhaven: 40,
  tidewell: 26,
  pebblewick: 22,
  gullstone: 18,
  driftholm: 12,
  heronmoor: 10,
  windlow: 8,
  lanternpoint: 6,
  mossridge: 0,
  quarrytop: 0,
};
const isleBoats: ChartInput = {
  type: 'symbol-map',
  title: 'Fishing boats on Velmora Isle',
  fields: [
    { name: 'district', kind: 'nominal', label: 'District' },
    { name: 'boats', kind: 'quantitative', label: 'Fishing boats' },
  ],
  data: Object.entries(boats).map(([district, count]) => ({ district, boats: count })),
  map: 'velmora_isle',
  region: 'district',
  value: 'boats',
  regionLabels: true,
  labelling: 'legend',
  note: 'Harbour office register, 2034. Mossridge and Quarrytop are inland.',
};
const isleBoatsAlt =
  'A map of Velmora Isle with its ten districts named. A circle in each coastal district shows its fishing boats: the larger the circle, the more boats. A legend shows circle sizes.';

const boardings: Record<string, number> = {
  old_market: 2400,
  riverside: 1300,
  northgate: 1100,
  bellfield: 900,
  mill_row: 800,
  tannery: 700,
  hollins: 600,
};
const townBoardings: ChartInput = {
  type: 'symbol-map',
  title: 'Bus passengers getting on, by ward',
  fields: [
    { name: 'ward', kind: 'nominal', label: 'Ward' },
    { name: 'boardings', kind: 'quantitative', label: 'Passengers getting on' },
  ],
  data: Object.entries(boardings).map(([ward, count]) => ({ ward, boardings: count })),
  map: 'corrowen_wards',
  region: 'ward',
  value: 'boardings',
  regionLabels: true,
  labelling: 'legend',
};
const townBoardingsAlt =
  'A map of the seven wards of Corrowen, each named: one ward in the middle and six around it. A circle in each ward shows the bus passengers getting on there: the larger the circle, the more passengers. A legend shows circle sizes.';

export const symbolMapDrafts: readonly Draft[] = [
  {
    id: 'isle-boats-symbol-map-read-1',
    scenario: 'isle',
    level: 'read',
    chart: isleBoats,
    prompt: 'Which district has the most fishing boats?',
    options: regionOptions(['reedhaven', 'windlow', 'tidewell', 'pebblewick'], isleDistricts),
    key: { query: { op: 'largest', field: 'boats', by: 'district', aggregate: 'sum' }, expect: 'reedhaven' },
    alt: isleBoatsAlt,
    rationale:
      'Reedhaven has the largest circle (40 boats). Windlow is the largest district on the map, but its circle is small (8 boats); Tidewell (26) has the next largest circle.',
    distractors: ['area-as-length', 'neighbour'],
  },
  {
    id: 'town-boardings-symbol-map-read-1',
    scenario: 'town',
    level: 'read',
    chart: townBoardings,
    prompt: 'About how many times as many passengers got on in Old Market as in Hollins?',
    options: [
      { id: 'n2', text: '2 times', value: 2 },
      { id: 'n4', text: '4 times', value: 4 },
      { id: 'n16', text: '16 times', value: 16 },
    ],
    order: 'fixed',
    key: {
      query: {
        op: 'ratio',
        a: { op: 'value-at', field: 'boardings', where: { ward: 'old_market' } },
        b: { op: 'value-at', field: 'boardings', where: { ward: 'hollins' } },
        round: 0,
      },
      expect: 4,
    },
    alt: townBoardingsAlt,
    rationale:
      'Circle area shows passengers: 2,400 against 600 is 4 times. The Old Market circle is only 2 times as wide, so comparing widths gives 2; squaring the area ratio gives 16.',
    distractors: ['area-as-length', 'wrong-operation'],
    multiStep: true,
    precision: true,
  },
  {
    id: 'isle-boats-symbol-map-interpret-1',
    scenario: 'isle',
    level: 'interpret',
    chart: isleBoats,
    prompt: 'What does the map show about where the fishing boats are based?',
    options: statements([
      ['south-coast', 'Most of the boats are based along the south coast.'],
      ['even', 'The boats are spread evenly around the whole coast.'],
      ['north', 'Most of the boats are based along the north coast.'],
      ['inland', 'The inland districts have more boats than the coast.'],
    ]),
    key: { option: 'south-coast' },
    alt: isleBoatsAlt,
    rationale:
      'Reedhaven (40), Tidewell (26) and Pebblewick (22) on the south coast hold 88 of the 142 boats; the northern circles are small and the inland districts have none.',
    distractors: ['other'],
    multiStep: true,
  },
  {
    id: 'town-boardings-symbol-map-interpret-1',
    scenario: 'town',
    level: 'interpret',
    chart: townBoardings,
    prompt: 'Which sentence fits the map?',
    options: statements([
      ['centre-most', 'Most passengers got on in the middle of the town, fewer towards the edges.'],
      ['edges-most', 'Most passengers got on in the outer wards, fewer in the middle.'],
      ['same-everywhere', 'About the same number of passengers got on in every ward.'],
      ['size-follows-area', 'The largest wards on the map had the most passengers.'],
    ]),
    key: { option: 'centre-most' },
    alt: townBoardingsAlt,
    rationale:
      'Old Market, in the middle, has by far the largest circle (2,400 passengers); every outer ward has 600 to 1,300. Ward size on the map does not match circle size.',
    distractors: ['area-as-length', 'other'],
  },
  {
    id: 'isle-boats-symbol-map-envision-1',
    scenario: 'isle',
    level: 'envision',
    chart: isleBoats,
    prompt:
      'The harbour office wants to compare the number of boats for each resident. Which map would show this best?',
    options: statements([
      ['shade-rate', 'A map with each district shaded by boats divided by residents'],
      ['bigger-circles', 'This map with every circle drawn twice as large'],
      ['boat-names', 'This map with the name of each boat written on it'],
      ['two-colours', 'This map with the circles drawn in two colours'],
    ]),
    key: { option: 'shade-rate' },
    alt: isleBoatsAlt,
    rationale:
      'Boats for each resident is a rate: boats divided by residents, district by district. A rate is shown well by shading; the circles show totals only and the map has no residents.',
    distractors: ['other'],
  },
  {
    id: 'town-boardings-symbol-map-envision-1',
    scenario: 'town',
    level: 'envision',
    chart: townBoardings,
    prompt: "Next year's counts will be added. Which chart would best show the change in each ward?",
    options: statements([
      ['grouped-bars', 'Two bars for each ward, one for each year'],
      ['one-pie', 'One pie chart with both years mixed together'],
      ['area-shading', 'A map with each ward shaded by its land area'],
      ['bigger-circles', 'This map with larger circles for next year only'],
    ]),
    key: { option: 'grouped-bars' },
    alt: townBoardingsAlt,
    rationale:
      'Comparing two years ward by ward is a comparison of lengths side by side, which paired bars do best. Circle areas are hard to compare, and one pie loses the years.',
    distractors: ['other'],
  },
];
