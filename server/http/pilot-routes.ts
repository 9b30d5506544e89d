import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { ItemBank } from '../bank/load-bank.js';
import { loadAttempt } from '../delivery/attempt-service.js';
import {
  addPilot,
  pilotImageHeaders,
  pilotInputSchema,
  pilotSummary,
  requirePilotOfStudy,
  retirePilot,
} from '../delivery/pilots/pilot-service.js';
import { requireStudy } from '../delivery/study-service.js';
import { findPilotById, listPilots } from '../storage/pilot-repository.js';
import { actorOf } from './access-control.js';
import { bearerToken } from './auth.js';
import { errorBodySchema, studyParams, teamRouteErrors } from './schemas.js';

/** A pilot body: base64 of at most 256 KiB, plus text. */
export const pilotBodyLimit = 400 * 1024;

const pilotSchema = z.object({
  id: z.string(),
  studyId: z.string(),
  prompt: z.string(),
  alt: z.string(),
  options: z.array(z.object({ id: z.string(), text: z.string() })),
  key: z.string(),
  mediaType: z.string(),
  bytes: z.number(),
  minResponses: z.number(),
  status: z.string(),
  createdAt: z.string(),
  sanitized: z.boolean().optional(),
});
const pilotParams = studyParams.extend({ pilotId: z.string().min(1).max(100) });
const errors = { ...teamRouteErrors, 413: errorBodySchema, 415: errorBodySchema };

/**
 * Pilot items (see DEVELOPERS.md, "Adaptive delivery and pilots"): admins add and list a study's
 * pilots (default admin access under /api/admin/), and preview the stored image; respondents fetch
 * a pilot image of their own attempt's study with the attempt token. Images are always sent with
 * their own content type, `Content-Security-Policy: default-src 'none'; style-src 'unsafe-inline'`
 * and `X-Content-Type-Options: nosniff`.
 */
export const pilotRoutes: FastifyPluginAsyncZod<{ bank?: Pick<ItemBank, 'maps'> }> = async (app, options) => {
  const db = app.db;
  const maps = options.bank?.maps ?? new Map();

  app.post(
    '/api/admin/studies/:studyId/pilots',
    {
      bodyLimit: pilotBodyLimit,
      schema: {
        summary:
          'Add a pilot chart (SVG or PNG as base64, or a chart spec in the bank format) with prompt, options and key',
        tags: ['admin'],
        params: studyParams,
        body: pilotInputSchema,
        response: { 201: pilotSchema, ...errors },
      },
    },
    async (request, reply) => {
      const pilot = await db
        .transaction()
        .execute((trx) => addPilot(trx, request.params.studyId, request.body, actorOf(request), { maps }));
      return reply.code(201).send(pilot);
    },
  );

  app.get(
    '/api/admin/studies/:studyId/pilots',
    {
      config: { access: 'analyst' },
      schema: {
        summary: "List a study's pilots",
        tags: ['admin'],
        params: studyParams,
        response: { 200: z.array(pilotSchema), ...errors },
      },
    },
    async (request) => {
      await requireStudy(db, request.params.studyId);
      return (await listPilots(db, request.params.studyId)).map(pilotSummary);
    },
  );

  app.post(
    '/api/admin/studies/:studyId/pilots/:pilotId/retire',
    {
      schema: {
        summary: 'Stop giving a pilot chart to new attempts (its answers and report stay)',
        tags: ['admin'],
        params: pilotParams,
        response: { 200: pilotSchema, ...errors },
      },
    },
    async (request) =>
      db
        .transaction()
        .execute((trx) => retirePilot(trx, request.params.studyId, request.params.pilotId, actorOf(request))),
  );

  app.get(
    '/api/admin/studies/:studyId/pilots/:pilotId/image',
    {
      config: { access: 'analyst' },
      schema: {
        summary: "A pilot's stored image",
        tags: ['admin'],
        params: pilotParams,
        // The image bytes (SVG or PNG) are sent as a Buffer, which fastify does not serialize.
        response: { 200: z.unknown(), ...errors },
      },
    },
    async (request, reply) => {
      const pilot = requirePilotOfStudy(
        await findPilotById(db, request.params.pilotId),
        request.params.studyId,
      );
      return reply.headers(pilotImageHeaders(pilot)).send(pilot.image);
    },
  );

  app.get(
    '/api/attempt/pilots/:pilotId/image',
    {
      config: { access: 'respondent' },
      schema: {
        summary: "A pilot image of the attempt's study (attempt token)",
        tags: ['respondent'],
        params: z.object({ pilotId: z.string().min(1).max(100) }),
        response: { 200: z.unknown(), ...errors },
      },
    },
    async (request, reply) => {
      const pilot = await db.transaction().execute(async (trx) => {
        const context = await loadAttempt(trx, bearerToken(request));
        return requirePilotOfStudy(await findPilotById(trx, request.params.pilotId), context.study.id);
      });
      return reply.headers(pilotImageHeaders(pilot)).send(pilot.image);
    },
  );
};
