import type { FastifyInstance } from 'fastify';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../server/config.js';
import { buildTestApp } from '../helpers/build-test-app.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

describe('TRUST_PROXY', () => {
  it('is off unless set, and takes proxy addresses, CIDR ranges and range names', () => {
    expect(loadConfig({}).trustProxy).toBeUndefined();
    expect(loadConfig({ TRUST_PROXY: '' }).trustProxy).toBeUndefined();
    expect(loadConfig({ TRUST_PROXY: '127.0.0.1' }).trustProxy).toEqual(['127.0.0.1']);
    expect(loadConfig({ TRUST_PROXY: ' 10.0.0.0/8, ::1 ,fd00::/8,loopback' }).trustProxy).toEqual([
      '10.0.0.0/8',
      '::1',
      'fd00::/8',
      'loopback',
    ]);
  });

  it.each([
    'true', // everyone: any client would choose its own address
    '1', // a hop count: fastify 5.12 ignores it (trusts nothing), so it would silently do nothing
    '10.0.0.0/33',
    '::1/129',
    'proxy.example.org',
    '10.0.0.1,,10.0.0.2',
    '10.0.0.0/8/1',
  ])('refuses %j with one line naming TRUST_PROXY', (value) => {
    expect(() => loadConfig({ TRUST_PROXY: value })).toThrow(ConfigError);
    expect(() => loadConfig({ TRUST_PROXY: value })).toThrow(
      /^TRUST_PROXY: must list the proxies' addresses/,
    );
  });
});

const sqlite = testEngines().find((engine) => engine.engine === 'sqlite') as ReturnType<
  typeof testEngines
>[0];

describe('rate limits behind a trusted reverse proxy', () => {
  let database: TestDatabase;
  let app: FastifyInstance | undefined;
  beforeAll(async () => {
    database = await sqlite.open();
  });
  afterEach(async () => {
    await app?.close();
    app = undefined;
  });
  afterAll(async () => {
    await database.cleanup();
  });

  /** A join through the proxy: the connection comes from `peer`, the header names `client`. */
  const join = (peer: string, client: string) =>
    (app as FastifyInstance).inject({
      method: 'POST',
      url: '/api/join',
      remoteAddress: peer,
      headers: { 'x-forwarded-for': client },
      payload: { code: 'NOPE-NOPE' },
    });

  it('keys the limit on the client the trusted proxy names', async () => {
    app = await buildTestApp(database, { env: { RATE_LIMIT_JOIN: '3', TRUST_PROXY: '127.0.0.1' } });
    // A proxy on the same machine: without TRUST_PROXY every client would be loopback and exempt.
    for (let i = 0; i < 3; i++) expect((await join('127.0.0.1', '203.0.113.5')).statusCode).toBe(404);
    const limited = await join('127.0.0.1', '203.0.113.5');
    expect(limited.statusCode).toBe(429);
    expect(limited.json().error.code).toBe('RATE_LIMITED');
    // Another client behind the same proxy has its own count.
    expect((await join('127.0.0.1', '198.51.100.20')).statusCode).toBe(404);
  });

  it('ignores the header from a peer that is not a trusted proxy', async () => {
    app = await buildTestApp(database, { env: { RATE_LIMIT_JOIN: '3', TRUST_PROXY: '127.0.0.1' } });
    // A client that is not the proxy cannot escape its limit by sending a new address each time.
    for (let i = 0; i < 3; i++) expect((await join('192.0.2.44', `203.0.113.${i}`)).statusCode).toBe(404);
    expect((await join('192.0.2.44', '203.0.113.99')).statusCode).toBe(429);
  });

  it('without TRUST_PROXY counts the connection: the loopback proxy stays exempt, the header ignored', async () => {
    app = await buildTestApp(database, { env: { RATE_LIMIT_JOIN: '3' } });
    for (let i = 0; i < 6; i++) expect((await join('127.0.0.1', '203.0.113.5')).statusCode).toBe(404);
    for (let i = 0; i < 3; i++) expect((await join('192.0.2.45', `203.0.113.${i}`)).statusCode).toBe(404);
    expect((await join('192.0.2.45', '203.0.113.77')).statusCode).toBe(429);
  });
});
