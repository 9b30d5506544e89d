import { MISSING, type ResponseMatrix } from './response-matrix.js';

/** One answer in long format. `score: null` marks an item shown but recorded as missing. */
export interface LongResponseRow {
  readonly person: string;
  readonly item: string;
  readonly score: number | null;
}

export interface BuildResponseMatrixOptions {
  /** Scores a cell may hold. Default [0, 1]. Each must be an integer 0..254. */
  readonly allowedScores?: readonly number[];
  /** Number given to the first row in error messages (e.g. 2 when a header line precedes it). Default 1. */
  readonly firstRowNumber?: number;
  /** Number of each row in error messages (e.g. file line numbers); overrides `firstRowNumber`. */
  readonly rowNumbers?: ArrayLike<number>;
}

function rowNumberer(options: BuildResponseMatrixOptions): (index: number) => number {
  const first = options.firstRowNumber ?? 1;
  const numbers = options.rowNumbers;
  return (index) => numbers?.[index] ?? first + index;
}

/** Bad response data; `row` is the row number as counted by `firstRowNumber`. */
export class ResponseDataError extends Error {
  readonly row: number;
  constructor(message: string, row: number) {
    super(message);
    this.name = 'ResponseDataError';
    this.row = row;
  }
}

function allowedSet(options: BuildResponseMatrixOptions): Set<number> {
  const allowed = new Set(options.allowedScores ?? [0, 1]);
  for (const s of allowed) {
    if (!Number.isInteger(s) || s < 0 || s >= MISSING)
      throw new Error('buildResponseMatrix requires scores 0..254');
  }
  return allowed;
}

function describeAllowed(allowed: Set<number>): string {
  return [...allowed].sort((a, b) => a - b).join(', ');
}

/**
 * Builds a {@link ResponseMatrix} from long rows (person, item, score). Persons and items are
 * numbered in order of first appearance; cells never given stay missing (missing by design).
 *
 * @see Wickham, H. (2014). Tidy data. Journal of Statistical Software 59(10) (long vs wide layout).
 * @param rows the answers.
 * @param options allowed scores (default 0, 1), number of the first row for messages.
 * @returns the matrix.
 * @throws ResponseDataError naming the row for an empty id, a score not allowed, or a repeated person-item pair.
 * @example
 * const m = buildResponseMatrix([
 *   { person: 'a', item: 'x', score: 1 },
 *   { person: 'b', item: 'y', score: 0 },
 * ]);
 * Array.from(m.scores); // [1, 255, 255, 0]
 */
export function buildResponseMatrix(
  rows: Iterable<LongResponseRow>,
  options: BuildResponseMatrixOptions = {},
): ResponseMatrix {
  const allowed = allowedSet(options);
  const rowNumber = rowNumberer(options);
  const personIndex = new Map<string, number>();
  const itemIndex = new Map<string, number>();
  const cells: { person: number; item: number; score: number; row: number }[] = [];
  let index = -1;
  for (const entry of rows) {
    index++;
    const row = rowNumber(index);
    if (entry.person === '') throw new ResponseDataError(`row ${row}: empty person id`, row);
    if (entry.item === '') throw new ResponseDataError(`row ${row}: empty item id`, row);
    if (entry.score !== null && !allowed.has(entry.score)) {
      throw new ResponseDataError(
        `row ${row}: score ${String(entry.score)} for person ${entry.person}, item ${entry.item} is not one of ${describeAllowed(allowed)}`,
        row,
      );
    }
    let person = personIndex.get(entry.person);
    if (person === undefined) {
      person = personIndex.size;
      personIndex.set(entry.person, person);
    }
    let item = itemIndex.get(entry.item);
    if (item === undefined) {
      item = itemIndex.size;
      itemIndex.set(entry.item, item);
    }
    cells.push({ person, item, score: entry.score ?? MISSING, row });
  }
  const nItems = itemIndex.size;
  const scores = new Uint8Array(personIndex.size * nItems).fill(MISSING);
  const seenAt = new Map<number, number>();
  for (const cell of cells) {
    const at = cell.person * nItems + cell.item;
    const earlier = seenAt.get(at);
    if (earlier !== undefined) {
      const personId = [...personIndex.keys()][cell.person];
      const itemId = [...itemIndex.keys()][cell.item];
      throw new ResponseDataError(
        `row ${cell.row}: person ${personId}, item ${itemId} already answered in row ${earlier}`,
        cell.row,
      );
    }
    seenAt.set(at, cell.row);
    scores[at] = cell.score;
  }
  return { personIds: [...personIndex.keys()], itemIds: [...itemIndex.keys()], scores };
}

