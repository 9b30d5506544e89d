import { documentHead } from './document-head.js';
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
  return html`${documentHead({ lang: strings.lang, title: parts.title, stylesheets: ['/assets/respondent.css'] })}
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
