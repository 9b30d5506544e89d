import { chartTypePluralNames } from '../reports/chart-type-names.js';
import { renderAbilityDistribution } from '../reports/pictures/ability-distribution.js';
import { renderLadder } from '../reports/pictures/ladder-picture.js';
import { renderPersonItemMap } from '../reports/pictures/person-item-map.js';
import { renderProfileGrid } from '../reports/pictures/profile-grid.js';
import type { ReportRow } from '../reports/report-rows.js';
import { reportRows, rowKey } from '../reports/report-rows.js';
import type { Interval, Report, ReportAudience } from '../reports/report-types.js';
import { documentHead } from './document-head.js';
import { renderFairnessSection } from './fairness-section-html.js';
import { html, raw, type SafeHtml } from './html.js';
import { renderPilotSection } from './pilot-section-html.js';
import { renderRubricAgreementSection } from './rubric-agreement-html.js';

type Format = 'share' | 'logit' | 'count' | 'ratio' | 'signed-share';

/**
 * Prints one number of the report: `<data value="<the report's number>" data-key="…">` around its
 * human form (a share as whole percent, a logit with 2 decimals), so the page shows readable text and
 * still carries the exact number the JSON and CSV hold.
 */
function numberOf(
  rows: Map<string, ReportRow>,
  key: string,
  format: Format,
  part: 'value' | 'lower' | 'upper' = 'value',
): SafeHtml {
  const row = rows.get(key);
  const value = row?.[part];
  if (value === null || value === undefined || typeof value === 'string') return html`<span>n/a</span>`;
  const text =
    format === 'share'
      ? `${Math.round(value * 100)}%`
      : format === 'signed-share'
        ? `${value >= 0 ? '+' : '−'}${Math.abs(Math.round(value * 100))} pts`
        : format === 'logit'
          ? value.toFixed(2)
          : format === 'ratio'
            ? value.toFixed(2)
            : String(value);
  const dataKey = part === 'value' ? key : `${key}#${part}`;
  return html`<data value="${String(value)}" data-key="${dataKey}">${text}</data>`;
}

function withInterval(rows: Map<string, ReportRow>, key: string, format: Format): SafeHtml {
  const row = rows.get(key);
  if (!row || row.lower === null) return numberOf(rows, key, format);
  return html`${numberOf(rows, key, format)} <span class="ci">(${numberOf(rows, key, format, 'lower')}–${numberOf(rows, key, format, 'upper')})</span>`;
}

function audienceSection(report: Report, a: ReportAudience, rows: Map<string, ReportRow>): SafeHtml {
  const k = (section: string, subject: string, measure: string) =>
    rowKey({ section: section as ReportRow['section'], audience: a.key, subject, measure });
  const level = `${Math.round(report.settings.confidenceLevel * 100)}%`;
  return html`<section class="audience">
<h2>${a.label}</h2>
<p class="ceiling">${a.ladder.ceilingSentence}</p>
<ul class="sentences">${a.ladder.sentences.map((s) => html`<li>${s}</li>`)}</ul>
<dl class="facts">
<div><dt>Respondents</dt><dd>${numberOf(rows, k('audience', '', 'respondents'), 'count')}</dd></div>
<div><dt>Finished</dt><dd>${numberOf(rows, k('audience', '', 'completion_rate'), 'share')} of ${numberOf(rows, k('audience', '', 'consented'), 'count')} who agreed</dd></div>
<div><dt>Ability mean (logits, ${level} interval)</dt><dd>${withInterval(rows, k('audience', '', 'ability_mean'), 'logit')}</dd></div>
<div><dt>Ability SD</dt><dd>${withInterval(rows, k('audience', '', 'ability_sd'), 'logit')}</dd></div>
<div><dt>Person separation reliability</dt><dd>${numberOf(rows, k('audience', '', 'reliability'), 'ratio')}</dd></div>
</dl>
<figure class="picture">${raw(renderProfileGrid(a.profile, { title: `Readability profile: ${a.label}` }))}
<figcaption>Share of this audience with at least a ${Math.round(report.settings.responseProbability * 100)}% chance on the typical item of each chart type and task.</figcaption></figure>
<details class="screen-only"><summary>Profile table with intervals</summary>
<table class="profile"><thead><tr><th scope="col">Chart type</th><th scope="col">Task</th><th scope="col">Items</th><th scope="col">Expected share correct (${level})</th><th scope="col">Share who can handle it (${level})</th><th scope="col">RP location</th></tr></thead>
<tbody>${a.profile.map((cell) => {
    const subject = `${cell.chartType}/${cell.level}`;
    return html`<tr><th scope="row">${chartTypePluralNames[cell.chartType]}</th><td>${cell.level}</td><td>${numberOf(rows, k('profile', subject, 'item_count'), 'count')}</td><td>${withInterval(rows, k('profile', subject, 'expected_share_correct'), 'share')}</td><td>${withInterval(rows, k('profile', subject, 'share_at_rp'), 'share')}</td><td>${numberOf(rows, k('profile', subject, 'rp_location'), 'logit')}</td></tr>`;
  })}</tbody></table></details>
<figure class="picture screen-only">${raw(renderLadder(a.ladder, { title: `Complexity ladder: ${a.label}`, ceilingShare: report.settings.ceilingShare }))}</figure>
<figure class="picture screen-only">${raw(renderPersonItemMap(a.personAbilities, report.items, { title: `Person-item map: ${a.label}` }))}</figure>
</section>`;
}

