import { html, type SafeHtml } from './html.js';
import type { Strings } from './strings/en.js';

export interface DocumentParts {
  strings: Strings;
  /** The text of <title>. */
  title: string;
  /** The content of <main>. */
  main: SafeHtml;
  /** Extra markup at the end of <body> (for example the strings block and the script tag). */
  end?: SafeHtml;
  /** `data-join-code` on <main> (the respondent page reads it). */
  joinCode?: string;
}

/**
 * The HTML document every respondent page shares: language, viewport, one stylesheet, a polite
 * live region for notices, and no inline script or style (the Content-Security-Policy forbids them).
 */
export function renderDocument(parts: DocumentParts): string {
  const { strings } = parts;
  return html`<!doctype html>
<html lang="${strings.lang}">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="referrer" content="no-referrer">
<title>${parts.title}</title>
<link rel="stylesheet" href="/assets/respondent.css">
</head>
<body>
<main id="main" data-join-code="${parts.joinCode ?? ''}">
<p id="status" class="status" role="status" aria-live="polite" hidden></p>
${parts.main}
</main>
${parts.end ?? ''}
</body>
</html>
`.toString();
}
