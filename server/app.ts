import swagger from '@fastify/swagger';
import Fastify, { type FastifyInstance, type FastifyServerOptions } from 'fastify';
import fp from 'fastify-plugin';
import { jsonSchemaTransform, serializerCompiler, validatorCompiler } from 'fastify-type-provider-zod';
import type { Kysely } from 'kysely';
import type { Config } from './config.js';
import { registerErrorHandlers } from './http/error-handler.js';
import { healthRoutes } from './http/health-routes.js';
import { openapiRoutes } from './http/openapi-routes.js';
import { engineOf } from './storage/create-database.js';
import type { Database } from './storage/database.js';

declare module 'fastify' {
  interface FastifyInstance {
    /** The database handle; owned by whoever built the app (main.ts or a test). */
    db: Kysely<Database>;
  }
}

export interface AppDependencies {
  config: Config;
  db: Kysely<Database>;
  /** Pino logger options, or false for none (tests). */
  logger?: FastifyServerOptions['logger'];
}

/** Largest request body accepted by default (answers and settings are small). */
export const defaultBodyLimit = 64 * 1024;

/**
 * Request log lines carry method, path and request id only: no query strings (they may hold
 * join codes), no bodies (answers), no headers (tokens), no client addresses.
 */
export const requestLogSerializers = {
  req(request: { method: string; url: string; id: string }) {
    return { id: request.id, method: request.method, path: request.url.split('?')[0] };
  },
};

/**
 * Everything the server is, as one plugin: compilers, decorators, error handlers, OpenAPI,
 * routes. `buildApp` registers it on a new instance; tests may register it on a bare instance
 * with their own hooks (for example `onRoute`, to inspect the route table).
 */
export type AppPluginOptions = Omit<AppDependencies, 'logger'>;

export const appPlugin = fp<AppPluginOptions>(
  async (app: FastifyInstance, { config, db }: AppPluginOptions) => {
    app.setValidatorCompiler(validatorCompiler);
    app.setSerializerCompiler(serializerCompiler);
    app.decorate('db', db);
    registerErrorHandlers(app);

    await app.register(swagger, {
      openapi: {
        info: { title: 'plotgauge', version: '0.1.0', description: 'Chart-reading assessment server' },
      },
      transform: jsonSchemaTransform,
    });

    await app.register(healthRoutes, { engine: engineOf(config.databaseUrl) });
    await app.register(openapiRoutes);
  },
  { name: 'plotgauge', fastify: '5.x' },
);

/** Options of the fastify instance itself: logger, body limit, closing behaviour. */
export function serverOptions(logger: AppDependencies['logger'] = false): FastifyServerOptions {
  return {
    logger:
      logger === false
        ? false
        : { ...(typeof logger === 'object' ? logger : {}), serializers: requestLogSerializers },
    bodyLimit: defaultBodyLimit,
    return503OnClosing: true,
  };
}

/**
 * Builds the fastify app from configuration and a database handle. It never listens:
 * `server/main.ts` does that, tests inject requests or hand `app.server` to supertest.
 */
export async function buildApp({ config, db, logger = false }: AppDependencies): Promise<FastifyInstance> {
  const app = Fastify(serverOptions(logger));
  await app.register(appPlugin, { config, db });
  return app;
}
