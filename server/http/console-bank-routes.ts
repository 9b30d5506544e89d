import { readFileSync } from 'node:fs';
import type { FastifyReply, FastifyRequest } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { ChartRenderer } from '../bank/chart-renderer.js';
import { taskLevels } from '../bank/item-schema.js';
import type { ItemBank } from '../bank/load-bank.js';
import { chartTypes } from '../charts/chart-spec.js';
import type { DeliveryBank } from '../delivery/delivery-bank.js';
import {
  changeItemStatus,
  effectiveItemStatus,
  itemStatusChangeInputSchema,
} from '../delivery/item-status-service.js';
import { addPilot, pilotInputSchema, retirePilot } from '../delivery/pilots/pilot-service.js';
import { requireStudy } from '../delivery/study-service.js';
import { AppError } from '../errors.js';
import { bankBrowserMain } from '../pages/console/bank-browser-page.js';
import type { BankItemFacts } from '../pages/console/bank-item-facts.js';
import { bankItemMain } from '../pages/console/bank-item-page.js';
import {
  emptyPilotForm,
  type PilotFormProblem,
  type PilotFormValues,
  pilotFormMain,
  pilotFormOptionRows,
  pilotOptionId,
} from '../pages/console/bank-pilot-form-page.js';
import { calibrateStudyMain } from '../pages/console/calibrate-study-page.js';
import { renderConsolePage } from '../pages/console/console-layout.js';
import { bankDifChecker, type ItemDifClass } from '../reports/bank-dif-service.js';
import { calibrateStudy } from '../reports/calibrate-study.js';
import type { DbHandle } from '../storage/db-handle.js';
import { itemExposureCounts, latestItemCalibrations } from '../storage/item-statistics-repository.js';
import { latestItemStatusChanges, listItemStatusChanges } from '../storage/item-status-repository.js';
import { listItemVersions } from '../storage/item-version-repository.js';
import { listPilots } from '../storage/pilot-repository.js';
import { actorOf } from './access-control.js';
import { multipartBoundary, parseMultipartForm } from './console-bank-form-data.js';
import { assertCsrf, csrfTokenFor } from './console-csrf.js';
import { itemStatusRoutes } from './item-status-routes.js';
import { errorBodySchema, studyParams } from './schemas.js';

export interface ConsoleBankRoutesOptions {
  /** The loaded bank (items with their files' status, scenarios). */
  bank: ItemBank;
  /** Delivery's view of the same bank (content hashes), for retire and reinstate. */
  deliveryBank: DeliveryBank;
  /** Draws one chart (the bank's renderer with its maps bound). */
  render: ChartRenderer;
}

/** The console's pilot form may carry a whole image and a few fields; the image check refuses more than 256 KiB. */
export const consolePilotBodyLimit = 1024 * 1024;

const bankCss = readFileSync(new URL('../pages/console/bank-pages.css', import.meta.url), 'utf8');

/** An empty select ("all") sends `type=`: treat it as absent. */
const blankAsAbsent = (value: unknown): unknown => (value === '' ? undefined : value);
const bankQuery = z.strictObject({
  type: z.preprocess(blankAsAbsent, z.enum(chartTypes).optional()),
  level: z.preprocess(blankAsAbsent, z.enum(taskLevels).optional()),
  scenario: z.preprocess(
    blankAsAbsent,
    z
      .string()
      .max(100)
      .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'use a scenario id such as isle')
      .optional(),
  ),
  status: z.preprocess(blankAsAbsent, z.enum(['active', 'retired', 'draft']).optional()),
});
const itemParams = z.object({ itemId: z.string().min(1).max(200) });
const pilotParams = studyParams.extend({ pilotId: z.string().min(1).max(100) });
const formBody = z.object({ csrf: z.string().max(200).optional(), reason: z.string().max(2000).optional() });

/** HTML pages answer with the page; refusals of the access check and CSRF check answer JSON. */
const htmlOrError = z.union([z.string(), errorBodySchema]);
const pageAnswers = {
  200: z.string(),
  303: z.null(),
  400: htmlOrError,
  401: errorBodySchema,
  403: errorBodySchema,
  404: htmlOrError,
  409: htmlOrError,
  413: htmlOrError,
  415: htmlOrError,
};

const notices = {
  retired:
    'Item retired. New attempts no longer get it; attempts under way keep it, and its stored answers still count in calibrations.',
  active: 'Item reinstated. New attempts may get it again.',
} as const;

