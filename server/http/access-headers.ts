import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import helmet from 'helmet';

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
 * Security headers on every answer, pages and JSON alike, by one mechanism: helmet's middleware with
 * the strict policy above and `Referrer-Policy: no-referrer` (join codes sit in page URLs), built
 * ONCE at start-up and run in an `onRequest` hook. (The fastify wrapper of helmet builds the
 * middleware again on every request, which re-parses the policy: about 6% of the server's CPU per
 * answer under load, measured with `scripts/bench/load.ts`.) A route that replies with a policy of
 * its own sets the header in its handler, which replaces this one.
 */
export const accessHeaders = fp(
  async (app: FastifyInstance) => {
    const setHeaders = helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: Object.fromEntries(Object.entries(cspDirectives).map(([k, v]) => [k, [...v]])),
      },
      referrerPolicy: { policy: 'no-referrer' },
    });
    app.addHook('onRequest', (request, reply, done) => {
      setHeaders(request.raw, reply.raw, (error?: unknown) => done(error as Error | undefined));
    });
  },
  { name: 'plotgauge-security-headers', fastify: '5.x' },
);
