import swagger from '@fastify/swagger';
import Fastify, { type FastifyInstance, type FastifyServerOptions } from 'fastify';
import fp from 'fastify-plugin';
import { jsonSchemaTransform, serializerCompiler, validatorCompiler } from 'fastify-type-provider-zod';
import type { Kysely } from 'kysely';
import type { ItemBank } from './bank/load-bank.js';
import type { Config } from './config.js';
import { deliveryBankFrom, type ItemViewRenderer } from './delivery/bank-adapter.js';
import { bankChartRenderer, respondentItemViews } from './delivery/item-view.js';
import { accessControl } from './http/access-control.js';
import { accessHeaders } from './http/access-headers.js';
import { accessLimits } from './http/access-limits.js';
import { adminRoutes } from './http/admin-routes.js';
import { bankRoutes } from './http/bank-routes.js';
import { consoleBankRoutes } from './http/console-bank-routes.js';
import { cookieWriteGuard } from './http/console-csrf.js';
import { consoleRoutes } from './http/console-routes.js';
import { consoleScoringRoutes } from './http/console-scoring-routes.js';
import { registerErrorHandlers } from './http/error-handler.js';
import { exposureControlRoutes } from './http/exposure-control-routes.js';
import { healthRoutes } from './http/health-routes.js';
import { openapiRoutes } from './http/openapi-routes.js';
import { pageRoutes } from './http/page-routes.js';
import { pilotRoutes } from './http/pilot-routes.js';
import { predictRoutes } from './http/predict-routes.js';
import { reportRoutes } from './http/report-routes.js';
import { respondentRoutes } from './http/respondent-routes.js';
import { rubricScoringRoutes } from './http/rubric-scoring-routes.js';
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
  /**
   * The loaded, validated item bank (server/bank/load-bank.ts). `plotgauge serve` always passes it;
   * only tests that deliver nothing leave it out (then the bank is empty and no study can be created).
   */
  bank?: ItemBank;
  /** How a respondent sees one item; defaults to the bank's respondent view. */
  itemView?: ItemViewRenderer;
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

/** A bank with no items (tests that deliver nothing; a server always loads the real one). */
const emptyBank: ItemBank = { items: [], byId: new Map(), scenarios: [], maps: new Map() };

export const appPlugin = fp<AppPluginOptions>(
  async (app: FastifyInstance, { config, db, bank = emptyBank, itemView }: AppPluginOptions) => {
    app.setValidatorCompiler(validatorCompiler);
    app.setSerializerCompiler(serializerCompiler);
    app.decorate('db', db);
    registerErrorHandlers(app);
    // Headers first (refusals carry them too), then the one access check: both cover every route.
    await app.register(accessHeaders);
    await app.register(accessControl, { adminToken: config.adminToken, db });
    await app.register(cookieWriteGuard); // console cookie + change outside /console: CSRF header needed
    await app.register(accessLimits, {
      joinPerMinute: config.rateLimitJoin,
      answersPerMinute: config.rateLimitAnswers,
    });

    await app.register(swagger, {
      openapi: {
        info: { title: 'plotgauge', version: '0.1.0', description: 'Chart-reading assessment server' },
      },
      transform: jsonSchemaTransform,
    });

    await app.register(healthRoutes, { engine: engineOf(config.databaseUrl) });
    await app.register(openapiRoutes);
    const render = bankChartRenderer(bank);
    const deliveryBank = deliveryBankFrom(bank, itemView ?? respondentItemViews(render));
    await app.register(respondentRoutes, { bank: deliveryBank });
    await app.register(adminRoutes, { bank: deliveryBank, config });
    await app.register(bankRoutes, { bank, render });
    await app.register(pageRoutes);
    await app.register(reportRoutes, { bank: deliveryBank, config });
    await app.register(pilotRoutes, { bank });
    await app.register(predictRoutes, { bank });
    await app.register(exposureControlRoutes, { bank: deliveryBank });
    await app.register(consoleRoutes, { bank: deliveryBank, itemBank: bank, config });
    await app.register(consoleBankRoutes, { bank, deliveryBank, render });
    await app.register(rubricScoringRoutes, { bank });
    await app.register(consoleScoringRoutes, { bank });
  },
  { name: 'plotgauge', fastify: '5.x' },
);

/** Options of the fastify instance itself: logger, body limit, closing behaviour. */
export function serverOptions(
  logger: AppDependencies['logger'] = false,
  trustProxy?: Config['trustProxy'],
): FastifyServerOptions {
  return {
    logger:
      logger === false
        ? false
        : { ...(typeof logger === 'object' ? logger : {}), serializers: requestLogSerializers },
    bodyLimit: defaultBodyLimit,
    return503OnClosing: true,
    // TRUST_PROXY (server/config.ts): request.ip, and so the rate limits, follow X-Forwarded-For
    // only from these proxies; unset, the connection's own address counts.
    ...(trustProxy === undefined ? {} : { trustProxy }),
  };
}

/**
 * Builds the fastify app from configuration and a database handle. It never listens:
 * `server/main.ts` does that, tests inject requests or hand `app.server` to supertest.
 */
export async function buildApp({
  logger = false,
  ...dependencies
}: AppDependencies): Promise<FastifyInstance> {
  const app = Fastify(serverOptions(logger, dependencies.config.trustProxy));
  await app.register(appPlugin, dependencies);
  return app;
}