function sendHtml(reply: FastifyReply, status: number, page: string) {
  return reply.code(status).header('cache-control', 'no-store').type('text/html; charset=utf-8').send(page);
}

function sessionOf(request: FastifyRequest) {
  const principal = request.principal;
  if (principal === undefined) throw new AppError('UNAUTHORIZED', 'Sign in at /sign-in.');
  return {
    principal: { role: principal.role, label: principal.label },
    csrfToken: csrfTokenFor(principal),
    isAdmin: principal.role === 'admin',
  };
}

/**
 * Status, latest calibration, DIF class (from that calibration) and exposure of every bank item: three
 * queries for the whole bank, plus one fairness check per calibration not seen before.
 */
async function loadBankFacts(
  db: DbHandle,
  bank: ItemBank,
  difClassesOf: ReturnType<typeof bankDifChecker>,
): Promise<BankItemFacts[]> {
  const [changes, calibrations, exposure] = await Promise.all([
    latestItemStatusChanges(db),
    latestItemCalibrations(db),
    itemExposureCounts(db),
  ]);
  const difByCalibration = new Map<string, Map<string, ItemDifClass>>();
  for (const id of new Set([...calibrations.values()].map((c) => c.calibrationId))) {
    difByCalibration.set(id, await difClassesOf(db, id));
  }
  return bank.items.map((item) => {
    const calibration = calibrations.get(item.id);
    return {
      item,
      status: effectiveItemStatus(item.status, changes.get(item.id)),
      calibration,
      responses: exposure.responsesByItem.get(item.id) ?? 0,
      attempts: exposure.attempts,
      dif:
        calibration === undefined ? undefined : difByCalibration.get(calibration.calibrationId)?.get(item.id),
    };
  });
}

/** The form field of a pilot input problem (zod path), as the form's control ids name them. */
function pilotFieldOf(path: readonly PropertyKey[]): string {
  const [head, index] = path;
  if (head === 'options') return typeof index === 'number' ? `option-${pilotOptionId(index)}` : 'option-a';
  if (head === 'minResponses') return 'min-responses';
  if (head === 'prompt' || head === 'alt' || head === 'key' || head === 'image') return head;
  return 'image';
}

/** The pilot form's controls, top to bottom. */
const pilotFieldOrder = [
  'image',
  'alt',
  'prompt',
  ...Array.from({ length: pilotFormOptionRows }, (_, i) => `option-${pilotOptionId(i)}`),
  'key',
  'min-responses',
];

/** Plain words for the schema's problems where its own message speaks of ids. */
function pilotProblemText(field: string, message: string): string {
  if (field === 'key') return 'choose which filled-in option is right';
  if (field === 'min-responses') return 'a whole number from 30 to 5000';
  if (field === 'option-a' && /at least|too small|>=/i.test(message)) return 'fill in at least two options';
  return message;
}

/**
 * The console's bank pages (see DEVELOPERS.md, "Console", "Bank browser"): the bank browser with
 * filters, one item with its versions and status history, retire and reinstate (admins), a pilot
 * chart upload for a study, and a calibrate page; plus the item status admin API
 * (server/http/item-status-routes.ts), which calls the same service. Pages work without JavaScript;
 * every change is a form POST carrying the session's CSRF token.
 */
