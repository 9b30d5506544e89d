import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { ItemBank } from '../bank/load-bank.js';
import { checkPlannedChart, designCheckItems } from '../reports/design-check-service.js';
import { plannedChartSchema } from '../reports/design-features.js';
import { errorBodySchema, studyParams } from './schemas.js';

const pair = z.tuple([z.number(), z.number()]);

/** The design check's answer (server/reports/design-check.ts, `DesignCheck`). */
const designCheckSchema = z.object({
  basis: z.literal('model-based'),
  statement: z.string(),
  calibrationId: z.string(),
  planned: plannedChartSchema,
  model: z.object({
    method: z.string(),
    referenceChartType: z.string(),
    referenceLevel: z.string(),
    items: z.number(),
    persons: z.number(),
    converged: z.boolean(),
    weights: z.array(
      z.object({ feature: z.string(), field: z.string(), weight: z.number(), standardError: z.number() }),
    ),
    likelihoodRatio: z.object({
      statistic: z.number(),
      degreesOfFreedom: z.number(),
      pValue: z.number().nullable(),
      reading: z.string(),
    }),
    residualVariance: z.number(),
  }),
  prediction: z.object({
    difficulty: z.number(),
    standardError: z.number(),
    predictionStandardError: z.number(),
    level: z.number(),
    predictionInterval: pair,
    rpLocation: z.number(),
  }),
  scale: z.object({ shift: z.number(), note: z.string() }),
  shares: z.array(z.object({ cohortId: z.string(), label: z.string(), share: z.number(), interval: pair })),
  shareMethod: z.string(),
});

/**
 * The design check (see DEVELOPERS.md, "Fairness, predictions and rubric scoring"): the predicted
 * difficulty of a planned chart from its design features under the LLTM fitted to a study's answers,
 * with a prediction interval and each cohort's share likely to read it. It changes nothing (it reads
 * the latest calibration and never makes one), so analysts may call it.
 */
export const predictRoutes: FastifyPluginAsyncZod<{ bank: ItemBank }> = async (app, { bank }) => {
  const itemOf = designCheckItems(bank);
  app.post(
    '/api/admin/studies/:studyId/predict',
    {
      schema: {
        summary:
          "Predicted difficulty of a planned chart from its design features (LLTM on the study's answers): model-based, not measured",
        tags: ['reports'],
        params: studyParams,
        body: plannedChartSchema,
        response: {
          200: designCheckSchema,
          400: errorBodySchema,
          401: errorBodySchema,
          403: errorBodySchema,
          404: errorBodySchema,
          409: errorBodySchema,
          422: errorBodySchema,
        },
      },
    },
    // The check's readonly arrays are what the schema describes; the cast only drops `readonly`.
    async (request) =>
      (await checkPlannedChart(app.db, itemOf, request.params.studyId, request.body)) as unknown as z.infer<
        typeof designCheckSchema
      >,
  );
};
