import { html } from './html.js';
import { renderDocument } from './layout.js';
import type { Strings } from './strings/en.js';

export interface StartPageOptions {
  /** What the person typed, shown again after a miss. */
  typed?: string;
  /** A message about the code (unknown code). */
  error?: string;
}

/**
 * `GET /`: a form asking for the join code. It works without JavaScript: the form goes to
 * `GET /join?code=...`, which redirects to the respondent page of that code.
 */
export function renderStartPage(strings: Strings, options: StartPageOptions): string {
  const error = options.error;
  const main = html`<section class="screen start" aria-labelledby="screen-heading">
<h1 id="screen-heading">${strings.startHeading}</h1>
<p class="lead">${strings.startIntro}</p>
<form method="get" action="/join" class="code-form">
${error ? html`<p id="code-error" class="form-error" role="alert">${error}</p>` : ''}
<p>
<label for="code" class="text-label">${strings.codeLabel}</label>
<span id="code-hint" class="hint">${strings.codeHint}</span>
</p>
<p>
<input id="code" name="code" type="text" class="code-input" autocomplete="off" autocapitalize="characters" spellcheck="false" maxlength="20" required aria-describedby="${error ? 'code-error code-hint' : 'code-hint'}"${error ? html` aria-invalid="true"` : ''} value="${options.typed ?? ''}">
</p>
<div class="actions"><button type="submit" class="button primary">${strings.codeSubmit}</button></div>
</form>
</section>`;
  return renderDocument({ strings, title: strings.pageTitle, main });
}
