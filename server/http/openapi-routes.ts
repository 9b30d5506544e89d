import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';

/** `GET /api/openapi.json`: the OpenAPI 3 document generated from the routes' zod schemas. */
export const openapiRoutes: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/api/openapi.json',
    {
      schema: {
        summary: 'OpenAPI document of this server',
        hide: true,
        response: { 200: z.record(z.string(), z.unknown()) },
      },
    },
    async () => app.swagger() as unknown as Record<string, unknown>,
  );
};
