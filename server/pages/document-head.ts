import { type HtmlValue, html, type SafeHtml } from './html.js';

/**
 * The start of every page up to `</head>`: doctype, language, UTF-8, a mobile viewport, no referrer
 * (join codes and study ids sit in page URLs), an empty icon (so browsers do not ask for
 * /favicon.ico and log a 404), the title and the page's own stylesheets. Pages carry
 * no inline script or style: the Content-Security-Policy (access-headers.ts) forbids both.
 */
export function documentHead(parts: {
  lang?: string;
  title: HtmlValue;
  stylesheets: readonly string[];
}): SafeHtml {
  return html`<!doctype html>
<html lang="${parts.lang ?? 'en'}">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="referrer" content="no-referrer">
<link rel="icon" href="data:,">
<title>${parts.title}</title>
${parts.stylesheets.map((href) => html`<link rel="stylesheet" href="${href}">\n`)}</head>`;
}
