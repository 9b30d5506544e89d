/** Table items: Corrowen library loans, Lumen Hall star dome shows, Orbelle Bikes months. */
import type { ChartInput, Draft } from './draft.js';
import { categoryOptions, numberOptions, statements } from './draft.js';

const wardLoans: ChartInput = {
  type: 'table',
  title: 'Library books borrowed in March, by ward',
  fields: [
    { name: 'ward', kind: 'nominal', label: 'Ward' },
    { name: 'books', kind: 'quantitative', label: 'Books borrowed' },
  ],
  data: [
    { ward: 'Northgate', books: 412 },
    { ward: 'Bellfield', books: 268 },
    { ward: 'Hollins', books: 351 },
    { ward: 'Old Market', books: 530 },
    { ward: 'Mill Row', books: 297 },
    { ward: 'Riverside', books: 384 },
    { ward: 'Tannery', books: 176 },
  ],
  columns: ['ward', 'books'],
  note: 'Library desk counts, March 2034',
};
const wardLoansAlt =
  'A table with two columns, ward and books borrowed, and one row for each of the seven wards of Corrowen.';

const domeShows: ChartInput = {
  type: 'table',
  title: 'Star dome shows at Lumen Hall last month',
  fields: [
    { name: 'show', kind: 'nominal', label: 'Show' },
    { name: 'minutes', kind: 'quantitative', label: 'Length', unit: 'minutes' },
    { name: 'seats', kind: 'quantitative', label: 'Seats per show' },
    { name: 'tickets', kind: 'quantitative', label: 'Tickets sold' },
  ],
  data: [
    { show: 'Moons of the Giants', minutes: 35, seats: 120, tickets: 1840 },
    { show: 'A Year on Ice', minutes: 25, seats: 120, tickets: 1520 },
    { show: 'Birth of a Star', minutes: 40, seats: 200, tickets: 2110 },
    { show: 'The Tiny Sky', minutes: 20, seats: 80, tickets: 1290 },
    { show: 'Planet Hunters', minutes: 30, seats: 200, tickets: 2260 },
    { show: 'Night Over the Hills', minutes: 45, seats: 160, tickets: 1975 },
  ],
  columns: ['show', 'minutes', 'seats', 'tickets'],
};
const domeShowsAlt =
  'A table of six star dome shows with four columns: the show, its length in minutes, the seats per show and the tickets sold last month.';

const months = ['March', 'April', 'May', 'June', 'July', 'August', 'September', 'October'];
const bikeMonths: ChartInput = {
  type: 'table',
  title: 'Orbelle Bikes month by month, 2033',
  fields: [
    { name: 'month', kind: 'ordinal', label: 'Month', order: months },
    { name: 'temperature', kind: 'quantitative', label: 'Average temperature', unit: '°C' },
    { name: 'rentals', kind: 'quantitative', label: 'Bikes rented' },
    { name: 'repairs', kind: 'quantitative', label: 'Bikes repaired' },
  ],
  data: [
    { month: 'March', temperature: 9, rentals: 120, repairs: 58 },
    { month: 'April', temperature: 12, rentals: 210, repairs: 64 },
    { month: 'May', temperature: 16, rentals: 260, repairs: 71 },
    { month: 'June', temperature: 20, rentals: 240, repairs: 55 },
    { month: 'July', temperature: 24, rentals: 190, repairs: 49 },
    { month: 'August', temperature: 25, rentals: 175, repairs: 52 },
    { month: 'September', temperature: 19, rentals: 205, repairs: 66 },
    { month: 'October', temperature: 13, rentals: 140, repairs: 61 },
  ],
  columns: ['month', 'temperature', 'rentals', 'repairs'],
  note: 'Both workshops together',
};
const bikeMonthsAlt =
  'A table with one row for each month from March to October 2033 and columns for average temperature, bikes rented and bikes repaired.';

const loansTwoYears: ChartInput = {
  type: 'table',
  title: 'Library books borrowed, January to June',
  fields: [
    {
      name: 'month',
      kind: 'ordinal',
      label: 'Month',
      order: ['January', 'February', 'March', 'April', 'May', 'June'],
    },
    { name: 'loans_2032', kind: 'quantitative', label: 'Books in 2032' },
    { name: 'loans_2033', kind: 'quantitative', label: 'Books in 2033' },
  ],
  data: [
    { month: 'January', loans_2032: 980, loans_2033: 1120 },
    { month: 'February', loans_2032: 910, loans_2033: 1050 },
    { month: 'March', loans_2032: 1010, loans_2033: 1160 },
    { month: 'April', loans_2032: 890, loans_2033: 1010 },
    { month: 'May', loans_2032: 850, loans_2033: 990 },
    { month: 'June', loans_2032: 820, loans_2033: 940 },
  ],
  columns: ['month', 'loans_2032', 'loans_2033'],
};
const loansTwoYearsAlt =
  'A table with one row for each month from January to June and two columns: books borrowed in 2032 and books borrowed in 2033.';

