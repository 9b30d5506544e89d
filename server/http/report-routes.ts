import type { FastifyReply } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { Config } from '../config.js';
import type { DeliveryBank } from '../delivery/delivery-bank.js';
import { renderReportPage } from '../pages/report-page.js';
import { renderSignInPage } from '../pages/report-sign-in-page.js';
import { buildReport } from '../reports/build-report.js';
import { calibrateStudy } from '../reports/calibrate-study.js';
import type { ReportItemInfo } from '../reports/compose-report.js';
import { estimatesToCsv, exportItemParameters, exportPersonEstimates } from '../reports/export-estimates.js';
import { parseFairnessQuery } from '../reports/fairness-service.js';
import { reportToCsv } from '../reports/report-rows.js';
import type { Report } from '../reports/report-types.js';
import { listCohorts } from '../storage/cohort-repository.js';
import { consoleCookieValue, principalOfToken } from './access-control.js';
import { consoleCookieHeader, safeNextPath, signOutCookieHeader } from './console-auth.js';
import { errorBodySchema, studyParams } from './schemas.js';
import { readPageAssets, serveAssets } from './served-assets.js';

const reportQuery = z.strictObject({
  cohort: z.string().min(1).max(100).optional(),
  /** Two cohort ids, `from,to`: differences are to − from. */
  compare: z
    .string()
    .max(201)
    .regex(/^[^,]+,[^,]+$/, 'must be two cohort ids separated by a comma: from,to')
    .optional(),
  /** Fairness section: `<question>:<reference answer>,<focal answer>` or `cohorts:<reference>,<focal>`. */
  fairness: z.string().max(300).optional(),
});
const errors = { 400: errorBodySchema, 401: errorBodySchema, 404: errorBodySchema, 409: errorBodySchema };
const intervalSchema = z.object({ lower: z.number(), upper: z.number() }).nullable();

/** The report's answer schema (the report object; see server/reports/report-types.ts). */
const reportSchema = z.looseObject({
  kind: z.literal('plotgauge-readability-report'),
  study: z.object({ id: z.string(), title: z.string() }),
  scope: z.enum(['study', 'cohort', 'comparison']),
  calibration: z.looseObject({ id: z.string(), createdAt: z.string(), responseCount: z.number() }),
  settings: z.looseObject({
    responseProbability: z.number(),
    ceilingShare: z.number(),
    confidenceLevel: z.number(),
  }),
  audiences: z.array(
    z.looseObject({
      key: z.string(),
      label: z.string(),
      respondents: z.number(),
      ability: z.object({
        mean: z.number(),
        meanInterval: intervalSchema,
        sd: z.number(),
        sdInterval: intervalSchema,
      }),
      profile: z.array(z.looseObject({ chartType: z.string(), level: z.string(), shareAtRp: z.number() })),
    }),
  ),
  comparison: z.looseObject({ meanDifference: z.number(), effectSize: z.number() }).nullable(),
  items: z.array(z.looseObject({ itemId: z.string(), difficulty: z.number() })),
  foot: z.object({
    method: z.string(),
    thresholds: z.string(),
    calibration: z.string(),
    caution: z.string(),
  }),
});

const assets = readPageAssets(['report.css', 'sign-in.js']);

/** Chart type and task level of a bank item, for the report. */
export function reportItemInfo(bank: DeliveryBank) {
  return (itemId: string): ReportItemInfo | undefined => {
    const entry = bank.get(itemId);
    return entry ? { chartType: entry.item.chart.type, level: entry.item.level } : undefined;
  };
}

function optionsFrom(query: z.infer<typeof reportQuery>) {
  const compare = query.compare?.split(',').map((s) => s.trim()) as [string, string] | undefined;
  return {
    ...(query.cohort === undefined ? {} : { cohortId: query.cohort }),
    ...(compare === undefined ? {} : { compare }),
    ...(query.fairness === undefined ? {} : { fairness: parseFairnessQuery(query.fairness) }),
  };
}

