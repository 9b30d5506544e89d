import type { FastifyInstance } from 'fastify';
import { z } from 'zod';
import { bankChartRenderer } from '../bank/bank-chart-renderer.js';
import type { ChartRenderer } from '../bank/chart-renderer.js';
import { taskLevels } from '../bank/item-schema.js';
import type { ItemBank } from '../bank/load-bank.js';
import { chartTypes } from '../charts/chart-spec.js';
import { galleryCss, renderBankGallery } from '../pages/bank-gallery.js';
import { accessControl } from './access-control.js';
import { errorBodySchema } from './schemas.js';

export interface BankRoutesOptions {
  readonly bank: ItemBank;
  /**
   * The gallery shows every key and rationale, so it is for the team only (analyst or admin; see
   * server/http/access-policy.ts). Inside the app the app's access check covers it; registered on its
   * own (tests), the plugin adds that check itself with this ADMIN_TOKEN.
   */
  readonly adminToken?: string | undefined;
  /** Draws one chart; default the chart layer's renderChart with the bank's maps bound. */
  readonly render?: ChartRenderer;
}

/** An empty select ("all") sends `type=`: treat it as absent. */
const blankAsAbsent = (value: unknown): unknown => (value === '' ? undefined : value);

/** Query string of `GET /bank`. */
export const galleryQuerySchema = z.object({
  type: z.preprocess(blankAsAbsent, z.enum(chartTypes).optional()),
  level: z.preprocess(blankAsAbsent, z.enum(taskLevels).optional()),
  scenario: z.preprocess(
    blankAsAbsent,
    z
      .string()
      .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/)
      .optional(),
  ),
});

const svgPath = /^(.+)\.svg$/;

/**
 * The item gallery for the team:
 * - `GET /bank`: every item as a respondent sees it, with key, rationale and features; filter by
 *   `type`, `level` and `scenario` in the query string (400 VALIDATION_FAILED for unknown values);
 * - `GET /bank/:id.svg`: one item's chart (404 ITEM_NOT_FOUND for an unknown id);
 * - `GET /bank/gallery.css`: the gallery's stylesheet.
 * Errors are answered here as `{ error: { code, message, details } }`, so the plugin works on a bare
 * fastify instance as well as inside the app.
 */
export async function bankRoutes(app: FastifyInstance, options: BankRoutesOptions): Promise<void> {
  const { bank } = options;
  const render = options.render ?? bankChartRenderer(bank.maps);
  if (!app.hasPlugin('plotgauge-access-control')) {
    await app.register(accessControl, { adminToken: options.adminToken });
  }
  const textAnswer = {
    200: z.string(),
    303: z.null(),
    400: errorBodySchema,
    401: errorBodySchema,
    404: errorBodySchema,
  };

  app.get('/bank', { schema: { hide: true, response: textAnswer } }, async (request, reply) => {
    const parsed = galleryQuerySchema.safeParse(request.query);
    if (!parsed.success) {
      return reply.code(400).send({
        error: {
          code: 'VALIDATION_FAILED',
          message: 'the gallery filters are not valid',
          details: {
            issues: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
          },
        },
      });
    }
    return reply.type('text/html; charset=utf-8').send(renderBankGallery(bank, parsed.data, render));
  });

  app.get(
    '/bank/gallery.css',
    { schema: { hide: true, response: { 200: z.string() } } },
    async (_request, reply) => reply.type('text/css; charset=utf-8').send(galleryCss),
  );

  app.get<{ Params: { file: string } }>(
    '/bank/:file',
    { schema: { hide: true, response: textAnswer } },
    async (request, reply) => {
      const match = svgPath.exec(request.params.file);
      const id = match?.[1] ?? request.params.file;
      const item = match === null ? undefined : bank.byId.get(id);
      if (item === undefined) {
        return reply.code(404).send({
          error: { code: 'ITEM_NOT_FOUND', message: `no item "${id}" in the bank`, details: { itemId: id } },
        });
      }
      const svg = render(item.chart, { alt: item.alt, idPrefix: `item-${item.id}-` });
      return reply.type('image/svg+xml; charset=utf-8').send(svg);
    },
  );
}
