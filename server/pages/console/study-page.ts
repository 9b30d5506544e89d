import {
  type AdaptiveStudySettings,
  adaptiveStudySettingsSchema,
} from '../../delivery/adaptive/adaptive-settings.js';
import type { Cohort, Study } from '../../delivery/study-service.js';
import { chartTypePluralNames } from '../../reports/chart-type-names.js';
import { html, raw, type SafeHtml } from '../html.js';

export interface StudyPageOptions {
  study: Study;
  cohorts: readonly (Cohort & { qrSvg: string })[];
  /** The settings form (admins), or undefined for the read-only view (analysts). */
  form?: SafeHtml;
  /** The add-cohort form's state (admins only). */
  cohortForm?: { label: string; problem?: string };
  canEdit: boolean;
  csrfToken: string;
  /** A one-line notice after a change (`Study created.`). */
  notice?: string;
  /** Draft keys (console.js) the change just saved, so the browser forgets them. */
  forgetDrafts?: readonly string[];
  /** Scenario names by id, for the read-only settings. */
  scenarioNames?: Readonly<Record<string, string>>;
}

const designNames = { fixed: 'Fixed', rotated: 'Rotated', adaptive: 'Adaptive' } as const;

/**
 * One study: its links (progress, report), its cohorts with join link, QR code and kiosk sign, the
 * add-cohort form and the settings form (admins) or the settings as text (analysts).
 */
export function renderStudyMain(options: StudyPageOptions): SafeHtml {
  const { study } = options;
  const id = encodeURIComponent(study.id);
  const reportUrl = `/studies/${id}/report`;
  return html`<p class="breadcrumb"><a href="/console">Studies</a></p>
<h1>${study.title}</h1>
${options.notice === undefined ? '' : html`<p class="notice-ok" data-forget="${(options.forgetDrafts ?? []).join(' ')}">${options.notice}</p>`}
<p class="study-links"><a class="button" href="/console/studies/${id}/progress">Progress</a> <a class="button secondary" href="${reportUrl}">Report</a></p>
<dl class="facts">
<div><dt>Status</dt><dd>${study.status === 'open' ? 'Open' : 'Closed'}</dd></div>
<div><dt>Design</dt><dd>${designNames[study.settings.design]}</dd></div>
<div><dt>Items in pool</dt><dd>${study.poolSize}</dd></div>
<div><dt>Cohorts</dt><dd>${options.cohorts.length}</dd></div>
</dl>

<section aria-labelledby="cohorts-heading">
<h2 id="cohorts-heading">Cohorts</h2>
${options.cohorts.length === 0 ? html`<p>No cohorts yet. Each cohort gets its own join code.</p>` : ''}
<ul class="cohorts">${options.cohorts.map((c) => cohortCard(study, c))}</ul>
${options.canEdit && options.cohortForm !== undefined ? cohortForm(study, options.cohortForm, options.csrfToken) : ''}
</section>

<section aria-labelledby="reports-heading">
<h2 id="reports-heading">Reports</h2>
<ul class="report-links">
<li><a href="${reportUrl}">Report of the whole study</a> (print it from the browser for the one-page summary)</li>
${options.cohorts.map((c) => html`<li><a href="${reportUrl}?cohort=${encodeURIComponent(c.id)}">Report of ${c.label}</a></li>`)}
</ul>
${options.cohorts.length >= 2 ? comparePicker(study, options.cohorts) : html`<p class="hint">Add a second cohort to compare cohorts.</p>`}
${options.canEdit ? html`<p class="study-actions"><a href="/console/studies/${id}/calibrate">Calibrate the study now</a> (the report also calibrates when its answers changed) · <a href="/console/studies/${id}/pilots/new">Pilot charts: add one, or stop showing one</a></p>` : ''}
</section>

<section aria-labelledby="settings-heading">
<h2 id="settings-heading">Settings</h2>
${options.form ?? settingsText(study, options.scenarioNames ?? {})}
</section>`;
}

