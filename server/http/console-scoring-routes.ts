import type { FastifyReply, FastifyRequest } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { bankChartRenderer } from '../bank/bank-chart-renderer.js';
import type { ItemBank } from '../bank/load-bank.js';
import { scoreRubricAnswer, scoringQueue } from '../delivery/rubric-scoring-service.js';
import { AppError } from '../errors.js';
import { renderConsolePage } from '../pages/console/console-layout.js';
import { scoringQueueMain } from '../pages/console/scoring-queue-page.js';
import { listStudies } from '../storage/study-repository.js';
import { actorOf } from './access-control.js';
import { assertCsrf, csrfTokenFor } from './console-csrf.js';
import { errorBodySchema } from './schemas.js';

const errors = { 401: errorBodySchema, 403: errorBodySchema, 404: errorBodySchema };
const formBody = z.record(
  z.string().max(100),
  z.union([z.string().max(2000), z.array(z.string().max(200)).max(10)]),
);

function sendHtml(reply: FastifyReply, status: number, page: string) {
  return reply.code(status).header('cache-control', 'no-store').type('text/html; charset=utf-8').send(page);
}

function first(value: string | string[] | undefined): string {
  return (Array.isArray(value) ? value[0] : value) ?? '';
}

/**
 * The console's scoring queue: `GET /console/scoring?study=…` shows one answer at a time with its
 * rubric, and `POST /console/scoring/:entryId` stores this rater's score through the same service as
 * `POST /api/admin/scoring-queue/:entryId/scores` (CSRF-checked form; 303 back to the queue).
 * Admin only, like the API.
 */
export const consoleScoringRoutes: FastifyPluginAsyncZod<{ bank: ItemBank }> = async (app, { bank }) => {
  const db = app.db;
  const render = bankChartRenderer(bank.maps);
  /** The chart of an item as the respondent saw it (the bank's current version), once per item id. */
  const charts = new Map<string, string>();
  const chartOf = (itemId: string): string | undefined => {
    const item = bank.byId.get(itemId);
    if (item === undefined) return undefined;
    let svg = charts.get(itemId);
    if (svg === undefined) {
      svg = render(item.chart, { alt: item.alt, idPrefix: 'scoring-chart' });
      charts.set(itemId, svg);
    }
    return svg;
  };
  if (!app.hasContentTypeParser('application/x-www-form-urlencoded')) {
    app.addContentTypeParser(
      'application/x-www-form-urlencoded',
      { parseAs: 'string' },
      (_request, body, done) => done(null, Object.fromEntries(new URLSearchParams(body as string))),
    );
  }

  const page = async (
    request: FastifyRequest,
    studyId: string | undefined,
    extra: { notice?: string; problem?: string } = {},
  ) => {
    const principal = request.principal;
    if (principal === undefined) throw new AppError('UNAUTHORIZED', 'Sign in at /sign-in.');
    const studies = (await listStudies(db)).map((s) => ({ id: s.id, title: s.title }));
    const study = studyId === undefined ? undefined : studies.find((s) => s.id === studyId);
    if (studyId !== undefined && study === undefined)
      throw new AppError('STUDY_NOT_FOUND', `No study with id ${studyId}.`, { field: 'query.study' });
    const queue = study ? await scoringQueue(db, bank, study.id, actorOf(request), 1) : undefined;
    const csrfToken = csrfTokenFor(principal);
    return renderConsolePage({
      title: 'Scoring queue',
      principal: { role: principal.role, label: principal.label },
      active: 'scoring',
      csrfToken,
      main: scoringQueueMain({
        studies,
        queue,
        studyTitle: study?.title,
        csrfToken,
        chartSvg: queue?.entries[0] === undefined ? undefined : chartOf(queue.entries[0].itemId),
        ...extra,
      }),
    });
  };

  app.get(
    '/console/scoring',
    {
      schema: {
        summary: 'Console: score short-text answers one at a time (pick a study first)',
        tags: ['console'],
        querystring: z.strictObject({
          study: z.string().min(1).max(100).optional(),
          notice: z.enum(['scored', 'already-scored', 'complete']).optional(),
        }),
        response: { 200: z.string(), 303: z.null(), ...errors, 400: errorBodySchema },
      },
    },
    async (request, reply) => {
      const notices = {
        scored: 'Score saved.',
        'already-scored': 'You had already scored that answer; your first score stands.',
        complete: 'That answer already had all the scores it needs.',
      } as const;
      const notice = request.query.notice === undefined ? undefined : notices[request.query.notice];
      return sendHtml(
        reply,
        200,
        await page(request, request.query.study, notice === undefined ? {} : { notice }),
      );
    },
  );

  app.post(
    '/console/scoring/:entryId',
    {
      schema: {
        summary: "Console: store this rater's rubric score (303 back to the queue)",
        tags: ['console'],
        params: z.object({ entryId: z.string().min(1).max(100) }),
        body: formBody,
        response: { 200: z.string(), 303: z.null(), 400: z.union([z.string(), errorBodySchema]), ...errors },
      },
    },
    async (request, reply) => {
      assertCsrf(request, request.body.csrf);
      const studyId = first(request.body.study);
      const back = (notice: string) =>
        reply
          .code(303)
          .redirect(`/console/scoring?study=${encodeURIComponent(studyId)}&notice=${notice}`, 303);
      const raw = first(request.body.score);
      if (!['0', '1', '2'].includes(raw)) {
        return sendHtml(
          reply,
          400,
          await page(request, studyId === '' ? undefined : studyId, {
            problem: 'score: choose 0, 1 or 2, a level of the rubric.',
          }),
        );
      }
      try {
        await db
          .transaction()
          .execute((trx) =>
            scoreRubricAnswer(trx, request.params.entryId, actorOf(request), Number(raw) as 0 | 1 | 2),
          );
      } catch (error) {
        if (error instanceof AppError && error.code === 'RUBRIC_ALREADY_SCORED')
          return back('already-scored');
        if (error instanceof AppError && error.code === 'RUBRIC_SCORES_COMPLETE') return back('complete');
        throw error;
      }
      return back('scored');
    },
  );
};
