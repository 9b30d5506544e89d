import type { FairnessSection } from '../reports/fairness-section.js';
import type { ReportRow } from '../reports/report-rows.js';
import { rowKey } from '../reports/report-rows.js';
import { html, type SafeHtml } from './html.js';

/** One fairness number as `<data>` with the CSV row's key, or "n/a". */
function cell(rows: Map<string, ReportRow>, subject: string, measure: string): SafeHtml {
  const key = rowKey({ section: 'fairness', audience: '', subject, measure });
  const value = rows.get(key)?.value;
  if (value === null || value === undefined) return html`<span>n/a</span>`;
  const text = typeof value === 'number' && !Number.isInteger(value) ? value.toFixed(2) : String(value);
  return html`<data value="${String(value)}" data-key="${key}">${text}</data>`;
}

/**
 * The report page's Fairness section: the flagged (B and C) items explained, the comparison with and
 * without them, how small strata are handled, and every item's MH and Rasch numbers in a table.
 * Numbers come from the report's rows (see fairness-rows.ts), so the page and the CSV agree.
 */
export function renderFairnessSection(section: FairnessSection, rows: Map<string, ReportRow>): SafeHtml {
  const flagged = section.items.filter((item) => item.flagged);
  const without = section.comparison.flaggedExcluded;
  return html`<section class="fairness">
<h2>Fairness: do the items work the same for ${section.focalLabel} and ${section.referenceLabel}?</h2>
<p>${section.sentence}</p>
${flagged.length > 0 ? html`<ul class="sentences">${flagged.map((item) => html`<li>${item.explanation ?? `Item ${item.itemId}: class ${item.etsClass ?? 'n/a'}.`}</li>`)}</ul>` : ''}
<table class="fairness-comparison"><thead><tr><th scope="col">Items</th><th scope="col">Count</th><th scope="col">${section.referenceLabel} mean</th><th scope="col">${section.focalLabel} mean</th><th scope="col">Difference (logits)</th></tr></thead>
<tbody><tr><th scope="row">All calibrated items</th><td>${cell(rows, 'all-items', 'item_count')}</td><td>${cell(rows, 'all-items', 'reference_mean')}</td><td>${cell(rows, 'all-items', 'focal_mean')}</td><td>${cell(rows, 'all-items', 'difference')}</td></tr>
${without ? html`<tr><th scope="row">Flagged items left out</th><td>${cell(rows, 'flagged-excluded', 'item_count')}</td><td>${cell(rows, 'flagged-excluded', 'reference_mean')}</td><td>${cell(rows, 'flagged-excluded', 'focal_mean')}</td><td>${cell(rows, 'flagged-excluded', 'difference')}</td></tr>` : ''}</tbody></table>
<details class="screen-only"><summary>Every item: Mantel-Haenszel and Rasch contrast</summary>
<table class="fairness-items"><thead><tr><th scope="col">Item</th><th scope="col">ETS class</th><th scope="col">MH D-DIF</th><th scope="col">SE</th><th scope="col">MH χ² (corrected)</th><th scope="col">p</th><th scope="col">Strata used</th><th scope="col">Rasch contrast</th><th scope="col">SE</th></tr></thead>
<tbody>${section.items.map((item) => html`<tr${item.flagged ? html` class="flagged"` : ''}><th scope="row">${item.itemId}</th><td>${cell(rows, item.itemId, 'ets_class')}</td><td>${cell(rows, item.itemId, 'mh_d_dif')}</td><td>${cell(rows, item.itemId, 'mh_d_dif_se')}</td><td>${cell(rows, item.itemId, 'mh_chi_squared')}</td><td>${cell(rows, item.itemId, 'mh_p_value')}</td><td>${cell(rows, item.itemId, 'strata_used')}</td><td>${cell(rows, item.itemId, 'rasch_contrast')}</td><td>${cell(rows, item.itemId, 'rasch_contrast_se')}</td></tr>`)}</tbody></table></details>
<p class="method"><strong>How.</strong> ${section.method} ${section.smallStrata}</p>
</section>`;
}
