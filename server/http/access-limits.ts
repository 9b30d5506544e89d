import rateLimit from '@fastify/rate-limit';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { AppError } from '../errors.js';

export interface AccessLimitsOptions {
  /** Joins per client address per minute; 0 turns the limit off. */
  joinPerMinute: number;
  /** Respondent requests (answers, consent, background, leave, state) per client address per minute; 0: off. */
  answersPerMinute: number;
}

/**
 * The defaults (RATE_LIMIT_JOIN=120, RATE_LIMIT_ANSWERS=1200, server/config.ts), per client address
 * and minute. A school group of about 60 sits behind one address (one router, one NAT): 60 joins in
 * the first minute, twice over for reloads and a second device, is 120; answering, 60 people each
 * sending at most one request every 3 seconds (an answer, its retry, the next state) is 1,200 a
 * minute. Counters live in memory only and are keyed by the address, which is neither stored nor
 * logged. Loopback is not limited: a reverse proxy on the same machine shows every client as
 * loopback (limiting it would limit everyone together), and the demo and load tests run there.
 */
export const loopbackAddresses = ['127.0.0.1', '::1', '::ffff:127.0.0.1'];

/** Which limit a route falls under, by method and url; undefined: none. */
function limitOf(method: string, url: string, options: AccessLimitsOptions): number | undefined {
  if (method === 'POST' && url === '/api/join') return options.joinPerMinute;
  if (url === '/api/attempt' || url.startsWith('/api/attempt/')) return options.answersPerMinute;
  return undefined;
}

/**
 * Rate limits on the routes anyone can reach with a join code: @fastify/rate-limit, applied by route
 * url (also to respondent routes added later under /api/attempt/), answering 429 RATE_LIMITED with
 * Retry-After.
 */
export const accessLimits = fp<AccessLimitsOptions>(
  async (app: FastifyInstance, options: AccessLimitsOptions) => {
    // Runs before the rate-limit plugin's own onRoute hook, so it sees the limit set here.
    app.addHook('onRoute', (route) => {
      const methods = Array.isArray(route.method) ? route.method : [route.method];
      const max = methods.map((m) => limitOf(String(m), route.url, options)).find((m) => m !== undefined);
      if (max === undefined || max === 0 || route.config?.rateLimit !== undefined) return;
      route.config = { ...route.config, rateLimit: { max, timeWindow: 60_000 } };
    });
    await app.register(rateLimit, {
      global: false,
      allowList: loopbackAddresses,
      errorResponseBuilder: (_request, context) =>
        new AppError('RATE_LIMITED', `Too many requests; try again in ${context.after}.`, {
          retryAfterSeconds: Math.ceil(context.ttl / 1000),
        }),
    });
  },
  { name: 'plotgauge-rate-limits', fastify: '5.x' },
);
