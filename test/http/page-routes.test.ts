import Fastify, { type FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appPlugin, serverOptions } from '../../server/app.js';
import { loadConfig } from '../../server/config.js';
import { contentSecurityPolicy, pageRoutes } from '../../server/http/page-routes.js';
import { en } from '../../server/pages/strings/en.js';
import { createDatabase } from '../../server/storage/create-database.js';

/** All `<script>` and `<link>` tags, and any inline style, of a page. */
function scripts(page: string): string[] {
  return [...page.matchAll(/<script\b[^>]*>/g)].map((match) => match[0]);
}

describe('page routes', () => {
  const url = 'sqlite::memory:';
  const db = createDatabase(url);
  let app: FastifyInstance;
  beforeAll(async () => {
    app = Fastify(serverOptions());
    await app.register(appPlugin, { config: loadConfig({}, { databaseUrl: url }), db });
    if (!app.hasRoute({ method: 'GET', url: '/join/:code' })) await app.register(pageRoutes);
    await app.ready();
  });
  afterAll(async () => {
    await app.close();
    await db.destroy();
  });

  it('serves the start page with a join-code form that works without JavaScript', async () => {
    const response = await request(app.server).get('/').expect(200);
    expect(response.headers['content-type']).toBe('text/html; charset=utf-8');
    expect(response.text).toMatch(/<form method="get" action="\/join"/);
    expect(response.text).toMatch(/<label for="code"/);
    expect(response.text).toContain(en.startHeading);
    expect(scripts(response.text)).toEqual([]);
  });

  it.each(['/', '/join/WAKT-47', '/join/nope', '/assets/respondent.js', '/assets/respondent.css'])(
    'sends the strict security headers with %s',
    async (path) => {
      const response = await request(app.server).get(path);
      // W3C Content Security Policy Level 3: directives as the brief lists them.
      expect(response.headers['content-security-policy']).toBe(contentSecurityPolicy);
      expect(contentSecurityPolicy).toMatch(/default-src 'none'/);
      expect(contentSecurityPolicy).toMatch(/script-src 'self';/);
      expect(contentSecurityPolicy).toMatch(/frame-ancestors 'none'/);
      expect(contentSecurityPolicy).not.toMatch(/unsafe-inline|unsafe-eval|\*/);
      expect(response.headers['x-content-type-options']).toBe('nosniff');
      expect(response.headers['referrer-policy']).toBe('no-referrer');
    },
  );

  it('redirects the form target to the canonical link, ignoring case, spaces and hyphens', async () => {
    const response = await request(app.server).get('/join').query({ code: ' wakt 47 ' }).expect(303);
    expect(response.headers.location).toBe('/join/WAKT-47');
  });

  it('answers a code that cannot exist with 404 and the form again, the typed text escaped', async () => {
    const typed = '"><script>alert(1)</script>';
    const response = await request(app.server).get('/join').query({ code: typed }).expect(404);
    expect(response.text).toContain(en.codeNotFound);
    expect(response.text).toContain('value="&quot;&gt;&lt;script&gt;alert(1)&lt;/script&gt;"');
    expect(response.text).not.toContain('<script>alert');
    expect(response.text).toMatch(/aria-invalid="true"/);
  });

  it('serves the respondent page shell: strings as JSON, one module script, no inline code', async () => {
    const response = await request(app.server).get('/join/wakt-47').expect(200);
    expect(response.headers['cache-control']).toBe('no-store');
    const page = response.text;
    expect(page).toMatch(/<html lang="en">/);
    expect(page).toMatch(/<main id="main" data-join-code="WAKT-47">/);
    expect(page).toMatch(/<p id="status" class="status" role="status" aria-live="polite" hidden><\/p>/);
    expect(scripts(page)).toEqual([
      '<script type="application/json" id="strings">',
      '<script type="module" src="/assets/respondent.js">',
    ]);
    expect(page).not.toMatch(/\sstyle=|<style|\son[a-z]+=/i);
    const json = /<script type="application\/json" id="strings">([^<]*)<\/script>/.exec(page)?.[1] ?? '';
    expect(JSON.parse(json)).toEqual(en);
  });

  it('serves assets with their content types and revalidation', async () => {
    const script = await request(app.server).get('/assets/respondent.js').expect(200);
    expect(script.headers['content-type']).toBe('text/javascript; charset=utf-8');
    expect(script.text).toContain("from './retry.js'");
    const css = await request(app.server).get('/assets/respondent.css').expect(200);
    expect(css.headers['content-type']).toBe('text/css; charset=utf-8');
    expect(css.headers['cache-control']).toBe('public, no-cache');
    const etag = css.headers.etag as string;
    expect(etag).toMatch(/^"[A-Za-z0-9_-]{22}"$/);
    // RFC 9110 section 13.1.2: a matching If-None-Match gets 304 Not Modified without a body.
    const again = await request(app.server)
      .get('/assets/respondent.css')
      .set('if-none-match', etag)
      .expect(304);
    expect(again.text ?? '').toBe('');
  });

  it('serves only the listed assets', async () => {
    const response = await request(app.server).get('/assets/retry.d.ts').expect(404);
    expect(response.body.error.code).toBe('NOT_FOUND');
    await request(app.server).get('/assets/..%2Fhtml.ts').expect(404);
  });
});
