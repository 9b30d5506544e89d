import type { Kysely } from 'kysely';
import { BankLoadError, type ItemBank, loadBank } from '../bank/load-bank.js';
import type { Database } from '../storage/database.js';
import { nowIso } from '../storage/db-handle.js';
import { syncItemVersions } from '../storage/item-version-repository.js';
import { CliError } from './cli-error.js';

/**
 * Loads the item bank from ITEMS_DIR. A malformed bank stops the command with every problem listed
 * as `file: field: problem` (exit code 2).
 */
export async function openBank(itemsDir: string): Promise<ItemBank> {
  try {
    return await loadBank(itemsDir);
  } catch (error) {
    if (error instanceof BankLoadError) throw new CliError(`ITEMS_DIR: ${error.message}`);
    throw error;
  }
}

/** Records the loaded bank's item versions (a new content hash of an id becomes its next version). */
export async function recordItemVersions(db: Kysely<Database>, bank: ItemBank): Promise<Map<string, number>> {
  return db.transaction().execute((trx) =>
    syncItemVersions(
      trx,
      bank.items.map((item) => ({ id: item.id, contentHash: item.version, status: item.status })),
      nowIso(),
    ),
  );
}
