/** Choropleth map items on the invented maps: Velmora Isle rain, Corrowen recycling. */
import type { ChartInput, Draft, DraftOption } from './draft.js';
import { statements } from './draft.js';

/** Velmora Isle district ids and names, as in items/maps/velmora_isle.geojson. */
export const isleDistricts: Record<string, string> = {
  windlow: 'Windlow',
  gullstone: 'Gullstone',
  lanternpoint: 'Lanternpoint',
  driftholm: 'Driftholm',
  mossridge: 'Mossridge',
  quarrytop: 'Quarrytop',
  heronmoor: 'Heronmoor',
  pebblewick: 'Pebblewick',
  reedhaven: 'Reedhaven',
  tidewell: 'Tidewell',
};

/** Corrowen ward ids and names, as in items/maps/corrowen_wards.geojson. */
export const townWards: Record<string, string> = {
  northgate: 'Northgate',
  bellfield: 'Bellfield',
  hollins: 'Hollins',
  old_market: 'Old Market',
  mill_row: 'Mill Row',
  riverside: 'Riverside',
  tannery: 'Tannery',
};

/** Options naming regions; the value is the region id the data use. */
export function regionOptions(ids: readonly string[], names: Record<string, string>): DraftOption[] {
  return ids.map((id) => ({ id: id.replace(/_/g, '-'), text: names[id]!, value: id }));
}

const rain: Record<string, number> = {
  windlow: 1450,
  driftholm: 1300,
  gullstone: 1250,
  pebblewick: 1200,
  mossridge: 1150,
  quarrytop: 1050,
  reedhaven: 950,
  lanternpoint: 900,
  tidewell: 850,
  heronmoor: 800,
};
const isleRain: ChartInput = {
  type: 'choropleth-map',
  title: 'Rain in each district of Velmora Isle in 2033',
  fields: [
    { name: 'district', kind: 'nominal', label: 'District' },
    { name: 'rain', kind: 'quantitative', label: 'Rain in the year', unit: 'mm' },
  ],
  data: Object.entries(rain).map(([district, mm]) => ({ district, rain: mm })),
  map: 'velmora_isle',
  region: 'district',
  value: 'rain',
  classes: 5,
  regionLabels: true,
  labelling: 'legend',
  note: 'One rain gauge in each district',
};
const isleRainAlt =
  'A map of Velmora Isle divided into its ten districts, each named on the map. Each district is shaded in one of five steps from light (less rain) to dark (more rain), explained in a legend.';

const recycled: Record<string, number> = {
  northgate: 48,
  bellfield: 52,
  hollins: 41,
  old_market: 30,
  mill_row: 45,
  riverside: 55,
  tannery: 62,
};
const townRecycling: ChartInput = {
  type: 'choropleth-map',
  title: 'Waste recycled in Corrowen wards, 2034',
  fields: [
    { name: 'ward', kind: 'nominal', label: 'Ward' },
    { name: 'recycled', kind: 'quantitative', label: 'Waste recycled', unit: '%' },
  ],
  data: Object.entries(recycled).map(([ward, share]) => ({ ward, recycled: share })),
  map: 'corrowen_wards',
  region: 'ward',
  value: 'recycled',
  classes: 5,
  regionLabels: true,
  labelling: 'legend',
};
const townRecyclingAlt =
  'A map of the town of Corrowen divided into seven wards, each named on the map: one ward in the middle and six around it. Each ward is shaded in one of five steps from light (a small share recycled) to dark (a large share), explained in a legend.';