function comparisonSection(report: Report, rows: Map<string, ReportRow>): SafeHtml {
  const cmp = report.comparison;
  if (!cmp) return html``;
  const pair = `${cmp.from.id}->${cmp.to.id}`;
  const k = (subject: string, measure: string) =>
    rowKey({ section: 'comparison', audience: pair, subject, measure });
  return html`<section class="comparison">
<h2>${cmp.to.label} compared with ${cmp.from.label}</h2>
<dl class="facts">
<div><dt>Difference in mean ability (logits)</dt><dd>${withInterval(rows, k('', 'mean_difference'), 'logit')}, SE ${numberOf(rows, k('', 'mean_difference_se'), 'logit')}</dd></div>
<div><dt>Effect size d</dt><dd>${withInterval(rows, k('', 'effect_size'), 'ratio')}</dd></div>
</dl>
<p class="note">${cmp.effectSizeFormula}. Source: ${cmp.effectSizeSource}. SE and intervals from the bootstrap.</p>
<figure class="picture">${raw(renderAbilityDistribution(report.audiences, { title: 'Ability distributions compared' }))}</figure>
<table class="profile"><thead><tr><th scope="col">Chart type</th><th scope="col">Task</th><th scope="col">Change in expected share correct</th><th scope="col">Change in share who can handle it</th></tr></thead>
<tbody>${cmp.cells.map((cell) => {
    const subject = `${cell.chartType}/${cell.level}`;
    return html`<tr><th scope="row">${chartTypePluralNames[cell.chartType]}</th><td>${cell.level}</td><td>${withInterval(rows, k(subject, 'expected_share_difference'), 'signed-share')}</td><td>${withInterval(rows, k(subject, 'share_at_rp_difference'), 'signed-share')}</td></tr>`;
  })}</tbody></table>
</section>`;
}

