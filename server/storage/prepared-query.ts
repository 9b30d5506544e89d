import type { Compilable, CompiledQuery } from 'kysely';
import type { DbHandle } from './db-handle.js';

/** The stand-in value of run-time slot `index` while a query is compiled (never sent to a database). */
function slotMarker(index: number): string {
  return `\u0000prepared-slot-${index}\u0000`;
}

interface Compiled<Row> {
  query: CompiledQuery<Row>;
  /** For each slot, the indexes of the compiled parameters it fills. */
  positions: number[][];
}

/**
 * A query built and compiled by kysely once per SQL dialect, then run with new values: the hot
 * respondent statements skip kysely's builder and compiler (about half their CPU cost) and keep one
 * SQL text, which the SQLite statement cache then prepares once. `build` receives one marker string
 * per slot and must use each as a bound value (a `where` operand, a `set` value); the compiled
 * parameters holding a marker are replaced by that slot's value on each run. A marker that ended up
 * anywhere but the parameters (or nowhere) throws on first use, so a wrong build fails loudly.
 */
export function preparedQuery<Row>(
  slots: number,
  build: (db: DbHandle, markers: readonly string[]) => Compilable<Row>,
): (db: DbHandle, values: readonly unknown[]) => Promise<Row[]> {
  // Keyed by the dialect adapter's class: the compiled text depends only on the dialect.
  const byDialect = new WeakMap<object, Compiled<Row>>();
  return async (db, values) => {
    if (values.length !== slots) throw new Error(`prepared query: ${slots} values expected`);
    const dialect = db.getExecutor().adapter.constructor;
    let compiled = byDialect.get(dialect);
    if (compiled === undefined) {
      const markers = Array.from({ length: slots }, (_, i) => slotMarker(i));
      const query = build(db, markers).compile();
      const positions = markers.map((marker) =>
        query.parameters.flatMap((value, index) => (value === marker ? [index] : [])),
      );
      if (query.sql.includes('\u0000') || positions.some((list) => list.length === 0)) {
        throw new Error(`prepared query: every slot must be a bound parameter (${query.sql})`);
      }
      compiled = { query, positions };
      byDialect.set(dialect, compiled);
    }
    const parameters = [...compiled.query.parameters];
    compiled.positions.forEach((list, slot) => {
      for (const index of list) parameters[index] = values[slot];
    });
    const result = await db.executeQuery<Row>({ ...compiled.query, parameters });
    return result.rows;
  };
}
