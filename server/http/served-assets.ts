import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { FastifyInstance } from 'fastify';
import type { ZodTypeProvider } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { AppError } from '../errors.js';
import { errorBodySchema } from './schemas.js';

/** The folder of the pages' style sheets and scripts. */
export const pageAssetsFolder = path.join(
  path.dirname(fileURLToPath(import.meta.url)),
  '..',
  'pages',
  'assets',
);

/** One file served as is. */
export interface ServedAsset {
  type: string;
  body: string;
}

/** A `.css` or `.js` file of server/pages/assets/ by name, read once (at start-up), with its content type. */
export function readPageAssets(names: readonly string[]): Map<string, ServedAsset> {
  return new Map(
    names.map((name) => [
      name,
      {
        type: name.endsWith('.css') ? 'text/css; charset=utf-8' : 'text/javascript; charset=utf-8',
        body: readFileSync(path.join(pageAssetsFolder, name), 'utf8'),
      },
    ]),
  );
}

/**
 * `GET <url>` with a `:name` parameter: serves the named file of `assets` (cached, revalidated on each
 * use) and answers any other name 404 NOT_FOUND.
 */
export function serveAssets(
  app: FastifyInstance,
  url: `${string}/:name`,
  assets: ReadonlyMap<string, ServedAsset>,
  doc: { summary: string; tag: string },
): void {
  app.withTypeProvider<ZodTypeProvider>().get(
    url,
    {
      schema: {
        summary: doc.summary,
        tags: [doc.tag],
        params: z.object({ name: z.string().max(100) }),
        response: { 200: z.string(), 404: errorBodySchema },
      },
    },
    async (request, reply) => {
      const asset = assets.get(request.params.name);
      if (!asset) throw new AppError('NOT_FOUND', 'There is no such file.');
      return reply.header('cache-control', 'public, no-cache').type(asset.type).send(asset.body);
    },
  );
}