/**
 * Builds a {@link ResponseMatrix} from a wide table: one row per person, one column per item,
 * `null` for an item not presented.
 *
 * @param personIds one id per row, unique.
 * @param itemIds one id per column, unique.
 * @param rows the scores.
 * @param options allowed scores (default 0, 1), number of the first row for messages.
 * @returns the matrix.
 * @throws ResponseDataError naming the row for a wrong row length, a score not allowed or a repeated person id.
 * @example
 * Array.from(buildResponseMatrixFromWide(['a', 'b'], ['x', 'y'], [[1, null], [0, 1]]).scores); // [1, 255, 0, 1]
 */
export function buildResponseMatrixFromWide(
  personIds: readonly string[],
  itemIds: readonly string[],
  rows: readonly (readonly (number | null)[])[],
  options: BuildResponseMatrixOptions = {},
): ResponseMatrix {
  const allowed = allowedSet(options);
  const rowNumber = rowNumberer(options);
  if (personIds.length !== rows.length)
    throw new Error('buildResponseMatrixFromWide requires one person id per row');
  const items = new Set<string>();
  for (const id of itemIds) {
    if (id === '') throw new Error('buildResponseMatrixFromWide requires non-empty item ids');
    if (items.has(id)) throw new Error(`buildResponseMatrixFromWide found item ${id} twice`);
    items.add(id);
  }
  const nItems = itemIds.length;
  const scores = new Uint8Array(rows.length * nItems);
  const seen = new Map<string, number>();
  rows.forEach((values, p) => {
    const row = rowNumber(p);
    const personId = personIds[p]!;
    if (personId === '') throw new ResponseDataError(`row ${row}: empty person id`, row);
    const earlier = seen.get(personId);
    if (earlier !== undefined) {
      throw new ResponseDataError(`row ${row}: person ${personId} already given in row ${earlier}`, row);
    }
    seen.set(personId, row);
    if (values.length !== nItems) {
      throw new ResponseDataError(`row ${row}: ${values.length} scores for ${nItems} items`, row);
    }
    for (let i = 0; i < nItems; i++) {
      const value = values[i]!;
      if (value !== null && !allowed.has(value)) {
        throw new ResponseDataError(
          `row ${row}: score ${String(value)} for person ${personId}, item ${itemIds[i]} is not one of ${describeAllowed(allowed)}`,
          row,
        );
      }
      scores[p * nItems + i] = value ?? MISSING;
    }
  });
  return { personIds: [...personIds], itemIds: [...itemIds], scores };
}

/** Persons and items without a single response. */
export interface EmptyPersonsAndItems {
  readonly personsWithoutResponses: readonly string[];
  readonly itemsWithoutResponses: readonly string[];
}

/**
 * Lists persons and items that hold no response at all (every cell missing), so a caller can
 * report them before estimation rather than drop them silently.
 *
 * @param matrix the responses.
 * @returns ids of empty persons and empty items.
 * @example
 * findEmptyPersonsAndItems({ personIds: ['a', 'b'], itemIds: ['x', 'y'], scores: Uint8Array.of(1, 255, 255, 255) });
 * // { personsWithoutResponses: ['b'], itemsWithoutResponses: ['y'] }
 */
export function findEmptyPersonsAndItems(matrix: ResponseMatrix): EmptyPersonsAndItems {
  const nItems = matrix.itemIds.length;
  const itemAnswered = new Uint8Array(nItems);
  const personsWithoutResponses: string[] = [];
  matrix.personIds.forEach((id, p) => {
    let any = false;
    for (let i = 0; i < nItems; i++) {
      if (matrix.scores[p * nItems + i] !== MISSING) {
        any = true;
        itemAnswered[i] = 1;
      }
    }
    if (!any) personsWithoutResponses.push(id);
  });
  return {
    personsWithoutResponses,
    itemsWithoutResponses: matrix.itemIds.filter((_, i) => itemAnswered[i] === 0),
  };
}

/**
 * A matrix restricted to some persons (rows) and items (columns), in the given order.
 *
 * @example
 * selectResponseMatrix({ personIds: ['a', 'b'], itemIds: ['x', 'y'], scores: Uint8Array.of(1, 0, 0, 1) }, [1], [1]).scores;
 * // Uint8Array [1]
 */
export function selectResponseMatrix(
  matrix: ResponseMatrix,
  personRows: ArrayLike<number> = Array.from(matrix.personIds.keys()),
  itemColumns: ArrayLike<number> = Array.from(matrix.itemIds.keys()),
): ResponseMatrix {
  const nItems = matrix.itemIds.length;
  const nP = personRows.length;
  const nI = itemColumns.length;
  const scores = new Uint8Array(nP * nI);
  for (let p = 0; p < nP; p++) {
    const from = personRows[p]! * nItems;
    for (let i = 0; i < nI; i++) scores[p * nI + i] = matrix.scores[from + itemColumns[i]!]!;
  }
  return {
    personIds: Array.from({ length: nP }, (_, p) => matrix.personIds[personRows[p]!]!),
    itemIds: Array.from({ length: nI }, (_, i) => matrix.itemIds[itemColumns[i]!]!),
    scores,
  };
}
