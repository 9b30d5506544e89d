import type { ChartRenderer } from '../../bank/chart-renderer.js';
import { taskLevels } from '../../bank/item-schema.js';
import type { BankItem, ItemBank } from '../../bank/load-bank.js';
import { toRespondentView } from '../../bank/respondent-view.js';
import { html, raw, type SafeHtml } from '../html.js';
import {
  type BankItemFacts,
  difficultyText,
  difText,
  exposureText,
  fitRangeText,
  fitText,
} from './bank-item-facts.js';

/** The bank browser's filters (validated by the route); absent means all. */
export interface BankBrowserFilter {
  readonly type?: string | undefined;
  readonly level?: string | undefined;
  readonly scenario?: string | undefined;
  readonly status?: string | undefined;
}

/** Items that pass every given filter, in bank order. */
export function filterBankFacts(facts: readonly BankItemFacts[], filter: BankBrowserFilter): BankItemFacts[] {
  return facts.filter(
    ({ item, status }) =>
      (filter.type === undefined || item.chart.type === filter.type) &&
      (filter.level === undefined || item.level === filter.level) &&
      (filter.scenario === undefined || item.scenario === filter.scenario) &&
      (filter.status === undefined || status === filter.status),
  );
}

/** The link to the stylesheet of the bank pages (the layout has the console's own). */
export const bankStylesheet = html`<link rel="stylesheet" href="/console/bank/bank.css">`;

/**
 * The chart and question of one item as a respondent sees them (the respondent view: no key,
 * rationale or option values), options in their authored order. A chart that cannot be drawn says so.
 */
export function respondentPreview(item: BankItem, render: ChartRenderer, idPrefix: string): SafeHtml {
  try {
    const view = toRespondentView(item, { render, idPrefix });
    const answer =
      view.responseKind === 'numeric'
        ? html`<p class="bank-answer">Answer: a number${view.unit === undefined ? '' : html` in ${view.unit}`}</p>`
        : view.responseKind === 'short-text'
          ? html`<p class="bank-answer">Answer: a few words</p>`
          : html`<ul class="bank-options">${view.options.map((o) => html`<li>${o.text}</li>`)}</ul>`;
    return html`<div class="bank-chart">${raw(view.chartSvg)}</div>
<p class="bank-prompt">${view.prompt}</p>
${answer}
<p class="bank-dont-know">Also offered: "I don't know"</p>`;
  } catch (cause) {
    return html`<p class="bank-problem">The chart cannot be drawn: ${cause instanceof Error ? cause.message : String(cause)}</p>`;
  }
}

/** Difficulty, fit (flagged outside the usual range), DIF class and exposure as a description list. */
export function itemStatistics(facts: BankItemFacts): SafeHtml {
  const fit = fitText(facts.calibration);
  return html`<dl class="bank-stats">
<div><dt>Difficulty</dt><dd>${difficultyText(facts.calibration)}</dd></div>
<div><dt>Fit</dt><dd>${fit.text}${fit.flagged ? html` <strong class="bank-flag">outside ${fitRangeText}</strong>` : ''}</dd></div>
<div><dt>DIF</dt><dd>${difText(facts.dif)}</dd></div>
<div><dt>Exposure</dt><dd>${exposureText(facts.responses, facts.attempts)}</dd></div>
</dl>`;
}

function statusBadge(status: string): SafeHtml {
  return html`<span class="bank-status bank-status-${status}">${status}</span>`;
}

function itemCard(facts: BankItemFacts, render: ChartRenderer): SafeHtml {
  const { item } = facts;
  const headingId = `item-${item.id}`;
  return html`<li><article class="bank-item" aria-labelledby="${headingId}">
<h2 id="${headingId}"><a href="/console/bank/${encodeURIComponent(item.id)}">${item.id}</a></h2>
<p class="bank-tags">${item.chart.type} · ${item.level} · ${item.scenario} · ${statusBadge(facts.status)}</p>
${respondentPreview(item, render, `b-${item.id}-`)}
${itemStatistics(facts)}
</article></li>`;
}

/**
 * `GET /console/bank`: a filter form (a plain GET form: works without JavaScript) and every
 * matching item as a respondent sees it, with its difficulty ± SE, fit, DIF class and exposure.
 */
export function bankBrowserMain(
  bank: Pick<ItemBank, 'scenarios'>,
  all: readonly BankItemFacts[],
  filter: BankBrowserFilter,
  render: ChartRenderer,
): SafeHtml {
  const shown = filterBankFacts(all, filter);
  const types = [...new Set(all.map((f) => f.item.chart.type))].sort();
  const select = (
    name: string,
    label: string,
    values: readonly { value: string; label: string }[],
    chosen: string | undefined,
  ) => html`<div class="bank-filter"><label for="filter-${name}">${label}</label>
<select id="filter-${name}" name="${name}">
<option value="">all</option>
${values.map((v) => html`<option value="${v.value}"${v.value === chosen ? html` selected` : ''}>${v.label}</option>`)}
</select></div>`;
  const plain = (values: readonly string[]) => values.map((value) => ({ value, label: value }));
  return html`${bankStylesheet}
<h1>Item bank</h1>
<p>${shown.length} of ${all.length} items shown. Each shows the chart and question as respondents see them, then what the calibrations say about it. Open an item for its versions, its history and to retire it.</p>
<form method="get" action="/console/bank" class="bank-filters" aria-label="Filter the items">
${select('type', 'Chart type', plain(types), filter.type)}
${select('level', 'Task level', plain(taskLevels), filter.level)}
${select(
  'scenario',
  'Scenario',
  bank.scenarios.map((s) => ({ value: s.id, label: s.name })),
  filter.scenario,
)}
${select('status', 'Status', plain(['active', 'retired', 'draft']), filter.status)}
<button type="submit">Show</button>
</form>
${
  shown.length === 0
    ? html`<p>No items match these filters.</p>`
    : html`<ul class="bank-list">${shown.map((facts) => itemCard(facts, render))}</ul>`
}`;
}
