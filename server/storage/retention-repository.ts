import { randomUUID } from 'node:crypto';
import { insertAuditEntry } from './audit-repository.js';
import { type DbHandle, nowIso } from './db-handle.js';

/**
 * Drops the background answers (age band, role, …) of attempts started more than `days` days
 * before `now`, keeping the item responses for calibration; audited as 'retention.apply' by `actor`
 * with the count only. Returns how many attempts lost their background answers.
 * @throws when days is not a positive whole number
 */
export async function applyRetention(
  db: DbHandle,
  days: number,
  actor: string,
  now: Date = new Date(),
): Promise<number> {
  if (!Number.isInteger(days) || days < 1)
    throw new Error('retention requires a whole number of days, at least 1');
  const before = new Date(now.getTime() - days * 86_400_000).toISOString();
  const result = await db
    .updateTable('attempts')
    .set({ background: '{}' })
    .where('started_at', '<', before)
    .where('background', '!=', '{}')
    .executeTakeFirst();
  const count = Number(result.numUpdatedRows);
  if (count > 0) {
    await insertAuditEntry(db, {
      id: randomUUID(),
      at: nowIso(),
      actor,
      action: 'retention.apply',
      subject: 'attempts',
      details: { days, attempts: count, startedBefore: before },
    });
  }
  return count;
}
