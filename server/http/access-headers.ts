import helmet from '@fastify/helmet';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';

/**
 * The Content-Security-Policy of every answer: nothing from elsewhere, no inline script or style,
 * no framing, forms and fetches only to this server. Chart SVGs inline in a page use presentation
 * attributes (fill=...), which this policy allows; style="" attributes it would block. A route that
 * serves foreign content (e.g. a pilot image) may send a stricter policy of its own, which replaces
 * this one for that answer.
 */
export const cspDirectives: Readonly<Record<string, readonly string[]>> = {
  'default-src': ["'none'"],
  'script-src': ["'self'"],
  'style-src': ["'self'"],
  'img-src': ["'self'", 'data:'],
  'connect-src': ["'self'"],
  'form-action': ["'self'"],
  'frame-ancestors': ["'none'"],
  'base-uri': ["'none'"],
};

/** The policy as helmet writes it into the header (directives joined by ';'). */
export const contentSecurityPolicy = Object.entries(cspDirectives)
  .map(([name, values]) => `${name} ${values.join(' ')}`)
  .join(';');

/** The security headers every answer carries (helmet sends more: HSTS, COOP, CORP, ...). */
export const securityHeaders: Readonly<Record<string, string>> = {
  'content-security-policy': contentSecurityPolicy,
  'x-content-type-options': 'nosniff',
  'referrer-policy': 'no-referrer',
};

/**
 * Security headers on every answer, pages and JSON alike, by one mechanism: @fastify/helmet with the
 * strict policy above and `Referrer-Policy: no-referrer` (join codes sit in page URLs).
 */
export const accessHeaders = fp(
  async (app: FastifyInstance) => {
    await app.register(helmet, {
      global: true,
      contentSecurityPolicy: {
        useDefaults: false,
        directives: Object.fromEntries(Object.entries(cspDirectives).map(([k, v]) => [k, [...v]])),
      },
      referrerPolicy: { policy: 'no-referrer' },
    });
  },
  { name: 'plotgauge-security-headers', fastify: '5.x' },
);