export const tableDrafts: readonly Draft[] = [
  {
    id: 'town-library-table-read-1',
    scenario: 'town',
    level: 'read',
    chart: wardLoans,
    prompt: 'How many books did people from Hollins borrow in March?',
    options: numberOptions([268, 351, 384, 530], 'books'),
    order: 'fixed',
    key: { query: { op: 'value-at', field: 'books', where: { ward: 'Hollins' } }, expect: 351 },
    alt: wardLoansAlt,
    rationale:
      'The Hollins row shows 351 books. 268 and 530 are the rows just above and below; 384 is Riverside.',
    distractors: ['neighbour'],
  },
  {
    id: 'science-dome-table-read-1',
    scenario: 'science-centre',
    level: 'read',
    chart: domeShows,
    prompt: 'Which star dome show sold the most tickets last month?',
    options: categoryOptions([
      'Birth of a Star',
      'Planet Hunters',
      'Night Over the Hills',
      'Moons of the Giants',
    ]),
    key: {
      query: { op: 'largest', field: 'tickets', by: 'show', aggregate: 'sum' },
      expect: 'Planet Hunters',
    },
    alt: domeShowsAlt,
    rationale:
      'Planet Hunters sold 2,260 tickets, the most in the tickets column. Birth of a Star is close with 2,110; Night Over the Hills is the longest show, which is a different column.',
    distractors: ['neighbour', 'wrong-operation'],
  },
  {
    id: 'bikeshop-months-table-read-1',
    scenario: 'bike-shop',
    level: 'read',
    chart: bikeMonths,
    prompt: 'In how many of these months did Orbelle Bikes repair more than 60 bikes?',
    options: numberOptions([2, 3, 4, 5], 'months'),
    order: 'fixed',
    key: { query: { op: 'count', field: 'repairs', above: 60 }, expect: 4 },
    alt: bikeMonthsAlt,
    rationale: 'Repairs were above 60 in April (64), May (71), September (66) and October (61): 4 months.',
    distractors: ['neighbour', 'other'],
    multiStep: true,
  },
  {
    id: 'town-library-table-interpret-1',
    scenario: 'town',
    level: 'interpret',
    chart: loansTwoYears,
    prompt: 'Which sentence best describes the table?',
    options: statements([
      ['every-month-higher', 'Each month, more books were borrowed in 2033 than in 2032.'],
      ['rose-each-month', 'In both years, borrowing rose from each month to the next.'],
      ['every-month-lower', 'Each month, fewer books were borrowed in 2033 than in 2032.'],
      ['only-winter-higher', 'Only the winter months were busier in 2033 than in 2032.'],
    ]),
    key: { option: 'every-month-higher' },
    alt: loansTwoYearsAlt,
    rationale:
      'In every row the 2033 number is 120 to 150 books higher than the 2032 number. Within each year borrowing mostly falls from January to June, so reading down the columns gives the wrong idea.',
    distractors: ['other'],
  },
  {
    id: 'bikeshop-months-table-interpret-1',
    scenario: 'bike-shop',
    level: 'interpret',
    chart: bikeMonths,
    prompt: 'What does the table show about rentals and the weather?',
    options: statements([
      ['mild-peak', 'Rentals were highest in a mild month, before the warmest weeks.'],
      ['warmest-peak', 'Rentals were highest in the warmest month of the year.'],
      ['rose-with-warmth', 'Rentals rose every month for as long as it got warmer.'],
      ['no-change', 'Rentals stayed about the same whatever the weather was.'],
    ]),
    key: { option: 'mild-peak' },
    alt: bikeMonthsAlt,
    rationale:
      'The most rentals (260) were in May at 16 °C. In July and August, the warmest months at 24 and 25 °C, rentals fell to 190 and 175. Many people expect the warmest month to be busiest, but the data say otherwise.',
    distractors: ['everyday-expectation', 'other'],
  },
  {
    id: 'science-dome-table-envision-1',
    scenario: 'science-centre',
    level: 'envision',
    chart: domeShows,
    prompt: 'The centre wants to know how full each show was. What extra information does it need?',
    options: statements([
      ['times-shown', 'How many times each show was put on last month'],
      ['show-length', 'How many minutes each show lasts'],
      ['tickets-sold', 'How many tickets each show sold last month'],
      ['staff-choice', 'Which show the staff like the most'],
    ]),
    key: { option: 'times-shown' },
    alt: domeShowsAlt,
    rationale:
      'Tickets are a monthly total and seats are per show. To know how full the shows were you need the number of seats on offer, which is seats per show times the number of times the show was put on. Length and tickets are already in the table.',
    distractors: ['other'],
  },
  {
    id: 'town-library-table-envision-1',
    scenario: 'town',
    level: 'envision',
    chart: wardLoans,
    prompt:
      'Some wards have more people living in them than others. Which extra column would help most to compare the wards fairly?',
    options: statements([
      ['residents', 'The number of people living in each ward'],
      ['open-days', 'The number of days the library was open in March'],
      ['april-books', 'The books borrowed by each ward in April'],
      ['library-stock', 'The number of books the library owns'],
    ]),
    key: { option: 'residents' },
    alt: wardLoansAlt,
    rationale:
      'Dividing the books borrowed by the number of people in each ward gives books per person, which is fair to small and large wards. The open days and the library stock are the same for every ward.',
    distractors: ['other'],
  },
];
