import { randomUUID } from 'node:crypto';
import { insertAuditEntry } from './audit-repository.js';
import { type DbHandle, nowIso } from './db-handle.js';
import { hashToken } from './token-repository.js';

/** What an erasure removed: counts only, never content. */
export interface Erasure {
  attemptId: string;
  responses: number;
}

/** The attempt id a respondent's own token belongs to (its SHA-256 is what is stored), or undefined. */
export async function attemptIdOfToken(db: DbHandle, token: string): Promise<string | undefined> {
  const row = await db
    .selectFrom('attempts')
    .select('id')
    .where('token_hash', '=', hashToken(token))
    .executeTakeFirst();
  return row?.id;
}

/**
 * Removes one person's data: the attempt (background answers, consent time) and every response of
 * it, and records the erasure in the audit log with counts only. Call inside a transaction.
 * Returns undefined when there is no such attempt.
 */
export async function eraseAttempt(
  db: DbHandle,
  attemptId: string,
  actor: string,
): Promise<Erasure | undefined> {
  const attempt = await db.selectFrom('attempts').select('id').where('id', '=', attemptId).executeTakeFirst();
  if (attempt === undefined) return undefined;
  const removed = await db.deleteFrom('responses').where('attempt_id', '=', attemptId).executeTakeFirst();
  await db.deleteFrom('attempts').where('id', '=', attemptId).execute();
  const erasure = { attemptId, responses: Number(removed.numDeletedRows) };
  await insertAuditEntry(db, {
    id: randomUUID(),
    at: nowIso(),
    actor,
    action: 'attempt.erase',
    subject: attemptId,
    details: { responses: erasure.responses },
  });
  return erasure;
}
