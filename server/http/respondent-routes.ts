import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import {
  answerBackground,
  currentState,
  giveConsent,
  joinByCode,
  leaveAttempt,
  loadAttempt,
} from '../delivery/attempt-service.js';
import type { DeliveryBank } from '../delivery/delivery-bank.js';
import { submitResponse } from '../delivery/response-service.js';
import { isUniqueViolation } from '../storage/db-handle.js';
import { writeQueueFor } from '../storage/write-batch.js';
import { bearerToken } from './auth.js';
import {
  attemptStateSchema,
  backgroundBodySchema,
  consentBodySchema,
  joinBodySchema,
  joinReplySchema,
  responseBodySchema,
  responseReplySchema,
} from './respondent-schemas.js';
import { errorBodySchema } from './schemas.js';

/** Respondent bodies are small: an answer's text is at most 2000 characters. */
export const respondentBodyLimit = 16 * 1024;

const errors = {
  400: errorBodySchema,
  401: errorBodySchema,
  404: errorBodySchema,
  409: errorBodySchema,
  410: errorBodySchema,
  413: errorBodySchema,
};

/**
 * The respondent API (see DEVELOPERS.md, "Delivery"). Every route that may write (the state read
 * too: it records when an item is first shown) runs as one unit of the database's write queue
 * (server/storage/write-batch.ts): on SQLite concurrent units share one commit (group commit), on
 * PostgreSQL each is its own transaction. Either way the reply is sent only after the commit.
 * Authentication: the attempt token as a bearer token.
 */
export const respondentRoutes: FastifyPluginAsyncZod<{ bank: DeliveryBank }> = async (app, { bank }) => {
  const writes = writeQueueFor(app.db);

  app.post(
    '/api/join',
    {
      bodyLimit: respondentBodyLimit,
      schema: {
        summary: 'Start an attempt with a join code',
        tags: ['respondent'],
        body: joinBodySchema,
        response: { 201: joinReplySchema, ...errors },
      },
    },
    async (request, reply) => {
      const { token, state } = await writes.run((trx) =>
        joinByCode(trx, bank, request.body.code, (warning) => request.log.warn(warning)),
      );
      return reply.code(201).send({ token, attempt: state });
    },
  );

  app.get(
    '/api/attempt',
    {
      schema: {
        summary: 'The attempt where it stands (resume after a reload)',
        tags: ['respondent'],
        response: { 200: attemptStateSchema, ...errors },
      },
    },
    async (request) =>
      writes.run(async (trx) => currentState(trx, bank, await loadAttempt(trx, bearerToken(request)))),
  );

  app.post(
    '/api/attempt/consent',
    {
      bodyLimit: respondentBodyLimit,
      schema: {
        summary: 'Agree to take part, or decline',
        tags: ['respondent'],
        body: consentBodySchema,
        response: { 200: attemptStateSchema, ...errors },
      },
    },
    async (request) =>
      writes.run(async (trx) =>
        giveConsent(trx, bank, await loadAttempt(trx, bearerToken(request)), request.body.agree),
      ),
  );

  app.post(
    '/api/attempt/background',
    {
      bodyLimit: respondentBodyLimit,
      schema: {
        summary: "Answer the study's background questions",
        tags: ['respondent'],
        body: backgroundBodySchema,
        response: { 200: attemptStateSchema, ...errors },
      },
    },
    async (request) =>
      writes.run(async (trx) =>
        answerBackground(trx, bank, await loadAttempt(trx, bearerToken(request)), request.body.answers),
      ),
  );

  app.post(
    '/api/attempt/responses',
    {
      bodyLimit: respondentBodyLimit,
      schema: {
        summary: 'Answer the current question (idempotent)',
        tags: ['respondent'],
        body: responseBodySchema,
        response: { 200: responseReplySchema, 201: responseReplySchema, ...errors },
      },
    },
    async (request, reply) => {
      const token = bearerToken(request);
      const attemptOnce = () =>
        writes.run(async (trx) => submitResponse(trx, bank, await loadAttempt(trx, token), request.body));
      let result: Awaited<ReturnType<typeof attemptOnce>>;
      try {
        result = await attemptOnce();
      } catch (error) {
        // Two copies of one answer raced (PostgreSQL: two instances); the loser now finds the
        // winner's row and compares.
        if (!isUniqueViolation(error)) throw error;
        result = await attemptOnce();
      }
      return reply
        .code(result.status === 'stored' ? 201 : 200)
        .send({ status: result.status, attempt: result.state });
    },
  );

  app.post(
    '/api/attempt/leave',
    {
      bodyLimit: respondentBodyLimit,
      schema: {
        summary: 'End the attempt here (kiosk start-over or idle reset)',
        tags: ['respondent'],
        response: { 200: attemptStateSchema, ...errors },
      },
    },
    async (request) =>
      writes.run(async (trx) =>
        leaveAttempt(trx, bank, await loadAttempt(trx, bearerToken(request), { allowEnded: true })),
      ),
  );
};
