import { createHmac } from 'node:crypto';
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import type { Kysely } from 'kysely';
import { AppError } from '../errors.js';
import type { Database } from '../storage/database.js';
import {
  findActiveTokenByHash,
  findActiveTokenById,
  hashToken,
  type TokenRole,
  teamTokenPattern,
  touchAccessToken,
} from '../storage/token-repository.js';
import { type Access, accessOf, consolePages } from './access-policy.js';
import { bearerToken, secretsEqual } from './auth.js';
import { consoleCookieName, readCookie } from './console-auth.js';

/** Who a team request comes from: the token's role and label (the audit log's actor). */
export interface Principal {
  role: TokenRole;
  label: string;
  /** 'bootstrap' for ADMIN_TOKEN, else the access_tokens id. */
  tokenId: string;
  /** SHA-256 (hex) of the token: the key of its console cookie. */
  tokenHash: string;
}

declare module 'fastify' {
  interface FastifyRequest {
    /** Set by the access check on analyst and admin routes. */
    principal?: Principal;
  }
}

export interface AccessControlOptions {
  /** ADMIN_TOKEN: a bootstrap admin, labelled 'admin-token' in the audit log. */
  adminToken: string | undefined;
  /** Where team tokens live; without it only ADMIN_TOKEN is known (bare test instances). */
  db?: Kysely<Database>;
}

/** The label ADMIN_TOKEN carries in the audit log. */
export const bootstrapLabel = 'admin-token';

/** How long a token's last use may be stale before it is written again (saves a write per read). */
const touchAfterMs = 60_000;

const cookieValuePattern = /^([A-Za-z0-9-]{1,64})\.([A-Za-z0-9_-]{43})$/;

/** The console cookie's value for a token: its id and an HMAC keyed by its hash; never the token. */
export function consoleCookieValue(principal: Pick<Principal, 'tokenId' | 'tokenHash'>): string {
  const mac = createHmac('sha256', principal.tokenHash).update('plotgauge-console').digest('base64url');
  return `${principal.tokenId}.${mac}`;
}

function bootstrapPrincipal(adminToken: string): Principal {
  return { role: 'admin', label: bootstrapLabel, tokenId: 'bootstrap', tokenHash: hashToken(adminToken) };
}

/**
 * The principal of a presented token (bearer or sign-in form), or undefined. ADMIN_TOKEN is compared
 * in constant time; a team token is looked up by its SHA-256, so the comparison never sees the token.
 */
export async function principalOfToken(
  token: string,
  { adminToken, db }: AccessControlOptions,
): Promise<Principal | undefined> {
  if (adminToken !== undefined && secretsEqual(token, adminToken)) return bootstrapPrincipal(adminToken);
  if (db === undefined || !teamTokenPattern.test(token)) return undefined;
  const found = await findActiveTokenByHash(db, hashToken(token));
  if (found === undefined) return undefined;
  await noteUse(db, found.id, found.lastUsedAt);
  return { role: found.role, label: found.label, tokenId: found.id, tokenHash: found.tokenHash };
}

/** The principal of a console cookie, checked against the stored token (a revoked one fails). */
async function principalOfCookie(
  cookie: string,
  { adminToken, db }: AccessControlOptions,
): Promise<Principal | undefined> {
  const match = cookieValuePattern.exec(cookie);
  if (match === null) return undefined;
  const id = match[1] as string;
  let principal: Principal | undefined;
  let lastUsedAt: string | null = null;
  if (id === 'bootstrap') {
    if (adminToken !== undefined) principal = bootstrapPrincipal(adminToken);
  } else if (db !== undefined) {
    const found = await findActiveTokenById(db, id);
    if (found !== undefined) {
      principal = { role: found.role, label: found.label, tokenId: found.id, tokenHash: found.tokenHash };
      lastUsedAt = found.lastUsedAt;
    }
  }
  if (principal === undefined || !secretsEqual(cookie, consoleCookieValue(principal))) return undefined;
  if (db !== undefined && id !== 'bootstrap') await noteUse(db, id, lastUsedAt);
  return principal;
}

async function noteUse(db: Kysely<Database>, id: string, lastUsedAt: string | null): Promise<void> {
  if (lastUsedAt !== null && Date.now() - Date.parse(lastUsedAt) < touchAfterMs) return;
  await touchAccessToken(db, id);
}

/** The principal of a request: its bearer token, else its console cookie; undefined when neither is valid. */
export async function principalOf(
  request: FastifyRequest,
  options: AccessControlOptions,
): Promise<Principal | undefined> {
  const bearer = bearerToken(request);
  if (bearer !== undefined) return principalOfToken(bearer, options);
  const cookie = readCookie(request, consoleCookieName);
  return cookie === undefined ? undefined : principalOfCookie(cookie, options);
}

/** The audit log's actor for a request: the token's label. */
export function actorOf(request: FastifyRequest): string {
  return request.principal?.label ?? bootstrapLabel;
}

function satisfies(role: TokenRole, needed: Access): boolean {
  return needed === 'analyst' ? role === 'analyst' || role === 'admin' : role === 'admin';
}

async function checkAccess(
  request: FastifyRequest,
  reply: FastifyReply,
  options: AccessControlOptions,
): Promise<void> {
  const url = request.routeOptions.url;
  if (url === undefined) return; // no such route: the 404 handler answers
  const needed = accessOf(request.method, url, request.routeOptions.config.access);
  if (needed === 'public' || needed === 'respondent') return;
  const principal = await principalOf(request, options);
  if (principal === undefined) {
    if (consolePages.has(`${request.method === 'HEAD' ? 'GET' : request.method} ${url}`)) {
      const next = encodeURIComponent(request.url);
      await reply.code(303).header('cache-control', 'no-store').redirect(`/sign-in?next=${next}`, 303);
      return reply;
    }
    throw new AppError(
      'UNAUTHORIZED',
      options.adminToken === undefined
        ? 'Send a team token (plotgauge token create) as Authorization: Bearer <token>, or set ADMIN_TOKEN (16+ characters) and restart.'
        : 'Send a team token as Authorization: Bearer <token>, or sign in at /sign-in.',
    );
  }
  if (!satisfies(principal.role, needed)) {
    throw new AppError('FORBIDDEN', `This needs an ${needed} token; this one is ${principal.role}.`);
  }
  request.principal = principal;
}

/**
 * The one access check of the server: an onRequest hook (before any body is read) that looks up the
 * route's access level (server/http/access-policy.ts) and answers 401 (no or unknown token), 403
 * (too little role) or 303 to /sign-in (console pages). Registered once, it covers every route,
 * including routes registered after it by other plugins.
 */
export const accessControl = fp<AccessControlOptions>(
  async (app: FastifyInstance, options: AccessControlOptions) => {
    app.addHook('onRequest', async (request, reply) => checkAccess(request, reply, options));
  },
  { name: 'plotgauge-access-control', fastify: '5.x' },
);
