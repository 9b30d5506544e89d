import { type Kysely, SqliteAdapter, sql } from 'kysely';
import type { Database } from './database.js';
import type { DbHandle } from './db-handle.js';

/**
 * One unit of work: everything one request writes. It receives the handle of the open transaction,
 * must run every query on it (a query on the root handle would wait for the batch's connection
 * forever), must await every query it starts, and must not open a transaction of its own.
 */
export type WriteUnit<T> = (db: DbHandle) => Promise<T>;

/** Runs units of work; a unit's promise settles only after its writes are committed (or not made). */
export interface WriteQueue {
  run<T>(unit: WriteUnit<T>): Promise<T>;
}

export interface WriteBatchOptions {
  /** Most units committed together (default `defaultMaxBatch`). */
  maxBatch?: number;
  /** Called after each COMMIT returned and before any unit of that batch settles (tests, metrics). */
  onCommit?: (units: number) => void;
}

/**
 * Most units in one commit. At 64 clients a batch rarely reaches it; the bound keeps one batch's
 * lock time, and the wait of the requests behind it, short.
 */
export const defaultMaxBatch = 128;

type Outcome = { ok: true; value: unknown } | { ok: false; error: unknown };

interface Pending {
  unit: WriteUnit<unknown>;
  resolve: (value: unknown) => void;
  reject: (error: unknown) => void;
}

/**
 * Group commit for SQLite. Concurrent requests hand their unit of work to `run`; one writer takes
 * every queued unit (at most `maxBatch`) into ONE transaction, runs each inside its own SAVEPOINT,
 * COMMITs once, and only then settles each unit's promise. So an acknowledged answer is on disk
 * (the commit is fsynced at `synchronous = FULL`), and one fsync serves the whole batch instead
 * of one per answer.
 *
 * - A unit that throws is rolled back to its savepoint and rejects with its own error (a 4xx stays
 *   a 4xx); the other units of the batch are unaffected.
 * - Units run one after another in the order they arrived, each seeing the writes of those before.
 * - If the transaction itself fails (BEGIN, a savepoint command, COMMIT), nothing of the batch is
 *   stored and every unit rejects; units that had failed on their own keep their own error.
 * - `BEGIN IMMEDIATE`: the batch holds SQLite's write lock from its start.
 * - No timer: the writer starts on the next turn of the event loop (`setImmediate`), after the
 *   requests that already arrived were read, so an idle server adds no wait and a busy one forms
 *   its batch while the previous commit runs.
 *
 * SQLite has one writer at a time anyway (kysely's SQLite driver shares one connection), so
 * batching loses no parallelism. The technique is the classic group commit of database logs
 * (DeWitt et al., "Implementation techniques for main memory database systems", SIGMOD 1984, from
 * memory), done here at the application's level with savepoints.
 */
export class WriteBatch implements WriteQueue {
  readonly #db: Kysely<Database>;
  readonly #maxBatch: number;
  readonly #onCommit: ((units: number) => void) | undefined;
  readonly #queue: Pending[] = [];
  #scheduled = false;
  #running = false;
  #commits = 0;
  #committedUnits = 0;

  constructor(db: Kysely<Database>, options: WriteBatchOptions = {}) {
    const maxBatch = options.maxBatch ?? defaultMaxBatch;
    if (!Number.isInteger(maxBatch) || maxBatch < 1)
      throw new RangeError('maxBatch must be a whole number ≥ 1');
    this.#db = db;
    this.#maxBatch = maxBatch;
    this.#onCommit = options.onCommit;
  }

  /** Units waiting for the writer (not counting the batch being committed). */
  get waiting(): number {
    return this.#queue.length;
  }

  /** Commits so far and the units they carried (their ratio is the mean batch size). */
  get stats(): { commits: number; units: number } {
    return { commits: this.#commits, units: this.#committedUnits };
  }

  run<T>(unit: WriteUnit<T>): Promise<T> {
    return new Promise<T>((resolve, reject) => {
      this.#queue.push({ unit, resolve: resolve as (value: unknown) => void, reject });
      this.#schedule();
    });
  }

  #schedule(): void {
    if (this.#running || this.#scheduled || this.#queue.length === 0) return;
    this.#scheduled = true;
    setImmediate(() => {
      this.#scheduled = false;
      void this.#flush();
    });
  }

  async #flush(): Promise<void> {
    if (this.#running) return;
    this.#running = true;
    try {
      await this.#commitBatch(this.#queue.splice(0, this.#maxBatch));
    } finally {
      this.#running = false;
      this.#schedule();
    }
  }

  async #commitBatch(batch: Pending[]): Promise<void> {
    const outcomes: Outcome[] = [];
    let failure: { error: unknown } | undefined;
    try {
      // One connection for the whole batch (kysely's SQLite driver has only one anyway).
      await this.#db.connection().execute(async (connection) => {
        // IMMEDIATE takes the write lock now (waiting up to busy_timeout for a CLI command beside the
        // server), so no unit can meet SQLITE_BUSY halfway through, after reading a stale snapshot.
        await sql`begin immediate`.execute(connection);
        try {
          for (const pending of batch) {
            await sql`savepoint batch_unit`.execute(connection);
            try {
              const value = await pending.unit(connection);
              await sql`release savepoint batch_unit`.execute(connection);
              outcomes.push({ ok: true, value });
            } catch (error) {
              // Undo this unit only; ROLLBACK TO keeps the savepoint open, RELEASE closes it.
              await sql`rollback to savepoint batch_unit`.execute(connection);
              await sql`release savepoint batch_unit`.execute(connection);
              outcomes.push({ ok: false, error });
            }
          }
          await sql`commit`.execute(connection);
        } catch (error) {
          // The transaction itself failed (a savepoint command or COMMIT): nothing of it is stored.
          await sql`rollback`.execute(connection).catch(() => {});
          throw error;
        }
      });
    } catch (error) {
      failure = { error };
    }
    if (failure !== undefined) {
      batch.forEach((pending, i) => {
        const outcome = outcomes[i];
        pending.reject(outcome !== undefined && !outcome.ok ? outcome.error : failure.error);
      });
      return;
    }
    this.#commits += 1;
    this.#committedUnits += batch.length;
    this.#onCommit?.(batch.length);
    batch.forEach((pending, i) => {
      const outcome = outcomes[i] as Outcome;
      if (outcome.ok) pending.resolve(outcome.value);
      else pending.reject(outcome.error);
    });
  }
}

/** PostgreSQL: one transaction per unit; the server group-commits concurrent transactions itself. */
class TransactionPerUnit implements WriteQueue {
  readonly #db: Kysely<Database>;
  constructor(db: Kysely<Database>) {
    this.#db = db;
  }
  run<T>(unit: WriteUnit<T>): Promise<T> {
    return this.#db.transaction().execute(unit);
  }
}

const queues = new WeakMap<Kysely<Database>, WriteQueue>();

/** True when the database handle is SQLite (kysely's SQLite adapter). */
export function isSqlite(db: Kysely<Database>): boolean {
  return db.getExecutor().adapter instanceof SqliteAdapter;
}

/**
 * The write queue of a database handle, one per handle so every route of a server shares it:
 * a `WriteBatch` on SQLite, one transaction per unit on PostgreSQL.
 */
export function writeQueueFor(db: Kysely<Database>): WriteQueue {
  let queue = queues.get(db);
  if (queue === undefined) {
    queue = isSqlite(db) ? new WriteBatch(db) : new TransactionPerUnit(db);
    queues.set(db, queue);
  }
  return queue;
}
