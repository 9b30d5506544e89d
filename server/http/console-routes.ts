import { readdirSync } from 'node:fs';
import type { FastifyError, FastifyReply, FastifyRequest } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { ItemBank } from '../bank/load-bank.js';
import type { Config } from '../config.js';
import type { DeliveryBank } from '../delivery/delivery-bank.js';
import { joinQrSvg } from '../delivery/join-qr-svg.js';
import { publicBaseUrl } from '../delivery/public-url.js';
import { selectItemPool } from '../delivery/select-item-pool.js';
import {
  addCohort,
  changeStudy,
  createStudy,
  getCohort,
  getCohorts,
  getStudies,
  getStudy,
  type Study,
  validateStudySettings,
} from '../delivery/study-service.js';
import { itemPoolSchema, type StudySettings, studySettingsSchema } from '../delivery/study-settings.js';
import { AppError } from '../errors.js';
import { renderConsolePage } from '../pages/console/console-layout.js';
import { renderKioskSignMain } from '../pages/console/kiosk-sign-page.js';
import {
  exposureSentence,
  renderProgressMain,
  renderProgressSections,
} from '../pages/console/progress-page.js';
import { renderStudiesMain } from '../pages/console/studies-page.js';
import { countSentence, renderStudyForm } from '../pages/console/study-form.js';
import {
  describeProblem,
  emptyFormValues,
  type FormProblem,
  formFieldOf,
  formValuesFromBody,
  formValuesFromSettings,
  type StudyFormValues,
  settingsFromForm,
} from '../pages/console/study-form-values.js';
import { renderStudyMain } from '../pages/console/study-page.js';
import { html, type SafeHtml } from '../pages/html.js';
import { readStudyProgress } from '../reports/study-progress-service.js';
import { listRetiredItemIds } from '../storage/item-status-repository.js';
import { countCohortsByStudy } from '../storage/progress-repository.js';
import { actorOf } from './access-control.js';
import { consolePages } from './access-policy.js';
import { assertCsrf, csrfTokenFor } from './console-csrf.js';
import { errorHandler } from './error-handler.js';
import { errorBodySchema, studyParams, teamRouteErrors } from './schemas.js';
import { pageAssetsFolder, readPageAssets, serveAssets } from './served-assets.js';

export interface ConsoleRoutesOptions {
  /** The delivery bank (pools, item counts). */
  bank: DeliveryBank;
  /** The loaded bank, for its scenario names. */
  itemBank: ItemBank;
  config: Config;
}

const cohortParams = studyParams.extend({ cohortId: z.string().min(1).max(100) });
/** A posted form: urlencoded fields, a repeated name (checkboxes) as a list. */
const formBody = z.record(
  z.string().max(100),
  z.union([z.string().max(20_000), z.array(z.string().max(200)).max(100)]),
);
const repeated = z.union([z.string().max(100), z.array(z.string().max(100)).max(100)]).optional();
const errors = teamRouteErrors;
/** Console pages answer an unknown study or cohort with a page (404) a person can read. */
const pageErrors = { ...errors, 404: z.union([z.string(), errorBodySchema]) };
/** A page, or a form shown again with its problems (400 invalid, 409 conflicts with stored data). */
const pageReplies = { 200: z.string(), 400: z.string(), 409: z.string(), 303: z.null() };

/** What the progress page polls: the numbers, and the refreshing sections drawn by the server. */
const progressReply = z.object({
  progress: z.looseObject({
    study: z.looseObject({ id: z.string(), title: z.string() }),
    at: z.string(),
    totals: z.object({
      started: z.number(),
      inProgress: z.number(),
      finished: z.number(),
      abandoned: z.number(),
    }),
    cohorts: z.array(z.looseObject({ cohortId: z.string(), label: z.string() })),
    items: z.array(z.looseObject({ itemId: z.string(), answers: z.number() })),
    exposure: z.looseObject({ applies: z.boolean(), nearing: z.array(z.looseObject({})) }),
    pilots: z.array(z.looseObject({ pilotId: z.string(), responses: z.number() })),
  }),
  exposureText: z.string(),
  /** The refreshing sections as HTML, escaped by the same renderer as the page. */
  html: z.string(),
});

