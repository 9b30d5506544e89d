import { createHmac } from 'node:crypto';
import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { AppError } from '../errors.js';
import type { Principal } from './access-control.js';
import { bearerToken, secretsEqual } from './auth.js';

/** Name of the hidden form field (and, for fetch, of the `x-csrf-token` header) carrying the token. */
export const csrfFieldName = 'csrf';
export const csrfHeaderName = 'x-csrf-token';

/**
 * The CSRF token of a signed-in console session: an HMAC keyed by the token's stored hash (which
 * never leaves the server) over its id. Same principal, same token, so a form rendered before a
 * restart still posts; revoking the token (or changing ADMIN_TOKEN) changes it. An attacker's page
 * cannot read it (same-origin policy), so a forged cross-site form cannot carry it.
 */
export function csrfTokenFor(principal: Pick<Principal, 'tokenId' | 'tokenHash'>): string {
  return createHmac('sha256', principal.tokenHash)
    .update(`plotgauge-console-csrf:${principal.tokenId}`)
    .digest('base64url');
}

/**
 * Whether a request's Origin (when the browser sends one) names this server's host. Only the host is
 * compared: behind a TLS-terminating proxy the browser's `https:` origin reaches a plain-HTTP server,
 * and another site always has another host. `Origin: null` is what browsers may send with the
 * console's `Referrer-Policy: no-referrer`, so it is not a refusal on its own; the token decides.
 */
export function originIsSelf(request: FastifyRequest): boolean {
  const origin = request.headers.origin;
  if (origin === undefined || origin === 'null') return true;
  // The Host header, and the forwarded host when fastify trusts the proxy (TRUST_PROXY).
  const hosts = [request.headers.host, request.host].filter((h): h is string => typeof h === 'string');
  try {
    const from = new URL(origin).host;
    return hosts.some((host) => host.toLowerCase() === from);
  } catch {
    return false;
  }
}

/**
 * Refuses a console POST that is not from one of our own pages: a foreign Origin, or a missing or
 * wrong CSRF token (form field `csrf` or header `x-csrf-token`), answers 403 FORBIDDEN and nothing is
 * changed. Call it first in every console handler that changes something (the access check has set
 * `request.principal`). A request signed with `Authorization: Bearer` is not a browser riding on a
 * cookie (no other site can make a browser add that header), so it needs no token.
 */
export function assertCsrf(request: FastifyRequest, submitted: unknown): void {
  if (bearerToken(request) !== undefined && request.principal !== undefined) return;
  const principal = request.principal;
  const header = request.headers[csrfHeaderName];
  const token = typeof submitted === 'string' && submitted !== '' ? submitted : header;
  if (principal === undefined || !originIsSelf(request)) {
    throw new AppError(
      'FORBIDDEN',
      'This form was not sent from this server; reload the page and try again.',
    );
  }
  if (typeof token !== 'string' || !secretsEqual(token, csrfTokenFor(principal))) {
    throw new AppError(
      'FORBIDDEN',
      'csrf: the form is out of date or not from this server; reload the page.',
    );
  }
}

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Whether a request is a change made with the console cookie to a route outside the console (the
 * JSON API): such a request must carry the session's token in `x-csrf-token` and a same-host Origin.
 * No page of this server makes one (console forms post to /console/… and check their own field),
 * so this closes the API to a forged request riding on a signed-in browser's cookie, whatever the
 * body's content type (SameSite=Strict already keeps the cookie off cross-site requests; a sibling
 * subdomain is same-site, this is not).
 */
function isCookieWriteToApi(request: FastifyRequest): boolean {
  if (safeMethods.has(request.method) || request.principal === undefined) return false;
  if (bearerToken(request) !== undefined) return false;
  const url = request.routeOptions.url ?? '';
  return !(url === '/console' || url.startsWith('/console/'));
}

/**
 * Registers, after the access check, the guard of {@link isCookieWriteToApi}: such a request without
 * the right `x-csrf-token` header or from another host answers 403 before its body is read.
 */
export const cookieWriteGuard = fp(
  async (app: FastifyInstance) => {
    app.addHook('onRequest', async (request) => {
      if (isCookieWriteToApi(request)) assertCsrf(request, undefined);
    });
  },
  { name: 'plotgauge-cookie-write-guard', fastify: '5.x', dependencies: ['plotgauge-access-control'] },
);
