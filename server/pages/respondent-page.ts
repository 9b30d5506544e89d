import { html, jsonScript } from './html.js';
import { renderDocument } from './layout.js';
import type { Strings } from './strings/en.js';

export interface RespondentPageOptions {
  /** The canonical join code (e.g. `WAKT-47`); the script keys its stored token by it. */
  joinCode: string;
}

/**
 * `GET /join/:code`: the shell of the respondent page. The script (assets/respondent.js) reads
 * the strings from the JSON block, then drives welcome → consent → background → charts → end
 * through the JSON API, one screen at a time inside <main>.
 */
export function renderRespondentPage(strings: Strings, options: RespondentPageOptions): string {
  const main = html`<div id="app">
<p class="hint">${strings.loading}</p>
<noscript><p class="form-error">${strings.noScript}</p></noscript>
</div>`;
  const end = html`${jsonScript('strings', strings)}
<script type="module" src="/assets/respondent.js"></script>`;
  return renderDocument({ strings, title: strings.pageTitle, main, end, joinCode: options.joinCode });
}
