import type { FastifyRequest } from 'fastify';

/** Name of the cookie a signed-in browser carries. */
export const consoleCookieName = 'plotgauge_console';

/**
 * The `Set-Cookie` header of a sign-in: HttpOnly, SameSite=Strict, Path=/, Secure over HTTPS.
 * `value` comes from consoleCookieValue (server/http/access-control.ts): the token's id and an HMAC
 * keyed by the token's hash, never the token, so revoking the token (or changing ADMIN_TOKEN) signs
 * the browser out.
 */
export function consoleCookieHeader(value: string, secure: boolean): string {
  return [
    `${consoleCookieName}=${value}`,
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

/** Only same-site paths may follow a sign-in (no `//host` or scheme: no open redirect). */
export function safeNextPath(next: string | undefined): string {
  if (next === undefined || !next.startsWith('/') || next.startsWith('//') || next.includes('\\')) return '/';
  return next;
}
