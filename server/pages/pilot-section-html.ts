import type { PilotResult, PilotSection } from '../reports/pilot-section.js';
import type { ReportRow } from '../reports/report-rows.js';
import { rowKey } from '../reports/report-rows.js';
import { html, type SafeHtml } from './html.js';

type Format = 'share' | 'logit' | 'count';

/** One pilot number as `<data>` with the CSV row's key (and `#lower`/`#upper` for interval ends). */
function cell(
  rows: Map<string, ReportRow>,
  audience: string,
  subject: string,
  measure: string,
  format: Format,
  part: 'value' | 'lower' | 'upper' = 'value',
): SafeHtml {
  const key = rowKey({ section: 'pilot', audience, subject, measure });
  const value = rows.get(key)?.[part];
  if (typeof value !== 'number') return html`<span>n/a</span>`;
  const text =
    format === 'share'
      ? `${Math.round(value * 100)}%`
      : format === 'logit'
        ? value.toFixed(2)
        : String(value);
  return html`<data value="${String(value)}" data-key="${part === 'value' ? key : `${key}#${part}`}">${text}</data>`;
}

function pilotBlock(pilot: PilotResult, rows: Map<string, ReportRow>, rpPct: number): SafeHtml {
  const id = pilot.pilotId;
  const answers = html`${cell(rows, '', id, 'answers', 'count')} answers so far (minimum ${cell(rows, '', id, 'min_responses', 'count')})`;
  if (pilot.state === 'collecting') {
    return html`<section class="pilot"><h3>${pilot.prompt}</h3>
<p>${answers}; ${cell(rows, '', id, 'responses_needed', 'count')} more needed before it is calibrated.</p></section>`;
  }
  if (pilot.state === 'not-estimable') {
    return html`<section class="pilot"><h3>${pilot.prompt}</h3>
<p>${answers}. Not calibrated: ${pilot.reason ?? 'no estimate'}.</p></section>`;
  }
  return html`<section class="pilot"><h3>${pilot.prompt}</h3>
<p>${answers}. Difficulty ${cell(rows, '', id, 'difficulty', 'logit')} ± ${cell(rows, '', id, 'difficulty_se', 'logit')} logits (SE); read with a ${rpPct}% chance from ${cell(rows, '', id, 'rp_location', 'logit')} logits. ${pilot.ladder?.sentence ?? ''}</p>
<table class="pilot-shares"><thead><tr><th scope="col">Cohort</th><th scope="col">Share likely to read it (95% interval)</th></tr></thead>
<tbody>${pilot.cohorts.map(
    (c) =>
      html`<tr><th scope="row">${c.label}</th><td>${cell(rows, c.cohortId, id, 'share_likely_to_read', 'share')} <span class="ci">(${cell(rows, c.cohortId, id, 'share_likely_to_read', 'share', 'lower')}–${cell(rows, c.cohortId, id, 'share_likely_to_read', 'share', 'upper')})</span></td></tr>`,
  )}</tbody></table></section>`;
}

/**
 * The report page's "Pilot charts" section: per pilot, answers so far and how many more it needs,
 * or its difficulty with SE, its place on the complexity ladder and each cohort's share likely to
 * read it. Numbers come from the report's rows (pilot-rows.ts), so the page and the CSV agree.
 */
export function renderPilotSection(section: PilotSection, rows: Map<string, ReportRow>): SafeHtml {
  const rpPct = Math.round(section.responseProbability * 100);
  return html`<section class="pilots">
<h2>Pilot charts</h2>
${section.pilots.map((p) => pilotBlock(p, rows, rpPct))}
<p class="method"><strong>How.</strong> ${section.method}</p>
</section>`;
}
