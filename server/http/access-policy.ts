/**
 * Who may call which route. One table for the routes that exist; a route may also say it itself
 * with `config: { access: … }`. Anything neither names is admin-only, so a route added later is
 * closed until someone opens it on purpose.
 *
 * - `public`: anyone (health, OpenAPI, respondent pages and assets, join, sign-in);
 * - `respondent`: the handler itself checks the attempt token and reaches only that attempt;
 * - `analyst`: reads reports, exports, the bank gallery (an admin token passes too);
 * - `admin`: changes studies, cohorts, items, pilots.
 */
export const accessLevels = ['public', 'respondent', 'analyst', 'admin'] as const;
export type Access = (typeof accessLevels)[number];

declare module 'fastify' {
  interface FastifyContextConfig {
    /** Who may call this route; see server/http/access-policy.ts. Unset: the policy table, else admin. */
    access?: Access;
  }
}

/** Routes by `METHOD url` (url as registered, with `:params`). HEAD follows GET. */
export const routeAccess: Readonly<Record<string, Access>> = {
  'GET /health': 'public',
  'GET /ready': 'public',
  'GET /api/openapi.json': 'public',
  'GET /': 'public',
  'GET /join': 'public',
  'GET /join/:code': 'public',
  'GET /assets/:name': 'public',
  'GET /sign-in': 'public',
  'POST /sign-in': 'public',
  'POST /sign-out': 'public',
  'GET /report-assets/:name': 'public',
  'GET /bank/gallery.css': 'public',
  'POST /api/join': 'public',
  'GET /api/attempt': 'respondent',
  'POST /api/attempt/consent': 'respondent',
  'POST /api/attempt/background': 'respondent',
  'POST /api/attempt/responses': 'respondent',
  'POST /api/attempt/leave': 'respondent',
  'GET /api/admin/studies': 'analyst',
  'GET /api/admin/studies/:studyId': 'analyst',
  'GET /api/admin/studies/:studyId/export': 'analyst',
  'GET /api/admin/studies/:studyId/report': 'analyst',
  'GET /api/admin/studies/:studyId/report.csv': 'analyst',
  'GET /api/admin/studies/:studyId/estimates/:what': 'analyst',
  /** The design check reads the latest calibration and changes nothing. */
  'POST /api/admin/studies/:studyId/predict': 'analyst',
  'GET /studies/:studyId/report': 'analyst',
  'GET /bank': 'analyst',
  'GET /bank/:file': 'analyst',
  // Console (server/http/console-routes.ts): analysts read, admins change.
  'GET /console': 'analyst',
  'GET /console/studies/new': 'admin',
  'POST /console/studies/new': 'admin',
  'GET /console/studies/:studyId': 'analyst',
  'POST /console/studies/:studyId': 'admin',
  'GET /console/studies/:studyId/cohorts': 'analyst',
  'POST /console/studies/:studyId/cohorts': 'admin',
  'GET /console/studies/:studyId/cohorts/:cohortId/sign': 'analyst',
  'GET /console/studies/:studyId/compare': 'analyst',
  'GET /console/studies/:studyId/progress': 'analyst',
  'GET /console/studies/:studyId/progress.json': 'analyst',
  'GET /console/item-count': 'analyst',
  'GET /console-assets/:name': 'public',
  // Console bank pages (server/http/console-bank-routes.ts): analysts read, admins retire and add pilots.
  'GET /console/bank': 'analyst',
  'GET /console/bank/bank.css': 'analyst',
  'GET /console/bank/:itemId': 'analyst',
  'GET /console/bank/:itemId/retire': 'analyst',
  'POST /console/bank/:itemId/retire': 'admin',
  'GET /console/bank/:itemId/reinstate': 'analyst',
  'POST /console/bank/:itemId/reinstate': 'admin',
  'GET /console/studies/:studyId/pilots': 'admin',
  'GET /console/studies/:studyId/pilots/new': 'admin',
  'POST /console/studies/:studyId/pilots': 'admin',
  'GET /console/studies/:studyId/pilots/:pilotId/retire': 'admin',
  'POST /console/studies/:studyId/pilots/:pilotId/retire': 'admin',
  'GET /console/studies/:studyId/calibrate': 'admin',
  'POST /console/studies/:studyId/calibrate': 'admin',
  // Console scoring queue (server/http/console-scoring-routes.ts): admin, like the scoring API.
  'GET /console/scoring': 'admin',
  'POST /console/scoring/:entryId': 'admin',
  'GET /api/admin/items/:itemId/status': 'analyst',
  /** Stored exposure controls of a study (tuning one, POST, stays admin). */
  'GET /api/admin/studies/:studyId/exposure-control': 'analyst',
};

/** Console pages: a browser without a sign-in is sent to /sign-in instead of getting a 401. */
export const consolePages: ReadonlySet<string> = new Set([
  'GET /studies/:studyId/report',
  'GET /bank',
  // Console pages, and its form posts: a signed-out form post goes to /sign-in?next=<the form's page>.
  'GET /console',
  'GET /console/studies/new',
  'POST /console/studies/new',
  'GET /console/studies/:studyId',
  'POST /console/studies/:studyId',
  'GET /console/studies/:studyId/cohorts',
  'POST /console/studies/:studyId/cohorts',
  'GET /console/studies/:studyId/cohorts/:cohortId/sign',
  'GET /console/studies/:studyId/compare',
  'GET /console/studies/:studyId/progress',
  'GET /console/bank',
  'GET /console/bank/:itemId',
  'GET /console/bank/:itemId/retire',
  'POST /console/bank/:itemId/retire',
  'GET /console/bank/:itemId/reinstate',
  'POST /console/bank/:itemId/reinstate',
  'GET /console/studies/:studyId/pilots',
  'GET /console/studies/:studyId/pilots/new',
  'POST /console/studies/:studyId/pilots',
  'GET /console/studies/:studyId/pilots/:pilotId/retire',
  'POST /console/studies/:studyId/pilots/:pilotId/retire',
  'GET /console/studies/:studyId/calibrate',
  'POST /console/studies/:studyId/calibrate',
  'GET /console/scoring',
  'POST /console/scoring/:entryId',
]);

/** The access a route needs: its own `config.access`, else the table, else admin. */
export function accessOf(method: string, url: string, declared: Access | undefined): Access {
  if (declared !== undefined) return declared;
  const key = `${method === 'HEAD' ? 'GET' : method} ${url}`;
  return routeAccess[key] ?? 'admin';
}
