import type { StudyProgress } from '../../reports/study-progress.js';
import { html, type SafeHtml } from '../html.js';

/**
 * The live progress of a study. The server draws it once; console.js fetches `dataUrl` every few
 * seconds and redraws the parts inside `[data-progress]` from the JSON (same numbers, no reload).
 */
export function renderProgressMain(progress: StudyProgress, dataUrl: string): SafeHtml {
  const id = encodeURIComponent(progress.study.id);
  return html`<p class="breadcrumb"><a href="/console">Studies</a> › <a href="/console/studies/${id}">${progress.study.title}</a></p>
<h1>Progress: ${progress.study.title}</h1>
<p class="hint"><span id="progress-updated" data-at="${progress.at}">Numbers as of ${timeOf(progress.at)}.</span> This page refreshes itself every few seconds. <a href="/studies/${id}/report">Open the report</a></p>
<div id="progress" data-progress data-url="${dataUrl}">
${renderProgressSections(progress)}
</div>`;
}

/** The parts of the progress page that refresh (also drawn by console.js from the JSON). */
export function renderProgressSections(p: StudyProgress): SafeHtml {
  return html`<section aria-labelledby="attempts-heading">
<h2 id="attempts-heading">Attempts per cohort</h2>
<div class="table-wrap"><table id="attempts-table">
<thead><tr><th scope="col">Cohort</th><th scope="col">Started</th><th scope="col">In progress</th><th scope="col">Finished</th><th scope="col">Abandoned</th><th scope="col">Last activity</th></tr></thead>
<tbody>${p.cohorts.map(
    (c) =>
      html`<tr><th scope="row">${c.label}</th><td class="number">${c.started}</td><td class="number">${c.inProgress}</td><td class="number">${c.finished}</td><td class="number">${c.abandoned}</td><td>${c.lastActivityAt === null ? 'none yet' : timeOf(c.lastActivityAt)}</td></tr>`,
  )}</tbody>
<tfoot><tr><th scope="row">All cohorts</th><td class="number">${p.totals.started}</td><td class="number">${p.totals.inProgress}</td><td class="number">${p.totals.finished}</td><td class="number">${p.totals.abandoned}</td><td></td></tr></tfoot>
</table></div>
</section>
<section aria-labelledby="exposure-heading">
<h2 id="exposure-heading">Items nearing the exposure limit</h2>
<p id="exposure-text">${exposureSentence(p)}</p>
${
  p.exposure.nearing.length === 0
    ? ''
    : html`<ul id="exposure-list">${p.exposure.nearing.map((i) => html`<li>${i.itemId}: ${percent(i.exposure)} of attempts</li>`)}</ul>`
}
</section>
<section aria-labelledby="pilots-heading">
<h2 id="pilots-heading">Pilot charts</h2>
${
  p.pilots.length === 0
    ? html`<p>This study has no pilot charts.</p>`
    : html`<div class="table-wrap"><table id="pilots-table">
<thead><tr><th scope="col">Pilot</th><th scope="col">Status</th><th scope="col">Answers</th><th scope="col">Needed</th><th scope="col">Still to go</th></tr></thead>
<tbody>${p.pilots.map(
        (pilot) =>
          html`<tr><th scope="row">${pilot.prompt}</th><td>${pilot.status === 'active' ? 'Active' : 'Retired'}</td><td class="number">${pilot.responses}</td><td class="number">${pilot.minResponses}</td><td class="number">${pilot.remaining}</td></tr>`,
      )}</tbody>
</table></div>`
}
</section>
<section aria-labelledby="items-heading">
<h2 id="items-heading">Time per item</h2>
<p class="hint">Median time from the item appearing to the answer arriving, measured by the server. Exposure: the share of attempts with answers (${p.attemptsWithAnswers}) that answered the item.</p>
<div class="table-wrap"><table id="items-table">
<thead><tr><th scope="col">Item</th><th scope="col">Answers</th><th scope="col">Median time</th><th scope="col">Exposure</th></tr></thead>
<tbody>${p.items.map(
    (i) =>
      html`<tr><th scope="row">${i.itemId}${i.inPool ? '' : ' (no longer in the pool)'}</th><td class="number">${i.answers}</td><td class="number">${i.medianSeconds === null ? '–' : `${i.medianSeconds.toFixed(1)} s`}</td><td class="number">${i.exposure === null ? '–' : percent(i.exposure)}</td></tr>`,
  )}</tbody>
</table></div>
</section>`;
}

/** What the exposure section says (also in the JSON, so the script shows the same words). */
export function exposureSentence(p: StudyProgress): string {
  const e = p.exposure;
  if (!e.applies)
    return `Exposure limits apply to adaptive studies. In a ${p.study.design} design the design itself sets how often each item is shown.`;
  if (!e.enoughAttempts)
    return `Too few attempts with answers yet (${p.attemptsWithAnswers} of ${e.minAttempts}) to judge exposure.`;
  if (e.nearing.length === 0)
    return `No item is at or above ${percent(e.warnAt)} of attempts (the limit is ${percent(e.limit)}${limitSource(e)}).`;
  return `${e.nearing.length === 1 ? '1 item is' : `${e.nearing.length} items are`} at or above ${percent(e.warnAt)} of attempts (the limit is ${percent(e.limit)}${limitSource(e)}):`;
}

function percent(share: number): string {
  return `${Math.round(share * 100)}%`;
}

/** `2031-05-04T10:15:00.000Z` → `10:15:00 UTC, 2031-05-04`. */
export function timeOf(iso: string): string {
  return `${iso.slice(11, 19)} UTC, ${iso.slice(0, 10)}`;
}

/** Where the exposure limit comes from, in words. */
function limitSource(e: StudyProgress['exposure']): string {
  return e.limitFrom === 'exposure-control'
    ? ', the target of the exposure control new attempts use'
    : ', the usual target; tune exposure control to set another';
}