/** Every `console*.css` and `console*.js` in server/pages/assets/, read once at start-up. */
const assets = readPageAssets(
  readdirSync(pageAssetsFolder).filter((name) => /^console[a-z0-9-]*\.(css|js)$/.test(name)),
);

const notices = {
  created: 'Study created.',
  saved: 'Settings saved.',
  'cohort-added': 'Cohort added.',
} as const;

function sendHtml(reply: FastifyReply, status: number, page: string) {
  return reply.code(status).header('cache-control', 'no-store').type('text/html; charset=utf-8').send(page);
}

function pageParts(request: FastifyRequest) {
  const principal = request.principal;
  if (principal === undefined) throw new AppError('UNAUTHORIZED', 'Sign in at /sign-in.');
  return {
    principal: { role: principal.role, label: principal.label },
    csrfToken: csrfTokenFor(principal),
    canEdit: principal.role === 'admin',
  };
}

/**
 * A page of the console's Studies section for the signed-in person (`pageParts`), loading the
 * console script unless `withScript` is false.
 */
function studiesSectionPage(
  parts: ReturnType<typeof pageParts>,
  title: string,
  main: SafeHtml,
  withScript = true,
): string {
  return renderConsolePage({
    title,
    principal: parts.principal,
    active: 'studies',
    csrfToken: parts.csrfToken,
    ...(withScript ? { script: 'console.js' } : {}),
    main,
  });
}

/** The form field each settings problem of the shared schema belongs to. */
function problemsOf(error: unknown): { status: 400 | 409; problems: FormProblem[] } | undefined {
  if (!(error instanceof AppError)) return undefined;
  if (error.code === 'VALIDATION_FAILED') {
    const listed = (error.details.problems ?? []) as { field: string; problem: string }[];
    const problems = listed.map((p) => {
      const parts = p.field.split('.');
      return { field: formFieldOf(parts), problem: describeProblem(parts, p.problem) };
    });
    return {
      status: 400,
      problems: problems.length > 0 ? problems : [{ field: 'title', problem: error.message }],
    };
  }
  if (error.code === 'ADAPTIVE_NEEDS_CALIBRATION' || error.code === 'CONFLICT')
    return { status: 409, problems: [{ field: 'design', problem: error.message }] };
  return undefined;
}

/**
 * The team's console: studies (list, new, edit), cohorts with join link, QR code and kiosk sign, live
 * progress (a page and the JSON it polls), the live item count of the study form, and the console's
 * assets. Pages are server-rendered and work without JavaScript; every change is a form POST that
 * carries the session's CSRF token (server/http/console-csrf.ts) and goes through the same services
 * and zod settings schema as the admin API. Access: analysts read, admins change
 * (server/http/access-policy.ts); a signed-out browser is sent to /sign-in.
 */