export const consoleBankRoutes: FastifyPluginAsyncZod<ConsoleBankRoutesOptions> = async (
  app,
  { bank, deliveryBank, render },
) => {
  const db = app.db;
  const difClassesOf = bankDifChecker();
  await app.register(itemStatusRoutes, { bank: deliveryBank });

  if (!app.hasContentTypeParser('application/x-www-form-urlencoded')) {
    app.addContentTypeParser(
      'application/x-www-form-urlencoded',
      { parseAs: 'string' },
      (_request, body, done) => done(null, Object.fromEntries(new URLSearchParams(body as string))),
    );
  }
  if (!app.hasContentTypeParser('multipart/form-data')) {
    app.addContentTypeParser('multipart/form-data', { parseAs: 'buffer' }, (_request, body, done) =>
      done(null, body),
    );
  }

  // Charts are deterministic: draw each (item version, id prefix) once per process.
  const drawn = new Map<string, string>();
  const cachedRender: ChartRenderer = (spec, options) => {
    const key = `${options.idPrefix}\u0000${options.alt}\u0000${JSON.stringify(spec)}`;
    let svg = drawn.get(key);
    if (svg === undefined) {
      svg = render(spec, options);
      drawn.set(key, svg);
    }
    return svg;
  };

  const itemPage = async (
    request: FastifyRequest,
    itemId: string,
    extra: { notice?: string; error?: { message: string; reason: string } } = {},
  ) => {
    const session = sessionOf(request);
    const facts = (await loadBankFacts(db, bank, difClassesOf)).find((f) => f.item.id === itemId);
    if (facts === undefined) {
      throw new AppError('ITEM_NOT_FOUND', `No item "${itemId}" in the bank.`, { field: 'params.itemId' });
    }
    const [versions, history] = await Promise.all([
      listItemVersions(db, itemId),
      listItemStatusChanges(db, itemId),
    ]);
    return renderConsolePage({
      title: `Item ${itemId}`,
      principal: session.principal,
      active: 'bank',
      csrfToken: session.csrfToken,
      main: bankItemMain(
        {
          facts,
          versions,
          history,
          canChange: session.isAdmin,
          csrfToken: session.csrfToken,
          notice: extra.notice,
          error: extra.error,
        },
        cachedRender,
      ),
    });
  };

  app.get(
    '/console/bank/bank.css',
    {
      schema: {
        summary: 'Style sheet of the console bank pages',
        tags: ['console'],
        response: { 200: z.string(), 401: errorBodySchema, 403: errorBodySchema },
      },
    },
    async (_request, reply) =>
      reply.header('cache-control', 'private, no-cache').type('text/css; charset=utf-8').send(bankCss),
  );

  app.get(
    '/console/bank',
    {
      schema: {
        summary: 'Bank browser: every item as respondents see it, with difficulty, fit, DIF and exposure',
        tags: ['console'],
        querystring: bankQuery,
        response: pageAnswers,
      },
    },
    async (request, reply) => {
      const session = sessionOf(request);
      const facts = await loadBankFacts(db, bank, difClassesOf);
      const page = renderConsolePage({
        title: 'Item bank',
        principal: session.principal,
        active: 'bank',
        csrfToken: session.csrfToken,
        main: bankBrowserMain(bank, facts, request.query, cachedRender),
      });
      return sendHtml(reply, 200, page);
    },
  );

  app.get(
    '/console/bank/:itemId',
    {
      schema: {
        summary: 'One item: as respondents see it, statistics, versions, status history, retire form',
        tags: ['console'],
        params: itemParams,
        querystring: z.strictObject({ changed: z.enum(['retired', 'active']).optional() }),
        response: pageAnswers,
      },
    },
    async (request, reply) => {
      const changed = request.query.changed;
      const page = await itemPage(request, request.params.itemId, {
        ...(changed === undefined ? {} : { notice: notices[changed] }),
      });
      return sendHtml(reply, 200, page);
    },
  );

  for (const [action, to] of [
    ['retire', 'retired'],
    ['reinstate', 'active'],
  ] as const) {
    // A signed-out form post is sent to /sign-in?next=<this path>: after signing in, back to the item.
    app.get(
      `/console/bank/:itemId/${action}`,
      {
        schema: {
          summary: 'Console: 303 to the item page (the next page of a signed-out form post)',
          tags: ['console'],
          params: itemParams,
          response: { 303: z.null(), 400: errorBodySchema, 401: errorBodySchema, 403: errorBodySchema },
        },
      },
      async (request, reply) =>
        reply.code(303).redirect(`/console/bank/${encodeURIComponent(request.params.itemId)}`, 303),
    );
    app.post(
      `/console/bank/:itemId/${action}`,
      {
        schema: {
          summary: to === 'retired' ? 'Retire an item (console form)' : 'Reinstate an item (console form)',
          tags: ['console'],
          params: itemParams,
          body: formBody,
          response: pageAnswers,
        },
      },
      async (request, reply) => {
        assertCsrf(request, request.body.csrf);
        const { itemId } = request.params;
        const reason = request.body.reason ?? '';
        const parsed = itemStatusChangeInputSchema.safeParse({ reason });
        if (!parsed.success) {
          const message = `Reason: ${parsed.error.issues[0]?.message ?? 'say why'}.`;
          return sendHtml(reply, 400, await itemPage(request, itemId, { error: { message, reason } }));
        }
        try {
          await db
            .transaction()
            .execute((trx) => changeItemStatus(trx, deliveryBank, itemId, to, parsed.data, actorOf(request)));
        } catch (error) {
          if (error instanceof AppError && error.code === 'CONFLICT') {
            return sendHtml(
              reply,
              409,
              await itemPage(request, itemId, { error: { message: error.message, reason } }),
            );
          }
          throw error;
        }
        return reply
          .code(303)
          .header('cache-control', 'no-store')
          .redirect(`/console/bank/${encodeURIComponent(itemId)}?changed=${to}`, 303);
      },
    );
  }

  const pilotPage = async (
    request: FastifyRequest,
    studyId: string,
    form: { values: PilotFormValues; problems: readonly PilotFormProblem[]; notice?: string },
  ) => {
    const session = sessionOf(request);
    const study = await requireStudy(db, studyId);
    const pilots = await listPilots(db, studyId);
    return renderConsolePage({
      title: `Add a pilot chart to ${study.title}`,
      principal: session.principal,
      active: 'studies',
      csrfToken: session.csrfToken,
      main: pilotFormMain({
        studyId,
        studyTitle: study.title,
        csrfToken: session.csrfToken,
        values: form.values,
        problems: form.problems,
        pilots,
        notice: form.notice,
      }),
    });
  };

  app.get(
    '/console/studies/:studyId/pilots/new',
    {
      schema: {
        summary: 'Form to add a pilot chart to a study (console)',
        tags: ['console'],
        params: studyParams,
        querystring: z.strictObject({ added: z.literal('1').optional(), retired: z.literal('1').optional() }),
        response: pageAnswers,
      },
    },
    async (request, reply) => {
      const notice =
        request.query.added === '1'
          ? 'Pilot chart added. It is listed below; add another or go back to the study.'
          : request.query.retired === '1'
            ? 'New attempts no longer get that pilot chart. Its answers so far stay in the report.'
            : undefined;
      const page = await pilotPage(request, request.params.studyId, {
        values: emptyPilotForm,
        problems: [],
        ...(notice === undefined ? {} : { notice }),
      });
      return sendHtml(reply, 200, page);
    },
  );

  // A signed-out form post is sent to /sign-in?next=<its path>; after signing in, these GETs lead
  // back to the study's pilot page.
  for (const [url, params] of [
    ['/console/studies/:studyId/pilots', studyParams],
    ['/console/studies/:studyId/pilots/:pilotId/retire', pilotParams],
  ] as const) {
    app.get(
      url,
      {
        schema: {
          summary: 'Console: 303 to the pilot page (the next page of a signed-out form post)',
          tags: ['console'],
          params,
          response: { 303: z.null(), 400: errorBodySchema, 401: errorBodySchema, 403: errorBodySchema },
        },
      },
      async (request, reply) =>
        reply
          .code(303)
          .redirect(`/console/studies/${encodeURIComponent(request.params.studyId)}/pilots/new`, 303),
    );
  }

  app.post(
    '/console/studies/:studyId/pilots',
    {
      bodyLimit: consolePilotBodyLimit,
      schema: {
        summary: 'Add a pilot chart from the console form (multipart; same checks as the admin API)',
        tags: ['console'],
        params: studyParams,
        response: pageAnswers,
      },
    },
    async (request, reply) => {
      if (!Buffer.isBuffer(request.body)) {
        throw new AppError('UNSUPPORTED_MEDIA_TYPE', 'Send the pilot form as multipart/form-data.', {
          field: 'headers.content-type',
        });
      }
      const form = parseMultipartForm(request.body, multipartBoundary(request.headers['content-type']));
      assertCsrf(request, form.fields.get('csrf'));
      const { studyId } = request.params;
      await requireStudy(db, studyId);
      const text = (name: string) => form.fields.get(name) ?? '';
      const values: PilotFormValues = {
        prompt: text('prompt'),
        alt: text('alt'),
        options: Array.from({ length: pilotFormOptionRows }, (_, i) => text(`option-${pilotOptionId(i)}`)),
        key: text('key'),
        minResponses: text('min-responses').trim() === '' ? '100' : text('min-responses').trim(),
      };
      const problems: PilotFormProblem[] = [];
      const image = form.files.get('image');
      if (image === undefined || image.data.length === 0) {
        problems.push({ field: 'image', problem: 'choose an SVG or PNG file' });
      }
      const filled = values.options
        .map((optionText, i) => ({ id: pilotOptionId(i), text: optionText.trim() }))
        .filter((o) => o.text !== '');
      // The schema checks the key only once every field parses; say it at once, with the rest.
      if (!filled.some((o) => o.id === values.key)) {
        problems.push({ field: 'key', problem: pilotProblemText('key', '') });
      }
      const parsed = pilotInputSchema.safeParse({
        prompt: values.prompt,
        alt: values.alt,
        options: filled,
        key: values.key,
        image: { type: image?.type ?? 'none', base64: image?.data.toString('base64') || 'none' },
        minResponses: Number(values.minResponses),
      });
      if (!parsed.success) {
        for (const issue of parsed.error.issues) {
          let field = pilotFieldOf(issue.path);
          // A problem with the n-th filled option belongs to the row it came from.
          if (field.startsWith('option-') && typeof issue.path[1] === 'number') {
            field = `option-${filled[issue.path[1]]?.id ?? 'a'}`;
          }
          if (field === 'image' && problems.some((p) => p.field === 'image')) continue;
          if (problems.some((p) => p.field === field)) continue;
          problems.push({ field, problem: pilotProblemText(field, issue.message) });
        }
      }
      if (problems.length > 0 || !parsed.success) {
        // In the order of the form's fields, so the summary reads top to bottom.
        const place = (field: string) => pilotFieldOrder.indexOf(field);
        problems.sort((a, b) => place(a.field) - place(b.field));
        return sendHtml(reply, 400, await pilotPage(request, studyId, { values, problems }));
      }
      try {
        await db.transaction().execute((trx) => addPilot(trx, studyId, parsed.data, actorOf(request)));
      } catch (error) {
        if (
          error instanceof AppError &&
          (error.code === 'VALIDATION_FAILED' ||
            error.code === 'UNSUPPORTED_MEDIA_TYPE' ||
            error.code === 'BODY_TOO_LARGE')
        ) {
          const problem = error.message.replace(/^[a-z.]+: /, '');
          return sendHtml(
            reply,
            error.statusCode,
            await pilotPage(request, studyId, { values, problems: [{ field: 'image', problem }] }),
          );
        }
        throw error;
      }
      return reply
        .code(303)
        .header('cache-control', 'no-store')
        .redirect(`/console/studies/${encodeURIComponent(studyId)}/pilots/new?added=1`, 303);
    },
  );

  app.post(
    '/console/studies/:studyId/pilots/:pilotId/retire',
    {
      schema: {
        summary: 'Stop giving a pilot chart to new attempts (console form)',
        tags: ['console'],
        params: pilotParams,
        body: formBody,
        response: pageAnswers,
      },
    },
    async (request, reply) => {
      assertCsrf(request, request.body.csrf);
      const { studyId, pilotId } = request.params;
      await db.transaction().execute((trx) => retirePilot(trx, studyId, pilotId, actorOf(request)));
      return reply
        .code(303)
        .header('cache-control', 'no-store')
        .redirect(`/console/studies/${encodeURIComponent(studyId)}/pilots/new?retired=1`, 303);
    },
  );

  const calibratePage = async (request: FastifyRequest, studyId: string, problem?: string) => {
    const session = sessionOf(request);
    const study = await requireStudy(db, studyId);
    return renderConsolePage({
      title: `Calibrate ${study.title}`,
      principal: session.principal,
      active: 'studies',
      csrfToken: session.csrfToken,
      main: calibrateStudyMain({ studyId, studyTitle: study.title, csrfToken: session.csrfToken, problem }),
    });
  };

  app.get(
    '/console/studies/:studyId/calibrate',
    {
      schema: {
        summary: 'Calibrate page of a study (console)',
        tags: ['console'],
        params: studyParams,
        response: pageAnswers,
      },
    },
    async (request, reply) => sendHtml(reply, 200, await calibratePage(request, request.params.studyId)),
  );

  app.post(
    '/console/studies/:studyId/calibrate',
    {
      schema: {
        summary: 'Calibrate the study now (console form), then open its report',
        tags: ['console'],
        params: studyParams,
        body: formBody,
        response: pageAnswers,
      },
    },
    async (request, reply) => {
      assertCsrf(request, request.body.csrf);
      const { studyId } = request.params;
      try {
        await calibrateStudy(db, studyId);
      } catch (error) {
        if (error instanceof AppError && error.code === 'TOO_FEW_RESPONSES') {
          return sendHtml(reply, 409, await calibratePage(request, studyId, error.message));
        }
        throw error;
      }
      return reply
        .code(303)
        .header('cache-control', 'no-store')
        .redirect(`/studies/${encodeURIComponent(studyId)}/report`, 303);
    },
  );
};
