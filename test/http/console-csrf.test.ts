import { createHmac } from 'node:crypto';
import type { FastifyRequest } from 'fastify';
import { describe, expect, it } from 'vitest';
import type { Principal } from '../../server/http/access-control.js';
import { assertCsrf, csrfTokenFor, originIsSelf } from '../../server/http/console-csrf.js';

const principal: Principal = { role: 'admin', label: 'desk', tokenId: 'tok-1', tokenHash: 'a'.repeat(64) };

/** A request as the console handlers see it; `null`: no principal (the access check set none). */
function fakeRequest(headers: Record<string, string>, who: Principal | null = principal): FastifyRequest {
  return {
    headers: { host: 'gauge.example.test', ...headers },
    protocol: 'https',
    principal: who ?? undefined,
  } as unknown as FastifyRequest;
}

describe('console CSRF tokens', () => {
  it('is the HMAC-SHA256 of the token id keyed by the stored hash, base64url', () => {
    // Recomputed with node:crypto (RFC 2104 HMAC): the token is a pure function of the principal.
    const expected = createHmac('sha256', principal.tokenHash)
      .update('plotgauge-console-csrf:tok-1')
      .digest('base64url');
    expect(csrfTokenFor(principal)).toBe(expected);
    expect(csrfTokenFor(principal)).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(csrfTokenFor({ ...principal, tokenId: 'tok-2' })).not.toBe(expected);
    expect(csrfTokenFor({ ...principal, tokenHash: 'b'.repeat(64) })).not.toBe(expected);
  });

  it('accepts this server as Origin, no Origin, and "null" (sent under Referrer-Policy: no-referrer)', () => {
    expect(originIsSelf(fakeRequest({ origin: 'https://gauge.example.test' }))).toBe(true);
    expect(originIsSelf(fakeRequest({}))).toBe(true);
    expect(originIsSelf(fakeRequest({ origin: 'null' }))).toBe(true);
    // Behind a TLS proxy the server sees plain HTTP while the browser's origin is https: the host decides.
    expect(originIsSelf(fakeRequest({ origin: 'http://gauge.example.test' }))).toBe(true);
    expect(originIsSelf(fakeRequest({ origin: 'https://gauge.example.test:8443' }))).toBe(false);
    expect(originIsSelf(fakeRequest({ origin: 'not a url' }))).toBe(false);
    expect(originIsSelf(fakeRequest({ origin: 'https://gauge.example.test.evil.example' }))).toBe(false);
    expect(originIsSelf(fakeRequest({ origin: 'https://elsewhere.example' }))).toBe(false);
  });

  it('refuses a cookie request without the right token or from a foreign origin with 403', () => {
    const token = csrfTokenFor(principal);
    expect(() => assertCsrf(fakeRequest({}), token)).not.toThrow();
    expect(() => assertCsrf(fakeRequest({ 'x-csrf-token': token }), undefined)).not.toThrow();
    for (const [headers, submitted] of [
      [{}, undefined],
      [{}, ''],
      [{}, `${token}x`],
      [{}, csrfTokenFor({ ...principal, tokenId: 'someone-else' })],
      [{ origin: 'https://elsewhere.example' }, token],
    ] as const) {
      expect(() => assertCsrf(fakeRequest(headers), submitted)).toThrow(
        expect.objectContaining({ code: 'FORBIDDEN' }),
      );
    }
    expect(() => assertCsrf(fakeRequest({}, null), token)).toThrow(
      expect.objectContaining({ code: 'FORBIDDEN' }),
    );
  });

  it('needs no token from a request signed with a bearer token (no site can make a browser send one)', () => {
    expect(() => assertCsrf(fakeRequest({ authorization: 'Bearer pgt_x' }), undefined)).not.toThrow();
    expect(() => assertCsrf(fakeRequest({ authorization: 'Bearer pgt_x' }, null), undefined)).toThrow();
  });
});