export const consoleRoutes: FastifyPluginAsyncZod<ConsoleRoutesOptions> = async (
  app,
  { bank, itemBank, config },
) => {
  const db = app.db;
  const baseUrl = publicBaseUrl(config);
  const scenarios = itemBank.scenarios.map((s) => ({ id: s.id, name: s.name }));
  const scenarioNames = Object.fromEntries(scenarios.map((s) => [s.id, s.name]));
  /** Active items a pool selects, leaving out items the team retired since (as delivery does). */
  const countItems = (pool: z.infer<typeof itemPoolSchema>, retired: ReadonlySet<string>) =>
    selectItemPool(
      bank.items.map((entry) => entry.item),
      pool,
      retired,
    ).itemIds.length;
  const defaultConsent = studySettingsSchema.parse({ title: 'x' }).consentText;

  // A person following an old link to a study or cohort that is gone gets a page, not JSON.
  app.setErrorHandler((error, request, reply) => {
    const route = `${request.method === 'HEAD' ? 'GET' : request.method} ${request.routeOptions.url ?? ''}`;
    const gone =
      error instanceof AppError && (error.code === 'STUDY_NOT_FOUND' || error.code === 'COHORT_NOT_FOUND');
    if (!gone || !consolePages.has(route) || request.principal === undefined)
      return errorHandler(error as FastifyError, request, reply);
    const parts = pageParts(request);
    return sendHtml(
      reply,
      404,
      studiesSectionPage(
        parts,
        'Not found',
        html`<h1>Not found</h1><p>${error.message}</p><p><a href="/console">Back to the studies</a></p>`,
        false,
      ),
    );
  });

  app.addContentTypeParser(
    'application/x-www-form-urlencoded',
    { parseAs: 'string' },
    (_request, body, done) => {
      const fields: Record<string, string | string[]> = {};
      for (const [name, value] of new URLSearchParams(body as string)) {
        const before = fields[name];
        fields[name] =
          before === undefined ? value : Array.isArray(before) ? [...before, value] : [before, value];
      }
      done(null, fields);
    },
  );

  /** The matching-item count of a form's pool filters (0 when a filter names nothing the bank knows). */
  const matchingOf = (values: StudyFormValues, retired: ReadonlySet<string>, previous?: StudySettings) => {
    const pool = itemPoolSchema.safeParse({
      ...(values.chartTypes.length > 0 ? { chartTypes: values.chartTypes } : {}),
      ...(values.levels.length > 0 ? { levels: values.levels } : {}),
      ...(values.scenarios.length > 0 ? { scenarios: values.scenarios } : {}),
      ...(previous?.pool.itemIds === undefined ? {} : { itemIds: previous.pool.itemIds }),
    });
    return pool.success ? countItems(pool.data, retired) : 0;
  };

  const studyFormPage = (
    request: FastifyRequest,
    mode: { kind: 'new' } | { kind: 'edit'; study: Study },
    values: StudyFormValues,
    problems: readonly FormProblem[],
    retired: ReadonlySet<string>,
  ) => {
    const parts = pageParts(request);
    const previous = mode.kind === 'edit' ? mode.study.settings : undefined;
    const form = renderStudyForm({
      action:
        mode.kind === 'new'
          ? '/console/studies/new'
          : `/console/studies/${encodeURIComponent(mode.study.id)}`,
      values,
      problems,
      csrfToken: parts.csrfToken,
      scenarios,
      matchingItems: matchingOf(values, retired, previous),
      ...(previous?.pool.itemIds === undefined ? {} : { listedItemIds: previous.pool.itemIds.length }),
      showStatus: mode.kind === 'edit',
      submitLabel: mode.kind === 'new' ? 'Create study' : 'Save settings',
      draftKey: mode.kind === 'new' ? 'new-study' : `study-${mode.study.id}`,
      ...(mode.kind === 'edit' ? { studyId: mode.study.id } : {}),
    });
    return { parts, form };
  };

  const studyPage = async (
    request: FastifyRequest,
    study: Study,
    options: {
      form?: { values: StudyFormValues; problems: readonly FormProblem[] };
      cohortForm?: { label: string; problem?: string };
      notice?: string;
      forgetDrafts?: readonly string[];
    } = {},
  ) => {
    const parts = pageParts(request);
    const cohorts = await getCohorts(db, study.id, baseUrl);
    const withQr = await Promise.all(cohorts.map(async (c) => ({ ...c, qrSvg: await joinQrSvg(c.joinUrl) })));
    const form = parts.canEdit
      ? studyFormPage(
          request,
          { kind: 'edit', study },
          options.form?.values ?? formValuesFromSettings(study.settings, study.status),
          options.form?.problems ?? [],
          await listRetiredItemIds(db),
        ).form
      : undefined;
    return studiesSectionPage(
      parts,
      study.title,
      renderStudyMain({
        study,
        cohorts: withQr,
        ...(form === undefined ? {} : { form }),
        ...(parts.canEdit ? { cohortForm: options.cohortForm ?? { label: '' } } : {}),
        canEdit: parts.canEdit,
        csrfToken: parts.csrfToken,
        ...(options.notice === undefined ? {} : { notice: options.notice }),
        ...(options.forgetDrafts === undefined ? {} : { forgetDrafts: options.forgetDrafts }),
        scenarioNames,
      }),
    );
  };

  /** Validates a posted study form with the shared schema; problems in form words, or the settings input. */
  const checkForm = (values: StudyFormValues, previous?: StudySettings) => {
    const { input, problems } = settingsFromForm(values, previous);
    if (values.status !== 'open' && values.status !== 'closed')
      problems.push({ field: 'status', problem: 'choose open or closed' });
    try {
      validateStudySettings(input, bank);
    } catch (error) {
      const mapped = problemsOf(error);
      if (mapped === undefined) throw error;
      problems.push(...mapped.problems);
    }
    return { input, problems };
  };

  app.get(
    '/console',
    {
      schema: {
        summary: 'Console: the list of studies',
        tags: ['console'],
        response: { 200: z.string(), 303: z.null(), ...errors },
      },
    },
    async (request, reply) => {
      const parts = pageParts(request);
      const [studies, cohortCounts] = await Promise.all([getStudies(db, bank), countCohortsByStudy(db)]);
      return sendHtml(
        reply,
        200,
        studiesSectionPage(
          parts,
          'Studies',
          renderStudiesMain({ studies, cohortCounts, canEdit: parts.canEdit }),
          false,
        ),
      );
    },
  );

  app.get(
    '/console/studies/new',
    {
      schema: {
        summary: 'Console: the new-study form',
        tags: ['console'],
        response: { 200: z.string(), 303: z.null(), ...errors },
      },
    },
    async (request, reply) => {
      const { parts, form } = studyFormPage(
        request,
        { kind: 'new' },
        emptyFormValues(defaultConsent),
        [],
        await listRetiredItemIds(db),
      );
      return sendHtml(reply, 200, studiesSectionPage(parts, 'New study', newStudyMain(form)));
    },
  );

  app.post(
    '/console/studies/new',
    {
      schema: {
        summary:
          'Console: create a study from the form (303 to the study, or the form again with its problems)',
        tags: ['console'],
        body: formBody,
        response: { ...pageReplies, ...pageErrors, 400: z.union([z.string(), errorBodySchema]) },
      },
    },
    async (request, reply) => {
      assertCsrf(request, request.body.csrf);
      const values = formValuesFromBody(request.body);
      const checked = checkForm(values);
      let problems = checked.problems;
      let status = 400;
      if (problems.length === 0) {
        try {
          const study = await db
            .transaction()
            .execute((trx) => createStudy(trx, bank, checked.input, actorOf(request)));
          return reply
            .code(303)
            .redirect(`/console/studies/${encodeURIComponent(study.id)}?notice=created`, 303);
        } catch (error) {
          const mapped = problemsOf(error);
          if (mapped === undefined) throw error;
          problems = mapped.problems;
          status = mapped.status;
        }
      }
      const { parts, form } = studyFormPage(
        request,
        { kind: 'new' },
        values,
        problems,
        await listRetiredItemIds(db),
      );
      return sendHtml(
        reply,
        status,
        studiesSectionPage(parts, 'New study (please correct the form)', newStudyMain(form)),
      );
    },
  );

  app.get(
    '/console/studies/:studyId',
    {
      schema: {
        summary: 'Console: one study (cohorts, join links, QR codes, report links; settings form for admins)',
        tags: ['console'],
        params: studyParams,
        querystring: z.object({ notice: z.enum(['created', 'saved', 'cohort-added']).optional() }),
        response: { 200: z.string(), 303: z.null(), ...pageErrors },
      },
    },
    async (request, reply) => {
      const study = await getStudy(db, bank, request.params.studyId);
      const kind = request.query.notice;
      if (kind === undefined) return sendHtml(reply, 200, await studyPage(request, study));
      const forgetDrafts = [
        kind === 'created' ? 'new-study' : kind === 'saved' ? `study-${study.id}` : `cohort-${study.id}`,
      ];
      return sendHtml(reply, 200, await studyPage(request, study, { notice: notices[kind], forgetDrafts }));
    },
  );

  app.post(
    '/console/studies/:studyId',
    {
      schema: {
        summary:
          "Console: save a study's settings from the form (303 back, or the form again with its problems)",
        tags: ['console'],
        params: studyParams,
        body: formBody,
        response: { ...pageReplies, ...pageErrors, 400: z.union([z.string(), errorBodySchema]) },
      },
    },
    async (request, reply) => {
      assertCsrf(request, request.body.csrf);
      const study = await getStudy(db, bank, request.params.studyId);
      const values = formValuesFromBody(request.body);
      const checked = checkForm(values, study.settings);
      let problems = checked.problems;
      let status = 400;
      if (problems.length === 0) {
        try {
          await db
            .transaction()
            .execute((trx) =>
              changeStudy(
                trx,
                bank,
                study.id,
                { settings: checked.input, status: values.status as 'open' | 'closed' },
                actorOf(request),
              ),
            );
          return reply
            .code(303)
            .redirect(`/console/studies/${encodeURIComponent(study.id)}?notice=saved`, 303);
        } catch (error) {
          const mapped = problemsOf(error);
          if (mapped === undefined) throw error;
          problems = mapped.problems;
          status = mapped.status;
        }
      }
      return sendHtml(reply, status, await studyPage(request, study, { form: { values, problems } }));
    },
  );

  app.get(
    '/console/studies/:studyId/cohorts',
    {
      schema: {
        summary: "Console: a study's cohorts (303 to the study page)",
        tags: ['console'],
        params: studyParams,
        response: { 303: z.null(), ...errors },
      },
    },
    async (request, reply) =>
      reply
        .code(303)
        .redirect(`/console/studies/${encodeURIComponent(request.params.studyId)}#cohorts-heading`, 303),
  );

  app.post(
    '/console/studies/:studyId/cohorts',
    {
      schema: {
        summary: 'Console: add a cohort (303 back to the study, or the page with the problem)',
        tags: ['console'],
        params: studyParams,
        body: formBody,
        response: { ...pageReplies, ...pageErrors, 400: z.union([z.string(), errorBodySchema]) },
      },
    },
    async (request, reply) => {
      assertCsrf(request, request.body.csrf);
      const study = await getStudy(db, bank, request.params.studyId);
      const raw = request.body.label;
      const label = (Array.isArray(raw) ? (raw[0] ?? '') : (raw ?? '')).trim();
      const problem =
        label === ''
          ? 'write a label, such as "Year 6, Corrowen school"'
          : label.length > 100
            ? 'at most 100 characters'
            : undefined;
      if (problem !== undefined) {
        return sendHtml(reply, 400, await studyPage(request, study, { cohortForm: { label, problem } }));
      }
      await db.transaction().execute((trx) => addCohort(trx, study.id, label, actorOf(request), baseUrl));
      return reply
        .code(303)
        .redirect(
          `/console/studies/${encodeURIComponent(study.id)}?notice=cohort-added#cohorts-heading`,
          303,
        );
    },
  );

  app.get(
    '/console/studies/:studyId/cohorts/:cohortId/sign',
    {
      schema: {
        summary: 'Console: a printable kiosk sign for a cohort (join code, QR code, consent line)',
        tags: ['console'],
        params: cohortParams,
        response: { 200: z.string(), 303: z.null(), ...pageErrors },
      },
    },
    async (request, reply) => {
      const parts = pageParts(request);
      const study = await getStudy(db, bank, request.params.studyId);
      const cohort = await getCohort(db, study.id, request.params.cohortId, baseUrl);
      return sendHtml(
        reply,
        200,
        studiesSectionPage(
          parts,
          `Kiosk sign: ${cohort.label}`,
          renderKioskSignMain(study, cohort, await joinQrSvg(cohort.joinUrl)),
        ),
      );
    },
  );

  app.get(
    '/console/studies/:studyId/compare',
    {
      schema: {
        summary:
          'Console: open the report comparing two cohorts (303 to /studies/:id/report?compare=from,to)',
        tags: ['console'],
        params: studyParams,
        querystring: z.object({ from: z.string().min(1).max(100), to: z.string().min(1).max(100) }),
        response: { 303: z.null(), ...pageErrors },
      },
    },
    async (request, reply) => {
      const { studyId } = request.params;
      const { from, to } = request.query;
      await getCohort(db, studyId, from, baseUrl);
      await getCohort(db, studyId, to, baseUrl);
      if (from === to)
        throw new AppError('VALIDATION_FAILED', 'query.to: choose a different cohort from the first', {
          problems: [{ field: 'query.to', problem: 'choose a different cohort from the first' }],
        });
      const compare = `${encodeURIComponent(from)},${encodeURIComponent(to)}`;
      return reply
        .code(303)
        .redirect(`/studies/${encodeURIComponent(studyId)}/report?compare=${compare}`, 303);
    },
  );

  app.get(
    '/console/studies/:studyId/progress',
    {
      schema: {
        summary: 'Console: live progress of a study (refreshes itself)',
        tags: ['console'],
        params: studyParams,
        response: { 200: z.string(), 303: z.null(), ...pageErrors },
      },
    },
    async (request, reply) => {
      const parts = pageParts(request);
      const progress = await readStudyProgress(db, bank, request.params.studyId);
      return sendHtml(
        reply,
        200,
        studiesSectionPage(
          parts,
          `Progress: ${progress.study.title}`,
          renderProgressMain(
            progress,
            `/console/studies/${encodeURIComponent(progress.study.id)}/progress.json`,
          ),
        ),
      );
    },
  );

  app.get(
    '/console/studies/:studyId/progress.json',
    {
      schema: {
        summary: 'Live progress of a study as JSON (what the progress page polls), with its redrawn sections',
        tags: ['console'],
        params: studyParams,
        response: {
          200: progressReply,
          ...errors,
        },
      },
    },
    async (request, reply) => {
      const progress = await readStudyProgress(db, bank, request.params.studyId);
      reply.header('cache-control', 'no-store');
      return {
        progress: progress as unknown as z.infer<typeof progressReply>['progress'],
        exposureText: exposureSentence(progress),
        html: renderProgressSections(progress).toString(),
      };
    },
  );

  app.get(
    '/console/item-count',
    {
      schema: {
        summary: "How many active bank items a study pool's filters select (the study form's live count)",
        tags: ['console'],
        querystring: z.object({
          chartTypes: repeated,
          levels: repeated,
          scenarios: repeated,
          /** A study whose pool lists item ids: the filters narrow that list, as on save. */
          study: z.string().min(1).max(100).optional(),
        }),
        response: { 200: z.object({ count: z.number().int(), sentence: z.string() }), ...errors },
      },
    },
    async (request) => {
      const asList = (v: string | string[] | undefined) =>
        v === undefined ? undefined : (Array.isArray(v) ? v : [v]).filter((x) => x !== '');
      const listed =
        request.query.study === undefined
          ? undefined
          : (await getStudy(db, bank, request.query.study)).settings.pool.itemIds;
      const parsed = itemPoolSchema.safeParse({
        chartTypes: asList(request.query.chartTypes),
        levels: asList(request.query.levels),
        scenarios: asList(request.query.scenarios),
        ...(listed === undefined ? {} : { itemIds: listed }),
      });
      if (!parsed.success) {
        const problems = parsed.error.issues.map((issue) => ({
          field: ['query', ...issue.path.map(String)].join('.'),
          problem: issue.message,
        }));
        throw new AppError('VALIDATION_FAILED', `${problems[0]!.field}: ${problems[0]!.problem}`, {
          problems,
        });
      }
      const count = countItems(parsed.data, await listRetiredItemIds(db));
      return { count, sentence: countSentence(count) };
    },
  );

  serveAssets(app, '/console-assets/:name', assets, {
    summary: "The console's style sheet and script",
    tag: 'console',
  });
};

function newStudyMain(form: ReturnType<typeof renderStudyForm>) {
  return html`<p class="breadcrumb"><a href="/console">Studies</a></p>
<h1>New study</h1>
<p>Choose the items, the form design and what respondents see first. You can change all of it later; attempts already started keep their items.</p>
${form}`;
}
