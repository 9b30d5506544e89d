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
  'GET /studies/:studyId/report': 'analyst',
  'GET /bank': 'analyst',
  'GET /bank/:file': 'analyst',
};

/** Console pages: a browser without a sign-in is sent to /sign-in instead of getting a 401. */
export const consolePages: ReadonlySet<string> = new Set(['GET /studies/:studyId/report', 'GET /bank']);

/** The access a route needs: its own `config.access`, else the table, else admin. */
export function accessOf(method: string, url: string, declared: Access | undefined): Access {
  if (declared !== undefined) return declared;
  const key = `${method === 'HEAD' ? 'GET' : method} ${url}`;
  return routeAccess[key] ?? 'admin';
}
