/**
 * Retiring and reinstating bank items. A change is a new row of the append-only
 * `item_status_changes` log, never an edit of the item's file or of its `items` rows, and is
 * audited (`item.retire`, `item.reinstate`). Delivery reads the latest change when it builds the
 * pool of a new attempt (select-item-pool.ts); responses already stored keep counting in
 * calibrations.
 */
import { randomUUID } from 'node:crypto';
import { z } from 'zod';
import { AppError } from '../errors.js';
import { insertAuditEntry } from '../storage/audit-repository.js';
import { type DbHandle, isUniqueViolation, nowIso } from '../storage/db-handle.js';
import {
  findLatestItemStatusChange,
  type ItemStatusChange,
  insertItemStatusChange,
  type LoggedItemStatus,
} from '../storage/item-status-repository.js';
import { syncItemVersions } from '../storage/item-version-repository.js';
import type { DeliverableItem, DeliveryBank } from './delivery-bank.js';

/** The body of a retire or reinstate: why (kept in the log and the audit entry). */
export const itemStatusChangeInputSchema = z.strictObject({
  reason: z.string().trim().min(3, 'say why in at least 3 characters').max(500, 'at most 500 characters'),
});
export type ItemStatusChangeInput = z.infer<typeof itemStatusChangeInputSchema>;

/** An item's status as delivery applies it: the file's `retired`/`draft` wins, else the log's latest. */
export type EffectiveItemStatus = DeliverableItem['status'];

export function effectiveItemStatus(
  fileStatus: DeliverableItem['status'],
  latest: Pick<ItemStatusChange, 'status'> | undefined,
): EffectiveItemStatus {
  if (fileStatus !== 'active') return fileStatus;
  return latest?.status ?? 'active';
}

const actionOf: Record<LoggedItemStatus, string> = { retired: 'item.retire', active: 'item.reinstate' };

/**
 * Retires (`to = 'retired'`) or reinstates (`to = 'active'`) one item of the loaded bank. Call
 * inside a transaction. The change records the item's current version (synced into `items` first).
 *
 * @throws AppError ITEM_NOT_FOUND for an id not in the bank; CONFLICT when the item already has
 *   that status, when its file says `retired` or `draft` (the file wins; change it there), or when
 *   another change of the item landed at the same moment.
 */
export async function changeItemStatus(
  db: DbHandle,
  bank: DeliveryBank,
  itemId: string,
  to: LoggedItemStatus,
  input: ItemStatusChangeInput,
  actor: string,
): Promise<ItemStatusChange> {
  const entry = bank.get(itemId);
  if (!entry) {
    throw new AppError('ITEM_NOT_FOUND', `No item "${itemId}" in the bank.`, { field: 'params.itemId' });
  }
  if (entry.item.status !== 'active') {
    throw new AppError(
      'CONFLICT',
      `Item "${itemId}" is ${entry.item.status} in its file; change the file to make it active first.`,
      { field: 'params.itemId', fileStatus: entry.item.status },
    );
  }
  const latest = await findLatestItemStatusChange(db, itemId);
  const current = effectiveItemStatus(entry.item.status, latest);
  if (current === to) {
    throw new AppError(
      'CONFLICT',
      to === 'retired' ? `Item "${itemId}" is already retired.` : `Item "${itemId}" is already active.`,
      { field: 'params.itemId', status: current },
    );
  }
  const at = nowIso();
  const versions = await syncItemVersions(
    db,
    [{ id: itemId, contentHash: entry.contentHash, status: entry.item.status }],
    at,
  );
  const change: ItemStatusChange = {
    id: randomUUID(),
    itemId,
    itemVersion: versions.get(itemId)!,
    changeNumber: (latest?.changeNumber ?? 0) + 1,
    status: to,
    reason: input.reason,
    actor,
    changedAt: at,
  };
  try {
    await insertItemStatusChange(db, change);
  } catch (error) {
    if (!isUniqueViolation(error)) throw error;
    throw new AppError(
      'CONFLICT',
      `Item "${itemId}" was changed by someone else just now; reload and check.`,
      {
        field: 'params.itemId',
      },
    );
  }
  await insertAuditEntry(db, {
    id: randomUUID(),
    at,
    actor,
    action: actionOf[to],
    subject: itemId,
    details: { version: change.itemVersion, changeNumber: change.changeNumber, reason: change.reason },
  });
  return change;
}
