import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { Config } from '../config.js';
import type { DeliveryBank } from '../delivery/delivery-bank.js';
import { exportFormats, exportStudyResponses } from '../delivery/export-service.js';
import { joinQrSvg } from '../delivery/join-qr-svg.js';
import { publicBaseUrl } from '../delivery/public-url.js';
import {
  addCohort,
  changeStudy,
  createStudy,
  getCohort,
  getCohorts,
  getStudies,
  getStudy,
} from '../delivery/study-service.js';
import { studySettingsSchema } from '../delivery/study-settings.js';
import { AppError } from '../errors.js';
import { eraseAttempt } from '../storage/erasure-repository.js';
import { actorOf } from './access-control.js';
import { errorBodySchema, studyParams } from './schemas.js';

const studySchema = z.object({
  id: z.string(),
  title: z.string(),
  status: z.enum(['open', 'closed']),
  settings: studySettingsSchema,
  poolSize: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});

const cohortSchema = z.object({
  id: z.string(),
  studyId: z.string(),
  label: z.string(),
  joinCode: z.string(),
  joinUrl: z.string(),
  createdAt: z.string(),
});

const cohortParams = studyParams.extend({ cohortId: z.string().min(1).max(100) });
const errors = { 400: errorBodySchema, 401: errorBodySchema, 404: errorBodySchema, 409: errorBodySchema };

/**
 * The admin API: studies, cohorts with join codes and QR codes, exports. Who may call what is
 * decided by the access check (server/http/access-policy.ts); every change is written to the audit
 * log with the token's label as actor.
 */
export const adminRoutes: FastifyPluginAsyncZod<{ bank: DeliveryBank; config: Config }> = async (
  app,
  { bank, config },
) => {
  const db = app.db;
  const baseUrl = publicBaseUrl(config);

  app.post(
    '/api/admin/studies',
    {
      schema: {
        summary: 'Create a study',
        tags: ['admin'],
        body: studySettingsSchema,
        response: { 201: studySchema, ...errors },
      },
    },
    async (request, reply) => {
      const study = await db
        .transaction()
        .execute((trx) => createStudy(trx, bank, request.body, actorOf(request)));
      return reply.code(201).send(study);
    },
  );

  app.get(
    '/api/admin/studies',
    {
      schema: {
        summary: 'List studies',
        tags: ['admin'],
        response: { 200: z.array(studySchema), ...errors },
      },
    },
    async () => getStudies(db, bank),
  );

  app.get(
    '/api/admin/studies/:studyId',
    {
      schema: {
        summary: 'One study with its cohorts',
        tags: ['admin'],
        params: studyParams,
        response: { 200: studySchema.extend({ cohorts: z.array(cohortSchema) }), ...errors },
      },
    },
    async (request) => ({
      ...(await getStudy(db, bank, request.params.studyId)),
      cohorts: await getCohorts(db, request.params.studyId, baseUrl),
    }),
  );

  app.patch(
    '/api/admin/studies/:studyId',
    {
      schema: {
        summary: 'Change title, status (open/closed) or settings',
        tags: ['admin'],
        params: studyParams,
        body: z
          .strictObject({
            title: z.string().trim().min(1).max(200).optional(),
            status: z.enum(['open', 'closed']).optional(),
            settings: studySettingsSchema.optional(),
          })
          .refine((b) => Object.values(b).some((v) => v !== undefined), {
            message: 'change at least one field',
          }),
        response: { 200: studySchema, ...errors },
      },
    },
    async (request) =>
      db
        .transaction()
        .execute((trx) => changeStudy(trx, bank, request.params.studyId, request.body, actorOf(request))),
  );

  app.post(
    '/api/admin/studies/:studyId/cohorts',
    {
      schema: {
        summary: 'Add a cohort with its own join code',
        tags: ['admin'],
        params: studyParams,
        body: z.strictObject({ label: z.string().trim().min(1).max(100) }),
        response: { 201: cohortSchema, ...errors },
      },
    },
    async (request, reply) => {
      const cohort = await db
        .transaction()
        .execute((trx) =>
          addCohort(trx, request.params.studyId, request.body.label, actorOf(request), baseUrl),
        );
      return reply.code(201).send(cohort);
    },
  );

  app.get(
    '/api/admin/studies/:studyId/cohorts',
    {
      schema: {
        summary: "A study's cohorts",
        tags: ['admin'],
        params: studyParams,
        response: { 200: z.array(cohortSchema), ...errors },
      },
    },
    async (request) => getCohorts(db, request.params.studyId, baseUrl),
  );

  app.get(
    '/api/admin/studies/:studyId/cohorts/:cohortId/qr.svg',
    { schema: { summary: "QR code of a cohort's join link (SVG)", tags: ['admin'], params: cohortParams } },
    async (request, reply) => {
      const cohort = await getCohort(db, request.params.studyId, request.params.cohortId, baseUrl);
      return reply.type('image/svg+xml; charset=utf-8').send(await joinQrSvg(cohort.joinUrl));
    },
  );

  app.get(
    '/api/admin/studies/:studyId/export',
    {
      schema: {
        summary: 'Responses as CSV: long (one row per response) or wide (attempt × item, 1/0/blank)',
        tags: ['admin'],
        params: studyParams,
        querystring: z.strictObject({
          format: z.enum(exportFormats).default('long'),
          cohort: z.string().min(1).max(100).optional(),
        }),
        response: { 200: z.string(), ...errors },
      },
    },
    async (request, reply) => {
      const csv = await exportStudyResponses(db, request.params.studyId, {
        format: request.query.format,
        cohortId: request.query.cohort,
      });
      return reply
        .type('text/csv; charset=utf-8')
        .header('content-disposition', `attachment; filename="responses-${request.query.format}.csv"`)
        .serializer((payload: unknown) => payload as string)
        .send(csv);
    },
  );

  app.delete(
    '/api/admin/attempts/:attemptId',
    {
      schema: {
        summary: "Erase one person's attempt and answers; the audit log records that it happened",
        tags: ['admin'],
        params: z.object({ attemptId: z.string().min(1).max(100) }),
        response: { 200: z.object({ attemptId: z.string(), responses: z.number().int() }), ...errors },
      },
    },
    async (request) => {
      const erased = await db
        .transaction()
        .execute((trx) => eraseAttempt(trx, request.params.attemptId, actorOf(request)));
      if (erased === undefined) throw new AppError('ATTEMPT_NOT_FOUND', 'There is no attempt with this id.');
      return erased;
    },
  );
};
