import type { ChartRenderer } from '../../bank/chart-renderer.js';
import type { ItemStatusChange } from '../../storage/item-status-repository.js';
import { html, type SafeHtml } from '../html.js';
import { bankStylesheet, itemStatistics, respondentPreview } from './bank-browser-page.js';
import type { BankItemFacts } from './bank-item-facts.js';

/** One stored version of the item (`items` table). */
export interface StoredItemVersion {
  version: number;
  contentHash: string;
  firstSeenAt: string;
}

export interface BankItemPageInput {
  facts: BankItemFacts;
  versions: readonly StoredItemVersion[];
  history: readonly ItemStatusChange[];
  /** Admins see the retire (or reinstate) form; analysts only read. */
  canChange: boolean;
  csrfToken: string;
  /** A notice after a change (shown in a status region). */
  notice?: string | undefined;
  /** A refused change: the problem, and the reason as typed, to show again. */
  error?: { message: string; reason: string } | undefined;
}

/** When, in UTC, without seconds: "2031-06-01 09:00 UTC". */
function when(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

function versionsTable(input: BankItemPageInput): SafeHtml {
  const current = input.facts.item.version;
  if (input.versions.length === 0) {
    return html`<p>No version stored yet: it is recorded the first time the item is delivered or changed.</p>`;
  }
  return html`<div class="table-wrap"><table class="bank-table">
<caption>Stored versions (a change to what respondents see makes a new one)</caption>
<thead><tr><th scope="col">Version</th><th scope="col">Content hash</th><th scope="col">First seen</th><th scope="col">In the bank now</th></tr></thead>
<tbody>${input.versions.map(
    (v) =>
      html`<tr><td>${v.version}</td><td><code>${v.contentHash.slice(0, 12)}</code></td><td>${when(v.firstSeenAt)}</td><td>${v.contentHash === current ? 'yes' : 'no'}</td></tr>`,
  )}</tbody>
</table></div>`;
}

function historyTable(history: readonly ItemStatusChange[]): SafeHtml {
  if (history.length === 0) return html`<p>The team has not retired or reinstated this item.</p>`;
  return html`<div class="table-wrap"><table class="bank-table">
<caption>Status changes, oldest first (each change is a new entry; none is ever edited)</caption>
<thead><tr><th scope="col">Change</th><th scope="col">Status</th><th scope="col">Version</th><th scope="col">Reason</th><th scope="col">By</th><th scope="col">When</th></tr></thead>
<tbody>${history.map(
    (c) =>
      html`<tr><td>${c.changeNumber}</td><td>${c.status}</td><td>${c.itemVersion}</td><td>${c.reason}</td><td>${c.actor}</td><td>${when(c.changedAt)}</td></tr>`,
  )}</tbody>
</table></div>`;
}

function changeForm(input: BankItemPageInput): SafeHtml {
  const { item, status } = input.facts;
  if (!input.canChange) return html`<p>An admin can retire or reinstate items.</p>`;
  if (item.status !== 'active') {
    return html`<p>The item's file marks it ${item.status}; change the file to bring it back.</p>`;
  }
  const retiring = status === 'active';
  const action = `/console/bank/${encodeURIComponent(item.id)}/${retiring ? 'retire' : 'reinstate'}`;
  const error = input.error;
  return html`<form method="post" action="${action}" class="bank-change">
<input type="hidden" name="csrf" value="${input.csrfToken}">
<p>${
    retiring
      ? 'Retiring adds an entry to the log: new attempts no longer get this item, attempts under way keep it, and its stored answers still count in calibrations.'
      : 'Reinstating adds an entry to the log: new attempts may get this item again.'
  }</p>
${error === undefined ? '' : html`<p class="field-error" id="reason-error" role="alert">${error.message}</p>`}
<div class="field">
<label for="reason">Reason (kept in the log)</label>
<textarea id="reason" name="reason" rows="3" maxlength="500" required${error === undefined ? '' : html` aria-invalid="true" aria-describedby="reason-error"`}>${error?.reason ?? ''}</textarea>
</div>
<button type="submit">${retiring ? 'Retire this item' : 'Reinstate this item'}</button>
</form>`;
}

/**
 * `GET /console/bank/:itemId`: one item as respondents see it, its statistics, its stored versions,
 * its status history and, for admins, the form that retires (or reinstates) it.
 */
export function bankItemMain(input: BankItemPageInput, render: ChartRenderer): SafeHtml {
  const { facts } = input;
  const { item } = facts;
  const calibration = facts.calibration;
  return html`${bankStylesheet}
<p class="breadcrumb"><a href="/console/bank">Item bank</a></p>
<h1>Item ${item.id}</h1>
${input.notice === undefined ? '' : html`<p class="notice-ok" role="status">${input.notice}</p>`}
<p class="bank-tags">${item.chart.type} · ${item.level} · ${item.scenario} · <span class="bank-status bank-status-${facts.status}">${facts.status}</span></p>
<section aria-labelledby="as-seen">
<h2 id="as-seen">As respondents see it</h2>
${respondentPreview(item, render, `d-${item.id}-`)}
</section>
<section aria-labelledby="statistics">
<h2 id="statistics">What the calibrations say</h2>
${itemStatistics(facts)}
${
  calibration === undefined
    ? ''
    : html`<p class="bank-source">From calibration <code>${calibration.calibrationId.slice(0, 8)}</code> of ${when(calibration.calibratedAt)} (version ${calibration.itemVersion}${calibration.anchored ? ', anchored' : ''}).</p>`
}
</section>
<section aria-labelledby="versions">
<h2 id="versions">Versions</h2>
${versionsTable(input)}
</section>
<section aria-labelledby="history">
<h2 id="history">Status history</h2>
${historyTable(input.history)}
</section>
<section aria-labelledby="change">
<h2 id="change">Change its status</h2>
${changeForm(input)}
</section>`;
}
