import { documentHead } from './document-head.js';
import { html } from './html.js';

/**
 * The console's sign-in page: one password field for the admin token and a hidden `next` path. A link
 * of the form `/sign-in?next=…#token=…` signs in without typing: the small same-origin script
 * (/report-assets/sign-in.js) moves the token from the URL fragment, which browsers never send to the
 * server or write to its logs, into the form and submits it.
 */
export function renderSignInPage(options: { next: string; error?: string }): string {
  return html`${documentHead({ title: 'Sign in · plotgauge', stylesheets: ['/report-assets/report.css'] })}
<body>
<main class="sign-in">
<h1>Sign in to plotgauge</h1>
${options.error ? html`<p class="notice" role="alert">${options.error}</p>` : ''}
<form method="post" action="/sign-in" id="sign-in">
<input type="hidden" name="next" value="${options.next}">
<label for="token">Team token</label>
<p id="token-hint" class="hint">An admin or analyst token from <code>plotgauge token create</code>, or the server's ADMIN_TOKEN.</p>
<input type="password" id="token" name="token" autocomplete="current-password" required minlength="16" aria-describedby="token-hint">
<button type="submit">Sign in</button>
</form>
</main>
<script src="/report-assets/sign-in.js"></script>
</body>
</html>
`.toString();
}
