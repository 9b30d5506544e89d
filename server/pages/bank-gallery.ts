import type { ChartRenderer } from '../bank/chart-renderer.js';
import type { ItemFeatures } from '../bank/derive-features.js';
import type { BankItem, ItemBank } from '../bank/load-bank.js';
import { toRespondentView } from '../bank/respondent-view.js';
import { documentHead } from './document-head.js';
import { html, raw, type SafeHtml } from './html.js';

/** Gallery filters (validated by the route); absent means all. */
export interface GalleryFilter {
  readonly type?: string | undefined;
  readonly level?: string | undefined;
  readonly scenario?: string | undefined;
}

/** Items that pass every given filter, in bank order. */
export function filterItems(bank: ItemBank, filter: GalleryFilter): BankItem[] {
  return bank.items.filter(
    (item) =>
      (filter.type === undefined || item.chart.type === filter.type) &&
      (filter.level === undefined || item.level === filter.level) &&
      (filter.scenario === undefined || item.scenario === filter.scenario),
  );
}

/**
 * `GET /bank`: every item (after the filters) as a respondent sees it (chart, question, options
 * and "I don't know"), followed by what only the team sees: key, rationale, alt text, features,
 * version. One stylesheet from the same server, no scripts, no third-party requests.
 */
export function renderBankGallery(bank: ItemBank, filter: GalleryFilter, render: ChartRenderer): string {
  const items = filterItems(bank, filter);
  const types = [...new Set(bank.items.map((i) => i.chart.type))].sort();
  const scenarios = bank.scenarios.map((s) => ({ value: s.id, label: s.name }));
  const select = (
    name: string,
    label: string,
    values: readonly { value: string; label: string }[],
    chosen?: string,
  ) => html`
<label>${label}
<select name="${name}">
<option value="">all</option>
${values.map((v) => html`<option value="${v.value}"${v.value === chosen ? raw(' selected') : ''}>${v.label}</option>`)}
</select></label>`;
  const asOptions = (values: readonly string[]) => values.map((value) => ({ value, label: value }));
  return html`${documentHead({ title: `Item bank: ${items.length} of ${bank.items.length} items`, stylesheets: ['/bank/gallery.css'] })}
<body>
<header>
<h1>Item bank</h1>
<p>${items.length} of ${bank.items.length} items shown. Each card shows the chart and question as a respondent sees them, then the key and features for the team.</p>
<form method="get" action="/bank" class="filters">
${select('type', 'Chart type', asOptions(types), filter.type)}
${select('level', 'Task level', asOptions(['read', 'interpret', 'envision']), filter.level)}
${select('scenario', 'Scenario', scenarios, filter.scenario)}
<button type="submit">Show</button>
</form>
</header>
<main>
${items.length === 0 ? html`<p>No items match these filters.</p>` : items.map((item) => itemCard(item, render))}
</main>
</body>
</html>
`.toString();
}

function itemCard(item: BankItem, render: ChartRenderer): SafeHtml {
  let chart: SafeHtml;
  let options: readonly { id: string; text: string }[] = [];
  let unit: string | undefined;
  try {
    const view = toRespondentView(item, { render, idPrefix: `g-${item.id}-` });
    chart = raw(view.chartSvg);
    options = view.options;
    unit = view.unit;
  } catch (cause) {
    chart = html`<p class="problem">The chart cannot be drawn: ${cause instanceof Error ? cause.message : String(cause)}</p>`;
  }
  const keyed = new Set(item.resolvedKey.optionIds);
  const response = item.response;
  return html`<article class="item" id="${item.id}">
<h2>${item.id}</h2>
<p class="tags"><span>${item.chart.type}</span> <span>${item.level}</span> <span>${item.scenario}</span> <span>${item.status}</span></p>
<section class="respondent" aria-label="As a respondent sees it">
<figure class="chart">${chart}</figure>
<p class="prompt">${item.prompt}</p>
${
  response.kind === 'numeric'
    ? html`<p class="answer">Answer: a number${unit === undefined ? '' : html` in ${unit}`}</p>`
    : response.kind === 'short-text'
      ? html`<p class="answer">Answer: a few words</p>`
      : html`<ol class="options">${options.map((o) => html`<li${keyed.has(o.id) ? raw(' class="keyed"') : ''}>${o.text}</li>`)}</ol>`
}
<p class="dont-know">Also offered: "I don't know"</p>
</section>
<section class="team" aria-label="For the team">
<h3>Key</h3>
<p>${keyText(item)}</p>
<h3>Rationale</h3>
<p>${item.rationale}</p>
<h3>Alt text</h3>
<p>${item.alt}</p>
<h3>Features</h3>
${featureTable(item.features)}
<p class="version">Version ${item.version.slice(0, 12)} · ${item.file}</p>
</section>
</article>
`;
}

