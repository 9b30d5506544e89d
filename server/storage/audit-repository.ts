import type { AuditRow } from './database.js';
import type { DbHandle } from './db-handle.js';

export interface AuditEntry {
  id: string;
  at: string;
  /** 'admin-token', 'cli' or 'system'. */
  actor: string;
  /** e.g. 'study.create', 'cohort.create', 'study.update'. */
  action: string;
  /** The id of what changed. */
  subject: string;
  /** Particulars; never answers or tokens. */
  details: Record<string, unknown>;
}

export function auditRowToEntry(row: AuditRow): AuditEntry {
  return {
    id: row.id,
    at: row.at,
    actor: row.actor,
    action: row.action,
    subject: row.subject,
    details: JSON.parse(row.details) as Record<string, unknown>,
  };
}

export async function insertAuditEntry(db: DbHandle, entry: AuditEntry): Promise<void> {
  await db
    .insertInto('audit_log')
    .values({
      id: entry.id,
      at: entry.at,
      actor: entry.actor,
      action: entry.action,
      subject: entry.subject,
      details: JSON.stringify(entry.details),
    })
    .execute();
}

/** Audit entries about one subject (or all), oldest first. */
export async function listAuditEntries(db: DbHandle, subject?: string): Promise<AuditEntry[]> {
  let query = db.selectFrom('audit_log').selectAll();
  if (subject !== undefined) query = query.where('subject', '=', subject);
  const rows = await query.orderBy('at').orderBy('id').execute();
  return rows.map(auditRowToEntry);
}