function itemSection(report: Report, rows: Map<string, ReportRow>): SafeHtml {
  const k = (itemId: string, measure: string) =>
    rowKey({ section: 'item', audience: '', subject: itemId, measure });
  const flag = (f: 'low' | 'high' | null) =>
    f === null ? '' : f === 'low' ? ' ▼ too predictable' : ' ▲ noisy';
  return html`<section class="items screen-only">
<h2>Items</h2>
<p class="note">Infit and outfit mean-squares are flagged outside ${report.settings.fitRange.low}–${report.settings.fitRange.high} (Wright, Linacre, Gustafson &amp; Martin-Löf 1994, Rasch Measurement Transactions 8:3 p. 370, the range for ordinary multiple-choice tests).</p>
<table class="item-table"><thead><tr><th scope="col">Item</th><th scope="col">Chart type</th><th scope="col">Task</th><th scope="col">Difficulty</th><th scope="col">SE</th><th scope="col">Infit</th><th scope="col">Outfit</th><th scope="col">Answers</th><th scope="col">"I don't know"</th></tr></thead>
<tbody>${report.items.map(
    (item) =>
      html`<tr><th scope="row">${item.itemId}</th><td>${item.chartType ?? 'not in bank'}</td><td>${item.level ?? ''}</td><td>${numberOf(rows, k(item.itemId, 'difficulty'), 'logit')}</td><td>${numberOf(rows, k(item.itemId, 'standard_error'), 'logit')}</td><td${item.infitFlag ? html` class="flag"` : ''}>${numberOf(rows, k(item.itemId, 'infit'), 'ratio')}${flag(item.infitFlag)}</td><td${item.outfitFlag ? html` class="flag"` : ''}>${numberOf(rows, k(item.itemId, 'outfit'), 'ratio')}${flag(item.outfitFlag)}</td><td>${numberOf(rows, k(item.itemId, 'responses'), 'count')}</td><td>${numberOf(rows, k(item.itemId, 'dont_know_share'), 'share')}</td></tr>`,
  )}</tbody></table>
${
  report.calibration.uncalibrated.length > 0
    ? html`<h3>Not yet calibrated</h3><ul>${report.calibration.uncalibrated.map(
        (u) =>
          html`<li>${u.itemId}: ${u.reason === 'too-few-answers' ? `${u.answers} answers, ${u.moreNeeded} more needed` : u.reason.replace(/-/g, ' ')}</li>`,
      )}</ul>`
    : ''
}
</section>`;
}

/** Links between the study, cohort and comparison views of the same report. */
export interface ReportLinks {
  readonly studyUrl: string;
  readonly cohorts: readonly { label: string; url: string }[];
  readonly comparisons: readonly { label: string; url: string }[];
  readonly jsonUrl: string;
  readonly csvUrl: string;
}

/**
 * The report as one HTML page: the audience in words and pictures, the comparison, the items, and the
 * foot (method, thresholds, calibration, caution). Print CSS keeps the first page a one-page summary
 * (A4 or Letter); tables marked screen-only are left out of print.
 */
export function renderReportPage(report: Report, links: ReportLinks): string {
  const rows = new Map(reportRows(report).map((r) => [rowKey(r), r]));
  return html`${documentHead({ title: `Readability report: ${report.study.title}`, stylesheets: ['/report-assets/report.css'] })}
<body>
<header>
<p class="kicker">Readability report</p>
<h1>${report.study.title}</h1>
<nav class="screen-only" aria-label="Views"><a href="${links.studyUrl}">Whole study</a>${links.cohorts.map((c) => html` · <a href="${c.url}">${c.label}</a>`)}${links.comparisons.map((c) => html` · <a href="${c.url}">${c.label}</a>`)} · <a href="${links.jsonUrl}">JSON</a> · <a href="${links.csvUrl}">CSV</a></nav>
</header>
<main>
${report.calibration.newerResponses > 0 ? html`<p class="notice">${report.calibration.newerResponses} responses arrived after this calibration and are not included.</p>` : ''}
${report.audiences.length === 1 ? audienceSection(report, report.audiences[0]!, rows) : ''}
${comparisonSection(report, rows)}
${report.audiences.length > 1 ? report.audiences.map((a) => audienceSection(report, a, rows)) : ''}
${report.fairness ? renderFairnessSection(report.fairness, rows) : ''}
${report.rubric ? renderRubricAgreementSection(report.rubric, rows) : ''}
${report.pilots ? renderPilotSection(report.pilots, rows) : ''}
${itemSection(report, rows)}
</main>
<footer>
<p><strong>Method.</strong> ${report.foot.method}</p>
<p><strong>Thresholds.</strong> ${report.foot.thresholds}</p>
<p><strong>Calibration.</strong> ${report.foot.calibration}</p>
<p class="caution"><strong>Caution.</strong> ${report.foot.caution}</p>
</footer>
</body>
</html>
`.toString();
}

export type { Interval };
