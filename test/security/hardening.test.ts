import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { contentSecurityPolicy } from '../../server/http/access-headers.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

const [sqlite] = testEngines();

describe('security headers and rate limits', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  beforeAll(async () => {
    database = await sqlite!.open();
    app = await buildTestApp(database, {
      env: { ADMIN_TOKEN: 'hardening-admin-token-0123', RATE_LIMIT_JOIN: '5', RATE_LIMIT_ANSWERS: '7' },
    });
  });
  afterAll(async () => {
    await app.close();
    await database.cleanup();
  });

  it('sends one strict policy on pages, JSON and errors alike', async () => {
    for (const url of ['/', '/sign-in', '/health', '/api/admin/studies', '/no-such-page']) {
      const reply = await app.inject({ url });
      expect(reply.headers['content-security-policy'], url).toBe(contentSecurityPolicy);
      expect(reply.headers['x-content-type-options'], url).toBe('nosniff');
      expect(reply.headers['referrer-policy'], url).toBe('no-referrer');
      expect(reply.headers['x-frame-options'], url).toBe('SAMEORIGIN');
    }
    // CSP Level 3 (W3C): no inline script or style, no other origin, no framing.
    expect(contentSecurityPolicy).not.toMatch(/unsafe-inline|unsafe-eval|\*|https?:/);
    expect(contentSecurityPolicy).toContain("frame-ancestors 'none'");
  });

  it('limits joins per address with 429 RATE_LIMITED and Retry-After; other addresses pass', async () => {
    const join = (remoteAddress: string) =>
      app.inject({ method: 'POST', url: '/api/join', remoteAddress, payload: { code: 'NOPE-NOPE' } });
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) statuses.push((await join('10.1.2.3')).statusCode);
    expect(statuses.slice(0, 5).every((s) => s !== 429)).toBe(true);
    const limited = await join('10.1.2.3');
    expect(limited.statusCode).toBe(429);
    expect(limited.json().error.code).toBe('RATE_LIMITED');
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect((await join('10.9.9.9')).statusCode).not.toBe(429);
    // Loopback (a proxy on the same machine, the demo) is not limited.
    for (let i = 0; i < 8; i++) expect((await join('127.0.0.1')).statusCode).not.toBe(429);
  });

  it('limits respondent requests per address, and leaves team routes alone', async () => {
    const state = (remoteAddress: string) =>
      app.inject({ url: '/api/attempt', remoteAddress, headers: { authorization: 'Bearer nobody' } });
    for (let i = 0; i < 7; i++) expect((await state('10.4.4.4')).statusCode).not.toBe(429);
    expect((await state('10.4.4.4')).statusCode).toBe(429);
    for (let i = 0; i < 10; i++) {
      const reply = await app.inject({ url: '/api/admin/studies', remoteAddress: '10.4.4.4' });
      expect(reply.statusCode).toBe(401);
    }
  });
});
