import { createHash } from 'node:crypto';
import type { FastifyReply, FastifyRequest } from 'fastify';
import { AppError } from '../errors.js';
import { bearerToken, secretsEqual } from './auth.js';

/** Name of the cookie a signed-in browser carries. */
export const consoleCookieName = 'plotgauge_console';

/**
 * The cookie's value: a SHA-256 digest of the admin token under a fixed label, so the token itself
 * never sits in the browser's cookie store; changing ADMIN_TOKEN signs every browser out.
 */
export function consoleCookieValue(adminToken: string): string {
  return createHash('sha256').update(`plotgauge-console\u0000${adminToken}`, 'utf8').digest('base64url');
}

/** The `Set-Cookie` header of a sign-in: HttpOnly, SameSite=Strict, Path=/, Secure over HTTPS. */
export function consoleCookieHeader(adminToken: string, secure: boolean): string {
  return [
    `${consoleCookieName}=${consoleCookieValue(adminToken)}`,
    'HttpOnly',
    'SameSite=Strict',
    'Path=/',
    'Max-Age=43200',
    ...(secure ? ['Secure'] : []),
  ].join('; ');
}

/** The `Set-Cookie` header that signs a browser out. */
export const signOutCookieHeader = `${consoleCookieName}=; HttpOnly; SameSite=Strict; Path=/; Max-Age=0`;

/** A cookie's value from the request's Cookie header, or undefined. */
export function readCookie(request: FastifyRequest, name: string): string | undefined {
  const header = request.headers.cookie;
  if (typeof header !== 'string') return undefined;
  for (const part of header.split(';')) {
    const at = part.indexOf('=');
    if (at > 0 && part.slice(0, at).trim() === name) return part.slice(at + 1).trim();
  }
  return undefined;
}

/**
 * True when the request carries the admin token as `Authorization: Bearer` or the console cookie,
 * compared in constant time.
 */
export function isConsoleSignedIn(request: FastifyRequest, adminToken: string | undefined): boolean {
  if (adminToken === undefined) return false;
  const bearer = bearerToken(request);
  if (bearer !== undefined && secretsEqual(bearer, adminToken)) return true;
  const cookie = readCookie(request, consoleCookieName);
  return cookie !== undefined && secretsEqual(cookie, consoleCookieValue(adminToken));
}

/** A preHandler for JSON and CSV routes: the bearer token or the console cookie, else 401. */
export function consoleApiGuard(adminToken: string | undefined) {
  return async (request: FastifyRequest): Promise<void> => {
    if (adminToken === undefined) {
      throw new AppError(
        'UNAUTHORIZED',
        'The admin API is off: set ADMIN_TOKEN (16+ characters) and restart.',
      );
    }
    if (!isConsoleSignedIn(request, adminToken)) {
      throw new AppError(
        'UNAUTHORIZED',
        'Send the admin token as Authorization: Bearer <token>, or sign in at /sign-in.',
      );
    }
  };
}

/** A preHandler for HTML pages: not signed in → 303 to the sign-in page, which returns here after. */
export function consolePageGuard(adminToken: string | undefined) {
  return async (request: FastifyRequest, reply: FastifyReply): Promise<void> => {
    if (isConsoleSignedIn(request, adminToken)) return;
    const next = encodeURIComponent(request.url);
    await reply.code(303).header('cache-control', 'no-store').redirect(`/sign-in?next=${next}`, 303);
  };
}

/** Only same-site paths may follow a sign-in (no `//host` or scheme: no open redirect). */
export function safeNextPath(next: string | undefined): string {
  if (next === undefined || !next.startsWith('/') || next.startsWith('//') || next.includes('\\')) return '/';
  return next;
}
