import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { FastifyReply } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { normaliseJoinCode } from '../delivery/join-code.js';
import { AppError } from '../errors.js';
import { renderRespondentPage } from '../pages/respondent-page.js';
import { renderStartPage } from '../pages/start-page.js';
import { en, type Strings } from '../pages/strings/en.js';
import { accessHeaders } from './access-headers.js';
import { errorBodySchema } from './schemas.js';

/** The policy and headers of every page, sent by one mechanism (server/http/access-headers.ts). */
export { contentSecurityPolicy, securityHeaders } from './access-headers.js';

/** One static file, read once at start-up. */
interface Asset {
  readonly body: string;
  readonly contentType: string;
  readonly etag: string;
}

/** The files under /assets/ and their content types. Anything else there is not served. */
export const assetFiles: Readonly<Record<string, string>> = {
  'respondent.js': 'text/javascript; charset=utf-8',
  'retry.js': 'text/javascript; charset=utf-8',
  'respondent.css': 'text/css; charset=utf-8',
};

const assetsFolder = path.join(path.dirname(fileURLToPath(import.meta.url)), '..', 'pages', 'assets');

function loadAssets(folder: string): Map<string, Asset> {
  const assets = new Map<string, Asset>();
  for (const [name, contentType] of Object.entries(assetFiles)) {
    const body = readFileSync(path.join(folder, name), 'utf8');
    const etag = `"${createHash('sha256').update(body).digest('base64url').slice(0, 22)}"`;
    assets.set(name, { body, contentType, etag });
  }
  return assets;
}

export interface PageRoutesOptions {
  /** Strings of the pages (default English). */
  strings?: Strings;
  /** Folder the assets are read from (default server/pages/assets). */
  assetsFolder?: string;
}

const htmlSchema = z.string().describe('An HTML page');
const joinParamsSchema = z.object({ code: z.string().max(64) });
const joinQuerySchema = z.object({ code: z.string().max(64).optional() });

function sendPage(reply: FastifyReply, status: number, page: string) {
  return reply.code(status).header('cache-control', 'no-store').type('text/html; charset=utf-8').send(page);
}

/**
 * The respondent's pages: `GET /` (type a join code), `GET /join?code=` (the form's target,
 * redirects to the canonical link), `GET /join/:code` (the page that walks through an attempt with
 * the JSON API) and the static files under `/assets/`. Every answer carries a strict
 * Content-Security-Policy, `nosniff` and `no-referrer`.
 */
export const pageRoutes: FastifyPluginAsyncZod<PageRoutesOptions> = async (app, options) => {
  const strings = options.strings ?? en;
  const assets = loadAssets(options.assetsFolder ?? assetsFolder);

  // Inside the app the app's security headers cover these pages; on its own (tests) it adds them.
  if (!app.hasPlugin('plotgauge-security-headers')) await app.register(accessHeaders);

  app.get(
    '/',
    { schema: { summary: 'Start page: type a join code', response: { 200: htmlSchema } } },
    async (_request, reply) => sendPage(reply, 200, renderStartPage(strings, {})),
  );

  app.get(
    '/join',
    {
      schema: {
        summary: 'Target of the start form: redirects to /join/:code',
        querystring: joinQuerySchema,
        response: { 303: z.null(), 404: htmlSchema },
      },
    },
    async (request, reply) => {
      const typed = request.query.code ?? '';
      const code = normaliseJoinCode(typed);
      if (code === undefined) {
        return sendPage(reply, 404, renderStartPage(strings, { typed, error: strings.codeNotFound }));
      }
      return reply.code(303).header('cache-control', 'no-store').redirect(`/join/${code}`, 303);
    },
  );

  app.get(
    '/join/:code',
    {
      schema: {
        summary: 'The respondent page for one join code',
        params: joinParamsSchema,
        response: { 200: htmlSchema, 404: htmlSchema },
      },
    },
    async (request, reply) => {
      const code = normaliseJoinCode(request.params.code);
      if (code === undefined) {
        return sendPage(
          reply,
          404,
          renderStartPage(strings, { typed: request.params.code, error: strings.codeNotFound }),
        );
      }
      return sendPage(reply, 200, renderRespondentPage(strings, { joinCode: code }));
    },
  );

  app.get(
    '/assets/:name',
    {
      schema: {
        summary: 'Static files of the respondent page (CSS, JavaScript)',
        params: z.object({ name: z.string().max(100) }),
        response: { 200: z.string(), 304: z.null(), 404: errorBodySchema },
      },
    },
    async (request, reply) => {
      const asset = assets.get(request.params.name);
      if (asset === undefined) throw new AppError('NOT_FOUND', 'There is no such file.');
      reply.header('etag', asset.etag).header('cache-control', 'public, no-cache');
      if (request.headers['if-none-match'] === asset.etag) return reply.code(304).send(null);
      return reply.type(asset.contentType).send(asset.body);
    },
  );
};
