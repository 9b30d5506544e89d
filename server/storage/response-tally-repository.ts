import type { DbHandle } from './db-handle.js';
import { preparedQuery } from './prepared-query.js';

/** An attempt's stored answers counted, and whether one item among them is already answered. */
export interface ResponseTally {
  answered: number;
  /** Answers scored 1. */
  correct: number;
  /** The item has a stored answer in this attempt (read it with `findResponse`). */
  itemAnswered: boolean;
}

/**
 * Counts an attempt's responses and looks for one item's among them in one statement: what an
 * incoming answer needs to know first (a retry? how far along?), instead of a lookup plus a count.
 */
export async function tallyAttemptResponses(
  db: DbHandle,
  attemptId: string,
  itemId: string,
): Promise<ResponseTally> {
  const [row] = await tally(db, [itemId, attemptId]);
  if (row === undefined) throw new Error('an aggregate query returned no row');
  return {
    answered: Number(row.answered),
    correct: Number(row.correct ?? 0),
    itemAnswered: Number(row.item_answers ?? 0) > 0,
  };
}

const tally = preparedQuery(2, (db, [itemId, attemptId]) =>
  db
    .selectFrom('responses')
    .select((eb) => [
      eb.fn.countAll<number | string>().as('answered'),
      eb.fn.sum<number | string | null>(eb.case().when('score', '=', 1).then(1).else(0).end()).as('correct'),
      eb.fn
        .sum<number | string | null>(eb.case().when('item_id', '=', itemId!).then(1).else(0).end())
        .as('item_answers'),
    ])
    .where('attempt_id', '=', attemptId!),
);
