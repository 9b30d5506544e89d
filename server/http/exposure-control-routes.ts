import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { DeliveryBank } from '../delivery/delivery-bank.js';
import {
  exposureOutcomes,
  studyExposureControls,
  tuneStudyExposureControl,
} from '../delivery/exposure-control-service.js';
import { actorOf } from './access-control.js';
import { studyParams, teamRouteErrors } from './schemas.js';

/** Optional tuning choices; no body (null) or absent fields = seed 1, target 0.3 (as `plotgauge simulate adaptive`). */
const tuneBodySchema = z
  .strictObject({
    seed: z.number().int().min(0).max(0xffffffff).optional(),
    /** Largest share of attempts that may see one item, in (0, 1]. */
    target: z.number().gt(0, 'must be greater than 0').max(1, 'must be at most 1').optional(),
  })
  .nullish();

const controlSchema = z.object({
  id: z.string(),
  studyId: z.string(),
  calibrationId: z.string(),
  settings: z.record(z.string(), z.unknown()),
  settingsHash: z.string(),
  itemParameters: z.record(z.string(), z.number()),
  targetMaxExposure: z.number(),
  achievedMaxExposure: z.number(),
  simulation: z.record(z.string(), z.unknown()),
  createdAt: z.string(),
  createdBy: z.string(),
});

const errors = teamRouteErrors;

/**
 * Sympson–Hetter exposure control of live adaptive attempts (server/delivery/exposure-control-service.ts):
 * `POST /api/admin/studies/:studyId/exposure-control` (admin) tunes K per item by simulation on the
 * study's latest converged calibration and settings, within a fixed budget, and stores it for new
 * attempts; `GET` (analyst) lists the stored controls and which one new attempts use.
 */
export const exposureControlRoutes: FastifyPluginAsyncZod<{ bank: DeliveryBank }> = async (app, { bank }) => {
  const db = app.db;

  app.post(
    '/api/admin/studies/:studyId/exposure-control',
    {
      schema: {
        summary:
          "Tune Sympson-Hetter exposure control on the study's latest converged calibration and store it for new adaptive attempts",
        tags: ['admin'],
        params: studyParams,
        body: tuneBodySchema,
        response: {
          201: controlSchema.extend({ outcome: z.enum(exposureOutcomes) }),
          ...errors,
        },
      },
    },
    async (request, reply) => {
      const body = request.body ?? {};
      const stored = await tuneStudyExposureControl(
        db,
        bank,
        request.params.studyId,
        { seed: body.seed ?? 1, target: body.target ?? 0.3 },
        actorOf(request),
      );
      return reply.code(201).send(stored);
    },
  );

  app.get(
    '/api/admin/studies/:studyId/exposure-control',
    {
      schema: {
        summary:
          'Stored exposure controls of the study, newest first, and the one new adaptive attempts start with',
        tags: ['admin'],
        params: studyParams,
        response: {
          200: z.object({ inUse: z.string().nullable(), controls: z.array(controlSchema) }),
          ...errors,
        },
      },
    },
    async (request) => studyExposureControls(db, request.params.studyId),
  );
};
