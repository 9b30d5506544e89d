import { documentHead } from './document-head.js';
import { html } from './html.js';

/**
 * A plain page for a team member's browser when a console or report page cannot be shown (an old link
 * to a study that is gone, a mistyped filter in the address): the same message the API gives, in
 * words, with a way back. API clients keep getting the JSON error body.
 */
export function renderErrorPage(options: { status: number; message: string }): string {
  const heading = options.status === 404 ? 'Not found' : 'This page cannot be shown';
  return html`${documentHead({ title: `${heading} · plotgauge`, stylesheets: ['/report-assets/report.css'] })}
<body>
<main class="sign-in">
<h1>${heading}</h1>
<p>${options.message}</p>
<p><a href="/console">Back to the studies</a></p>
</main>
</body>
</html>
`.toString();
}
