import { html } from './html.js';

/**
 * A plain page for a team member's browser when a console or report page cannot be shown (an old link
 * to a study that is gone, a mistyped filter in the address): the same message the API gives, in
 * words, with a way back. API clients keep getting the JSON error body.
 */
export function renderErrorPage(options: { status: number; message: string }): string {
  const heading = options.status === 404 ? 'Not found' : 'This page cannot be shown';
  return html`<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="referrer" content="no-referrer">
<title>${heading} · plotgauge</title>
<link rel="stylesheet" href="/report-assets/report.css">
</head>
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
