import { createHash, randomBytes, randomUUID } from 'node:crypto';
import type { AccessTokensTable } from './database.js';
import { type DbHandle, nowIso } from './db-handle.js';

/** The roles a team token can have; admin may do everything an analyst may. */
export const tokenRoles = ['admin', 'analyst'] as const;
export type TokenRole = (typeof tokenRoles)[number];

/** What `token list` shows: never the hash. */
export interface TokenSummary {
  id: string;
  label: string;
  role: TokenRole;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** A stored, unrevoked token as the access check sees it (the hash keys the console cookie). */
export interface ActiveToken {
  id: string;
  label: string;
  role: TokenRole;
  tokenHash: string;
  lastUsedAt: string | null;
}

/** Team tokens look like `pgt_` + 43 base64url characters (256 random bits). */
export const teamTokenPattern = /^pgt_[A-Za-z0-9_-]{43}$/;

/** SHA-256 of a token as lowercase hex: what `access_tokens.token_hash` stores. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/**
 * Makes a new token and stores its hash; the token is returned once and is not recoverable.
 * @throws when the label is empty or longer than 100 characters
 */
export async function createAccessToken(
  db: DbHandle,
  role: TokenRole,
  label: string,
): Promise<{ token: string; summary: TokenSummary }> {
  const trimmed = label.trim();
  if (trimmed.length === 0 || trimmed.length > 100)
    throw new Error('token label must be 1 to 100 characters');
  const token = `pgt_${randomBytes(32).toString('base64url')}`;
  const row: AccessTokensTable = {
    id: randomUUID(),
    label: trimmed,
    role,
    token_hash: hashToken(token),
    created_at: nowIso(),
    last_used_at: null,
    revoked_at: null,
  };
  await db.insertInto('access_tokens').values(row).execute();
  return { token, summary: toSummary(row) };
}

function toSummary(row: AccessTokensTable): TokenSummary {
  return {
    id: row.id,
    label: row.label,
    role: row.role,
    createdAt: row.created_at,
    lastUsedAt: row.last_used_at,
    revokedAt: row.revoked_at,
  };
}

/** Every token, oldest first, without hashes. */
export async function listAccessTokens(db: DbHandle): Promise<TokenSummary[]> {
  const rows = await db.selectFrom('access_tokens').selectAll().orderBy('created_at').orderBy('id').execute();
  return rows.map(toSummary);
}

/** Revokes a token; false when there is no unrevoked token with this id. */
export async function revokeAccessToken(db: DbHandle, id: string): Promise<boolean> {
  const result = await db
    .updateTable('access_tokens')
    .set({ revoked_at: nowIso() })
    .where('id', '=', id)
    .where('revoked_at', 'is', null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) > 0;
}

function toActive(row: AccessTokensTable | undefined): ActiveToken | undefined {
  if (row === undefined || row.revoked_at !== null) return undefined;
  return {
    id: row.id,
    label: row.label,
    role: row.role,
    tokenHash: row.token_hash,
    lastUsedAt: row.last_used_at,
  };
}

/** The unrevoked token with this hash, or undefined. */
export async function findActiveTokenByHash(
  db: DbHandle,
  tokenHash: string,
): Promise<ActiveToken | undefined> {
  return toActive(
    await db.selectFrom('access_tokens').selectAll().where('token_hash', '=', tokenHash).executeTakeFirst(),
  );
}

/** The unrevoked token with this id, or undefined (the console cookie names the id). */
export async function findActiveTokenById(db: DbHandle, id: string): Promise<ActiveToken | undefined> {
  return toActive(await db.selectFrom('access_tokens').selectAll().where('id', '=', id).executeTakeFirst());
}

/** Records a use; callers skip it when the last one is recent, so reads do not each cost a write. */
export async function touchAccessToken(db: DbHandle, id: string, at: string = nowIso()): Promise<void> {
  await db.updateTable('access_tokens').set({ last_used_at: at }).where('id', '=', id).execute();
}