export const choroplethMapDrafts: readonly Draft[] = [
  {
    id: 'isle-rain-choropleth-map-read-1',
    scenario: 'isle',
    level: 'read',
    chart: isleRain,
    prompt: 'Which district had the most rain in 2033?',
    options: regionOptions(['windlow', 'driftholm', 'gullstone', 'heronmoor'], isleDistricts),
    key: { query: { op: 'largest', field: 'rain', by: 'district', aggregate: 'sum' }, expect: 'windlow' },
    alt: isleRainAlt,
    rationale:
      'Windlow is the only district in the darkest shade (1,450 mm). Driftholm and Gullstone are one shade lighter; Heronmoor is the lightest, the opposite end of the legend.',
    distractors: ['neighbour', 'legend-confusion'],
  },
  {
    id: 'town-recycling-choropleth-map-read-1',
    scenario: 'town',
    level: 'read',
    chart: townRecycling,
    prompt: 'Which ward recycled the smallest share of its waste in 2034?',
    options: regionOptions(['old_market', 'tannery', 'hollins', 'mill_row'], townWards),
    key: { query: { op: 'smallest', field: 'recycled', by: 'ward', aggregate: 'sum' }, expect: 'old_market' },
    alt: townRecyclingAlt,
    rationale:
      'Old Market is in the lightest shade (30 %). Tannery is the darkest, which is the largest share; Hollins (41 %) is one shade darker than Old Market.',
    distractors: ['legend-confusion', 'neighbour'],
  },
  {
    id: 'isle-rain-choropleth-map-interpret-1',
    scenario: 'isle',
    level: 'interpret',
    chart: isleRain,
    prompt: 'What pattern does the map show?',
    options: statements([
      ['west-wet', 'The west of the island was wetter than the east.'],
      ['south-wet', 'The south of the island was wetter than the north.'],
      ['middle-wet', 'The middle of the island was wetter than the coasts.'],
      ['even', 'About the same amount of rain fell everywhere.'],
    ]),
    key: { option: 'west-wet' },
    alt: isleRainAlt,
    rationale:
      'The darkest districts, Windlow and Driftholm, are on the west side; the lightest, Heronmoor and Tidewell, are on the east side, and the shades get lighter from west to east.',
    distractors: ['other'],
  },
  {
    id: 'town-recycling-choropleth-map-interpret-1',
    scenario: 'town',
    level: 'interpret',
    chart: townRecycling,
    prompt: 'Which sentence fits the map?',
    options: statements([
      ['centre-lowest', 'The ward in the middle recycled less than every ward around it.'],
      ['north-highest', 'The wards in the north recycled the largest shares.'],
      ['east-lowest', 'The wards on the east side recycled the smallest shares.'],
      ['same-everywhere', 'Every ward recycled about the same share of its waste.'],
    ]),
    key: { option: 'centre-lowest' },
    alt: townRecyclingAlt,
    rationale:
      'Old Market, in the middle, is the lightest ward (30 %); all six wards around it are darker (41 to 62 %). The darkest ward, Tannery, is in the south.',
    distractors: ['other'],
  },
  {
    id: 'town-recycling-choropleth-map-envision-1',
    scenario: 'town',
    level: 'envision',
    chart: townRecycling,
    prompt:
      'A ward with many homes can look light on this map and still recycle many tonnes in total. Which map would show the total tonnes better?',
    options: statements([
      ['sized-circles', 'A map with a circle in each ward, sized by the tonnes recycled'],
      ['more-shades', 'This map with more shades in the legend'],
      ['no-names', 'This map with the ward names taken off'],
      ['shade-by-area', 'A map with each ward shaded by its land area'],
    ]),
    key: { option: 'sized-circles' },
    alt: townRecyclingAlt,
    rationale:
      'A total is an amount, not a share, and circles sized by amount show it without mixing it up with ward size. Shading shows rates such as the per cent recycled.',
    distractors: ['other'],
  },
  {
    id: 'isle-rain-choropleth-map-envision-1',
    scenario: 'isle',
    level: 'envision',
    chart: isleRain,
    prompt: 'Which question can this map answer?',
    options: statements([
      ['which-side', 'Which side of the island gets more rain in a year?'],
      ['wettest-month', 'Which month was the wettest in Windlow?'],
      ['one-day', 'How much rain fell in Reedhaven on one stormy day?'],
      ['next-year', 'Will there be more rain next year than this year?'],
    ]),
    key: { option: 'which-side' },
    alt: isleRainAlt,
    rationale:
      'The map shows one total for each district for one year, so it can compare parts of the island. It has no months, days or later years.',
    distractors: ['other'],
  },
];
