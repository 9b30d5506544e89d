import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { DeliveryBank } from '../delivery/delivery-bank.js';
import {
  changeItemStatus,
  effectiveItemStatus,
  itemStatusChangeInputSchema,
} from '../delivery/item-status-service.js';
import { AppError } from '../errors.js';
import { listItemStatusChanges } from '../storage/item-status-repository.js';
import { actorOf } from './access-control.js';
import { teamRouteErrors } from './schemas.js';

const itemParams = z.object({ itemId: z.string().min(1).max(200) });
const changeSchema = z.object({
  id: z.string(),
  itemId: z.string(),
  itemVersion: z.number(),
  changeNumber: z.number(),
  status: z.enum(['retired', 'active']),
  reason: z.string(),
  actor: z.string(),
  changedAt: z.string(),
});
const errors = teamRouteErrors;

/**
 * Retire and reinstate bank items through the admin API (the console's bank pages call the same
 * service): `POST /api/admin/items/:itemId/retire` and `…/reinstate` with `{ reason }` (admin; 201
 * with the new log entry), and `GET /api/admin/items/:itemId/status` (analyst): the status delivery
 * applies now, the file's own status, and every change, oldest first.
 */
export const itemStatusRoutes: FastifyPluginAsyncZod<{ bank: DeliveryBank }> = async (app, { bank }) => {
  const db = app.db;

  for (const [action, to] of [
    ['retire', 'retired'],
    ['reinstate', 'active'],
  ] as const) {
    app.post(
      `/api/admin/items/:itemId/${action}`,
      {
        schema: {
          summary:
            to === 'retired'
              ? 'Retire an item: new attempts no longer get it; stored answers still count'
              : 'Reinstate a retired item: new attempts may get it again',
          tags: ['admin'],
          params: itemParams,
          body: itemStatusChangeInputSchema,
          response: { 201: changeSchema, ...errors },
        },
      },
      async (request, reply) => {
        const change = await db
          .transaction()
          .execute((trx) =>
            changeItemStatus(trx, bank, request.params.itemId, to, request.body, actorOf(request)),
          );
        return reply.code(201).send(change);
      },
    );
  }

  app.get(
    '/api/admin/items/:itemId/status',
    {
      config: { access: 'analyst' },
      schema: {
        summary: "An item's status now and its retire/reinstate history",
        tags: ['admin'],
        params: itemParams,
        response: {
          200: z.object({
            itemId: z.string(),
            status: z.enum(['active', 'retired', 'draft']),
            fileStatus: z.enum(['active', 'retired', 'draft']),
            changes: z.array(changeSchema),
          }),
          ...errors,
        },
      },
    },
    async (request) => {
      const { itemId } = request.params;
      const entry = bank.get(itemId);
      if (!entry) {
        throw new AppError('ITEM_NOT_FOUND', `No item "${itemId}" in the bank.`, { field: 'params.itemId' });
      }
      const changes = await listItemStatusChanges(db, itemId);
      return {
        itemId,
        status: effectiveItemStatus(entry.item.status, changes.at(-1)),
        fileStatus: entry.item.status,
        changes,
      };
    },
  );
};
