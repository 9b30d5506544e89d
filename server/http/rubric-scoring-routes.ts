import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { ItemBank } from '../bank/load-bank.js';
import { scoreRubricAnswer, scoringQueue } from '../delivery/rubric-scoring-service.js';
import { actorOf } from './access-control.js';
import { errorBodySchema } from './schemas.js';

const errors = { 400: errorBodySchema, 401: errorBodySchema, 404: errorBodySchema, 409: errorBodySchema };

/** A rubric score: one of the rubric's levels. */
export const rubricScoreSchema = z.union([z.literal(0), z.literal(1), z.literal(2)], {
  error: 'score must be 0, 1 or 2 (a level of the rubric)',
});

const queueEntrySchema = z.object({
  entryId: z.string(),
  itemId: z.string(),
  prompt: z.string(),
  rubric: z.array(z.object({ score: z.number().int(), description: z.string() })),
  text: z.string(),
  scoresGiven: z.number().int(),
  scoresNeeded: z.number().int(),
});

const queueSchema = z.object({
  studyId: z.string(),
  rater: z.string(),
  scoresNeeded: z.number().int(),
  remaining: z.number().int(),
  entries: z.array(queueEntrySchema),
});

const scoreResultSchema = z.object({
  entryId: z.string(),
  score: z.number().int(),
  scoresGiven: z.number().int(),
  scoresNeeded: z.number().int(),
  finalScore: z.number().int().nullable(),
});

/**
 * The rubric scoring queue of the admin API. Admin only (the access policy's default): scoring
 * changes what calibration reads. The rater is the token's label (`actorOf`), so one person's token
 * gives one rater; two raters need two tokens.
 */
export const rubricScoringRoutes: FastifyPluginAsyncZod<{ bank: ItemBank }> = async (app, { bank }) => {
  const db = app.db;

  app.get(
    '/api/admin/studies/:studyId/scoring-queue',
    {
      schema: {
        summary: 'Short-text answers waiting for a rubric score from this rater (oldest first)',
        tags: ['admin'],
        params: z.object({ studyId: z.string().min(1).max(100) }),
        querystring: z.strictObject({ limit: z.coerce.number().int().min(1).max(50).default(10) }),
        response: { 200: queueSchema, ...errors },
      },
    },
    async (request) => scoringQueue(db, bank, request.params.studyId, actorOf(request), request.query.limit),
  );

  app.post(
    '/api/admin/scoring-queue/:entryId/scores',
    {
      schema: {
        summary: "Score one answer against its item's rubric (0, 1 or 2)",
        tags: ['admin'],
        params: z.object({ entryId: z.string().min(1).max(100) }),
        body: z.strictObject({ score: rubricScoreSchema }),
        response: { 201: scoreResultSchema, ...errors },
      },
    },
    async (request, reply) => {
      const result = await db
        .transaction()
        .execute((trx) =>
          scoreRubricAnswer(trx, request.params.entryId, actorOf(request), request.body.score),
        );
      return reply.code(201).send(result);
    },
  );
};