function keyText(item: BankItem): string {
  const { key, response } = item;
  const resolved = item.resolvedKey;
  if (response.kind === 'short-text') {
    return `Scored by people: ${response.rubric.map((l) => `${l.score} = ${l.description}`).join('; ')}`;
  }
  const source = key.by === 'query' ? ` (computed: ${JSON.stringify(key.query)})` : ' (set by the author)';
  if (response.kind === 'numeric')
    return `${resolved.value} ${response.unit}, within ${response.tolerance}${source}`;
  const texts = response.options
    .filter((o) => resolved.optionIds.includes(o.id))
    .map((o) => `${o.id}: ${o.text}`);
  return `${texts.join('; ')}${source}`;
}

function featureTable(features: ItemFeatures): SafeHtml {
  const rows = Object.entries(features).map(([name, value]) => {
    const shown = Array.isArray(value) ? value.join(', ') || '-' : String(value);
    return html`<tr><th scope="row">${name}</th><td>${shown}</td></tr>`;
  });
  return html`<table class="features"><tbody>${rows}</tbody></table>`;
}

/** The gallery's stylesheet: one column on a phone, a grid of cards on a wide screen. */
export const galleryCss = `*{box-sizing:border-box}
body{margin:0;font-family:system-ui,-apple-system,"Segoe UI",Roboto,Arial,sans-serif;font-size:16px;line-height:1.4;color:#1a1a1a;background:#f4f4f4}
header{padding:12px 16px;background:#fff;border-bottom:1px solid #ccc}
h1{margin:0 0 8px;font-size:1.5rem}
.filters{display:flex;flex-wrap:wrap;gap:8px 16px;align-items:end}
.filters label{display:flex;flex-direction:column;font-size:.9rem}
.filters select,.filters button{font:inherit;min-height:44px;padding:4px 8px}
main{display:grid;grid-template-columns:1fr;gap:16px;padding:16px}
@media (min-width:1000px){main{grid-template-columns:repeat(auto-fill,minmax(560px,1fr))}}
.item{background:#fff;border:1px solid #ccc;border-radius:6px;padding:12px;min-width:0}
.item h2{margin:0;font-size:1.1rem;overflow-wrap:anywhere}
.tags span{display:inline-block;background:#e8eef5;border-radius:4px;padding:0 6px;margin:2px 0;font-size:.85rem}
.chart{margin:8px 0}
.chart svg{display:block;width:100%;height:auto;max-width:600px}
.prompt{font-weight:600}
.options li{margin:4px 0}
.options li.keyed{font-weight:700;text-decoration:underline}
.dont-know{color:#555}
.team{border-top:1px dashed #999;margin-top:8px;font-size:.9rem}
.team h3{font-size:.95rem;margin:8px 0 2px}
.team p{margin:0;overflow-wrap:anywhere}
.features{border-collapse:collapse;width:100%}
.features th,.features td{text-align:left;border-bottom:1px solid #e2e2e2;padding:2px 4px;vertical-align:top}
.features th{font-weight:400;color:#555;width:40%}
.version{color:#555;margin-top:8px}
.problem{color:#a00000}
`;
