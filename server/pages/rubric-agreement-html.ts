import type { ReportRow } from '../reports/report-rows.js';
import { rowKey } from '../reports/report-rows.js';
import type { RubricAgreementSection } from '../reports/rubric-agreement-section.js';
import { html, type SafeHtml } from './html.js';

/** One rubric number as `<data>` with the CSV row's key, or "n/a". */
function cell(rows: Map<string, ReportRow>, subject: string, measure: string, interval = false): SafeHtml {
  const key = rowKey({ section: 'rubric', audience: '', subject, measure });
  const row = rows.get(key);
  const value = row?.value;
  if (value === null || value === undefined) return html`<span>n/a</span>`;
  const text = typeof value === 'number' && !Number.isInteger(value) ? value.toFixed(2) : String(value);
  const range =
    interval && row?.lower !== null && row?.upper !== null && row !== undefined
      ? ` (${row.lower.toFixed(2)} to ${row.upper.toFixed(2)})`
      : '';
  return html`<data value="${String(value)}" data-key="${key}">${text}</data>${range}`;
}

/**
 * The report page's rubric section: per short-text item, how many answers two raters scored, their
 * quadratic-weighted kappa with its 95% interval, exact agreement, and the item's partial credit steps.
 */
export function renderRubricAgreementSection(
  section: RubricAgreementSection,
  rows: Map<string, ReportRow>,
): SafeHtml {
  return html`<section class="rubric">
<h2>Short-text answers: rubric scores and rater agreement</h2>
<table class="rubric-items"><thead><tr><th scope="col">Item</th><th scope="col">Scored twice</th><th scope="col">Weighted kappa (95% interval)</th><th scope="col">Same score</th><th scope="col">Step 1 (logits)</th><th scope="col">Step 2 (logits)</th></tr></thead>
<tbody>${section.items.map((item) => html`<tr><th scope="row">${item.itemId}</th><td>${cell(rows, item.itemId, 'double_scored')}</td><td>${cell(rows, item.itemId, 'weighted_kappa', true)}</td><td>${cell(rows, item.itemId, 'exact_agreement')}</td><td>${cell(rows, item.itemId, 'step_1')}</td><td>${cell(rows, item.itemId, 'step_2')}</td></tr>`)}</tbody></table>
<p class="method"><strong>How.</strong> ${section.method}</p>
</section>`;
}