function cohortCard(study: Study, cohort: Cohort & { qrSvg: string }): SafeHtml {
  const sign = `/console/studies/${encodeURIComponent(study.id)}/cohorts/${encodeURIComponent(cohort.id)}/sign`;
  return html`<li class="cohort">
<div class="cohort-text">
<h3>${cohort.label}</h3>
<p>Join code <strong class="join-code">${cohort.joinCode}</strong></p>
<p>Join link <a href="${cohort.joinUrl}">${cohort.joinUrl}</a></p>
<p><a href="${sign}">Kiosk sign</a> (ready to print)</p>
</div>
<div class="qr">${qrImage(cohort.qrSvg, `QR code of the join link of ${cohort.label}`)}</div>
</li>`;
}

/**
 * The QR code's SVG (our own `qrcode` output, not request text) inline, named for screen readers.
 */
export function qrImage(svg: string, label: string): SafeHtml {
  const named = svg.replace(
    /^<svg /,
    `<svg role="img" aria-label="${escapeAttribute(label)}" focusable="false" `,
  );
  return raw(named);
}

function escapeAttribute(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

function cohortForm(study: Study, state: { label: string; problem?: string }, csrfToken: string): SafeHtml {
  const invalid =
    state.problem === undefined ? '' : html` aria-invalid="true" aria-describedby="label-error"`;
  return html`<form method="post" action="/console/studies/${encodeURIComponent(study.id)}/cohorts" class="inline-form" data-draft-key="cohort-${study.id}">
<input type="hidden" name="csrf" value="${csrfToken}">
<div class="field">
<label for="label">New cohort label</label>
<input type="text" id="label" name="label" value="${state.label}" maxlength="100" required${invalid}>
${state.problem === undefined ? '' : html`<p class="field-error" id="label-error">${state.problem}</p>`}
</div>
<button type="submit">Add cohort</button>
</form>`;
}

function comparePicker(study: Study, cohorts: readonly Cohort[]): SafeHtml {
  const options = (selected: number) =>
    cohorts.map(
      (c, i) => html`<option value="${c.id}"${i === selected ? html` selected` : ''}>${c.label}</option>`,
    );
  return html`<form method="get" action="/console/studies/${encodeURIComponent(study.id)}/compare" class="inline-form compare">
<div class="field"><label for="compare-from">Compare from</label><select id="compare-from" name="from">${options(0)}</select></div>
<div class="field"><label for="compare-to">to</label><select id="compare-to" name="to">${options(1)}</select></div>
<button type="submit">Open comparison</button>
</form>`;
}

function adaptiveText(adaptive: AdaptiveStudySettings): SafeHtml {
  return html`<div><dt>Stop at standard error</dt><dd>${adaptive.seTarget} logits (after at least ${adaptive.minItems} items)</dd></div>`;
}

/** The settings as text, for analysts (who may not change them). */
function settingsText(study: Study, scenarioNames: Readonly<Record<string, string>>): SafeHtml {
  const s = study.settings;
  const filter = (values: readonly string[] | undefined, names?: Readonly<Record<string, string>>) =>
    values === undefined || values.length === 0 ? 'all' : values.map((v) => names?.[v] ?? v).join(', ');
  return html`<dl class="settings">
<div><dt>Chart types</dt><dd>${filter(s.pool.chartTypes, chartTypePluralNames)}</dd></div>
<div><dt>Task levels</dt><dd>${filter(s.pool.levels)}</dd></div>
<div><dt>Scenarios</dt><dd>${filter(s.pool.scenarios, scenarioNames)}</dd></div>
${s.pool.itemIds === undefined ? '' : html`<div><dt>Items listed by id</dt><dd>${s.pool.itemIds.length}</dd></div>`}
<div><dt>Items per attempt</dt><dd>${s.maxItems}</dd></div>
<div><dt>Time limit</dt><dd>${s.timeLimitSeconds === undefined ? 'none' : `${s.timeLimitSeconds} s`}</dd></div>
${s.design === 'adaptive' ? adaptiveText(s.adaptive ?? adaptiveStudySettingsSchema.parse({})) : ''}
<div><dt>Kiosk mode</dt><dd>${s.kiosk ? `on (starts over after ${s.idleSeconds} s without a touch)` : 'off'}</dd></div>
<div><dt>Consent text</dt><dd>${s.consentText}</dd></div>
<div><dt>Background questions</dt><dd>${s.background.length === 0 ? 'none' : s.background.map((q) => q.prompt).join(' · ')}</dd></div>
</dl>
<p class="hint">Only an admin can change these settings.</p>`;
}