function sendHtml(reply: FastifyReply, status: number, page: string) {
  return reply.code(status).header('cache-control', 'no-store').type('text/html; charset=utf-8').send(page);
}

function sendCsv(reply: FastifyReply, name: string, csv: string) {
  return reply
    .type('text/csv; charset=utf-8')
    .header('content-disposition', `attachment; filename="${name}"`)
    .serializer((payload: unknown) => payload as string)
    .send(csv);
}

/**
 * The readability report, three ways from one report object: JSON (`/api/admin/studies/:id/report`),
 * CSV (`…/report.csv`) and an HTML page (`/studies/:id/report`); the calibration (`POST …/calibrations`);
 * exports of item parameters and person estimates; and the console's sign-in (`/sign-in`). JSON and CSV
 * take the admin bearer token or the console cookie; the page sends a browser without either to the
 * sign-in form (server/http/access-control.ts decides, for every route).
 */
export const reportRoutes: FastifyPluginAsyncZod<{ bank: DeliveryBank; config: Config }> = async (
  app,
  { bank, config },
) => {
  const db = app.db;
  const info = reportItemInfo(bank);
  const build = (studyId: string, query: z.infer<typeof reportQuery>): Promise<Report> =>
    buildReport(db, info, studyId, optionsFrom(query));

  app.addContentTypeParser(
    'application/x-www-form-urlencoded',
    { parseAs: 'string' },
    (_request, body, done) => {
      done(null, Object.fromEntries(new URLSearchParams(body as string)));
    },
  );

  app.get(
    '/api/admin/studies/:studyId/report',
    {
      schema: {
        summary:
          'Readability report of a study, a cohort (?cohort=) or two cohorts compared (?compare=from,to)',
        tags: ['reports'],
        params: studyParams,
        querystring: reportQuery,
        response: { 200: reportSchema, ...errors },
      },
    },
    // The report's readonly arrays are what the schema describes; the cast only drops `readonly`.
    async (request) =>
      (await build(request.params.studyId, request.query)) as unknown as z.infer<typeof reportSchema>,
  );

  app.get(
    '/api/admin/studies/:studyId/report.csv',
    {
      schema: {
        summary: 'The readability report as CSV: one row per number, with its interval',
        tags: ['reports'],
        params: studyParams,
        querystring: reportQuery,
        response: { 200: z.string(), ...errors },
      },
    },
    async (request, reply) =>
      sendCsv(reply, 'report.csv', reportToCsv(await build(request.params.studyId, request.query))),
  );

  app.post(
    '/api/admin/studies/:studyId/calibrations',
    {
      schema: {
        summary: 'Calibrate the study now (MML, cohorts as groups) and store the calibration',
        tags: ['reports'],
        params: studyParams,
        response: {
          201: z.object({
            id: z.string(),
            converged: z.boolean(),
            iterations: z.number(),
            responseCount: z.number(),
            itemsCalibrated: z.number(),
            itemsNotCalibrated: z.number(),
          }),
          ...errors,
        },
      },
    },
    async (request, reply) => {
      const calibration = await calibrateStudy(db, request.params.studyId);
      return reply.code(201).send({
        id: calibration.record.id,
        converged: calibration.record.converged,
        iterations: calibration.record.iterations,
        responseCount: calibration.record.responseCount,
        itemsCalibrated: calibration.items.length,
        itemsNotCalibrated: calibration.settings.uncalibrated.length,
      });
    },
  );

  app.get(
    '/api/admin/studies/:studyId/estimates/:what',
    {
      schema: {
        summary:
          'Item parameters (items.csv, items.json) or person estimates (persons.csv, persons.json; ?background=true adds background answers)',
        tags: ['reports'],
        params: studyParams.extend({
          what: z.enum(['items.csv', 'items.json', 'persons.csv', 'persons.json']),
        }),
        querystring: z.strictObject({ background: z.enum(['true', 'false']).default('false') }),
        response: { 200: z.union([z.string(), z.array(z.record(z.string(), z.unknown()))]), ...errors },
      },
    },
    async (request, reply) => {
      const { studyId, what } = request.params;
      const table = what.startsWith('items')
        ? exportItemParameters(await build(studyId, {}))
        : await exportPersonEstimates(db, studyId, { background: request.query.background === 'true' });
      if (what.endsWith('.json'))
        return table.rows.map((row) => Object.fromEntries(table.columns.map((c, i) => [c, row[i]])));
      return sendCsv(reply, what, estimatesToCsv(table));
    },
  );

  app.get(
    '/studies/:studyId/report',
    {
      schema: {
        summary: 'The readability report as a page (sign in first)',
        tags: ['reports'],
        params: studyParams,
        querystring: reportQuery,
        response: { 200: z.string(), 303: z.null(), ...errors },
      },
    },
    async (request, reply) => {
      const { studyId } = request.params;
      const report = await build(studyId, request.query);
      const cohorts = await listCohorts(db, studyId);
      const base = `/studies/${encodeURIComponent(studyId)}/report`;
      const query = request.url.includes('?') ? request.url.slice(request.url.indexOf('?')) : '';
      const pairs: [number, number][] =
        cohorts.length >= 4
          ? [
              [0, 1],
              [2, 3],
            ]
          : cohorts.length >= 2
            ? [[0, 1]]
            : [];
      const page = renderReportPage(report, {
        studyUrl: base,
        cohorts: cohorts.map((c) => ({ label: c.label, url: `${base}?cohort=${encodeURIComponent(c.id)}` })),
        comparisons: pairs.map(([a, b]) => ({
          label: `${cohorts[b]!.label} vs ${cohorts[a]!.label}`,
          url: `${base}?compare=${encodeURIComponent(cohorts[a]!.id)},${encodeURIComponent(cohorts[b]!.id)}`,
        })),
        jsonUrl: `/api/admin/studies/${encodeURIComponent(studyId)}/report${query}`,
        csvUrl: `/api/admin/studies/${encodeURIComponent(studyId)}/report.csv${query}`,
      });
      return sendHtml(reply, 200, page);
    },
  );

  app.get(
    '/sign-in',
    {
      schema: {
        summary: 'Sign-in form of the report pages',
        tags: ['reports'],
        querystring: z.object({ next: z.string().max(500).optional() }),
        response: { 200: z.string() },
      },
    },
    async (request, reply) =>
      sendHtml(reply, 200, renderSignInPage({ next: safeNextPath(request.query.next) })),
  );

  app.post(
    '/sign-in',
    {
      schema: {
        summary: 'Compares the token in constant time and sets the console cookie',
        tags: ['reports'],
        body: z.object({ token: z.string().max(500), next: z.string().max(500).optional() }),
        response: { 303: z.null(), 401: z.string() },
      },
    },
    async (request, reply) => {
      const next = safeNextPath(request.body.next);
      const principal = await principalOfToken(request.body.token, { adminToken: config.adminToken, db });
      if (principal === undefined) {
        return sendHtml(reply, 401, renderSignInPage({ next, error: 'That token is not right.' }));
      }
      const secure = request.protocol === 'https';
      return reply
        .code(303)
        .header('set-cookie', consoleCookieHeader(consoleCookieValue(principal), secure))
        .header('cache-control', 'no-store')
        .redirect(next, 303);
    },
  );

  app.post(
    '/sign-out',
    { schema: { summary: 'Removes the console cookie', tags: ['reports'], response: { 303: z.null() } } },
    async (_request, reply) =>
      reply.code(303).header('set-cookie', signOutCookieHeader).redirect('/sign-in', 303),
  );

  serveAssets(app, '/report-assets/:name', assets, {
    summary: 'Style sheet and sign-in script of the report pages',
    tag: 'reports',
  });
};
