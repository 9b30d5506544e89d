import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { AppError } from '../errors.js';
import { checkDatabase } from '../storage/health.js';
import { errorBodySchema } from './schemas.js';

/**
 * `GET /health`: the process is alive (no database call).
 * `GET /ready`: the database answers and its schema is current.
 */
export const healthRoutes: FastifyPluginAsyncZod<{ engine: string }> = async (app, options) => {
  app.get(
    '/health',
    {
      schema: {
        summary: 'The process is alive',
        response: { 200: z.object({ status: z.literal('alive') }) },
      },
    },
    async () => ({ status: 'alive' as const }),
  );

  app.get(
    '/ready',
    {
      schema: {
        summary: 'The database is reachable and migrated',
        response: {
          200: z.object({ status: z.literal('ready'), engine: z.string() }),
          503: errorBodySchema,
        },
      },
    },
    async (request) => {
      const state = await checkDatabase(request.server.db);
      if (state.reachable === false) {
        throw new AppError('DATABASE_UNAVAILABLE', 'The database cannot be reached.', {
          reason: state.reason,
        });
      }
      if (state.pending.length > 0) {
        throw new AppError('MIGRATIONS_PENDING', 'The database needs migrating: run plotgauge migrate.', {
          pending: state.pending,
        });
      }
      return { status: 'ready' as const, engine: options.engine };
    },
  );
};
