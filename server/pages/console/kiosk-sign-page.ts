import type { Cohort, Study } from '../../delivery/study-service.js';
import { html, type SafeHtml } from '../html.js';
import { qrImage } from './study-page.js';

/**
 * The first sentence of the consent text, for the sign (at most 160 characters, cut at a word).
 * The full text is shown on the screen before anyone starts.
 */
export function consentLine(consentText: string): string {
  const first = (/^[\s\S]*?[.!?](?=\s|$)/.exec(consentText.trim())?.[0] ?? consentText).trim();
  if (first.length <= 160) return first;
  const cut = first.slice(0, 159);
  return `${cut.slice(0, Math.max(cut.lastIndexOf(' '), 100))}…`;
}

/** The server's start page (its join-code form) from a join link: `…/join/ABCD-12` → `…/`. */
export function startPage(joinUrl: string): string {
  return joinUrl.replace(/\/join\/[^/]*$/, '/');
}

/**
 * A printable sign for one cohort: the study's title, the join code in large type, the QR code of
 * the join link, the link itself and one line of the consent text. The print style sheet
 * (console.css) prints only the sign, on one page.
 */
export function renderKioskSignMain(study: Study, cohort: Cohort, qrSvg: string): SafeHtml {
  const back = `/console/studies/${encodeURIComponent(study.id)}`;
  return html`<p class="breadcrumb screen-only"><a href="/console">Studies</a> › <a href="${back}">${study.title}</a></p>
<div class="screen-only sign-tools">
<h1>Kiosk sign: ${cohort.label}</h1>
<p>Print this page and put it beside the screen or on the wall. Only the sign below is printed.</p>
<button type="button" data-print hidden>Print the sign</button>
</div>
<article class="kiosk-sign" aria-label="Kiosk sign">
<p class="sign-title">${study.title}</p>
<p class="sign-call">Read a few charts with us</p>
<div class="sign-qr">${qrImage(qrSvg, `QR code of the join link ${cohort.joinUrl}`)}</div>
<p class="sign-step">Scan the code, or open <span class="sign-url">${cohort.joinUrl}</span></p>
<p class="sign-step">or go to <span class="sign-url">${startPage(cohort.joinUrl)}</span> and type the code</p>
<p class="sign-code">${cohort.joinCode}</p>
<p class="sign-consent">${consentLine(study.settings.consentText)}</p>
</article>`;
}
