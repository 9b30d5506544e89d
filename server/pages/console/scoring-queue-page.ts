import type { ScoringQueue } from '../../delivery/rubric-scoring-service.js';
import { html, raw, type SafeHtml } from '../html.js';

export interface ScoringQueuePageInput {
  /** Studies to choose from (id and title). */
  studies: readonly { id: string; title: string }[];
  /** The chosen study's queue for this rater, or undefined when no study is chosen yet. */
  queue?: ScoringQueue | undefined;
  studyTitle?: string | undefined;
  csrfToken: string;
  /** A calm notice after a score (e.g. "Score saved."). */
  notice?: string | undefined;
  /** Why the last score was refused, shown as an alert. */
  problem?: string | undefined;
  /** The chart the respondent saw with the first entry's question (our renderer's SVG), if the item is in the bank. */
  chartSvg?: string | undefined;
}

/**
 * `GET /console/scoring`: pick a study, then score its short-text answers one at a time against the
 * item's rubric with one of three buttons (0, 1, 2). Blind: the page shows the question, the rubric
 * and the answer's text, never who wrote it, their cohort or background. Each button posts the
 * same form (with the session's CSRF token) to `POST /console/scoring/:entryId`.
 */
export function scoringQueueMain(input: ScoringQueuePageInput): SafeHtml {
  const chosen = input.queue?.studyId;
  const picker = html`<form method="get" action="/console/scoring" class="inline-form">
<label for="scoring-study">Study</label>
<select id="scoring-study" name="study">${input.studies.map(
    (s) => html`<option value="${s.id}"${s.id === chosen ? html` selected` : ''}>${s.title}</option>`,
  )}</select>
<button type="submit" class="secondary">Show answers</button>
</form>`;
  const head = html`<h1>Scoring queue</h1>
${input.notice === undefined ? '' : html`<p class="notice-ok">${input.notice}</p>`}
${input.problem === undefined ? '' : html`<p class="field-error" role="alert">${input.problem}</p>`}
<p>Short written answers wait here for a score from the rubric. You see the question, the rubric and the answer only, never who wrote it.</p>`;
  if (input.studies.length === 0) return html`${head}<p>No studies yet.</p>`;
  if (input.queue === undefined) return html`${head}${picker}`;
  const queue = input.queue;
  const entry = queue.entries[0];
  const needs =
    queue.scoresNeeded === 2
      ? 'This study asks for two scores per answer, from two different people; when they are 0 and 2, a third person decides.'
      : 'This study asks for one score per answer.';
  if (entry === undefined)
    return html`${head}${picker}
<h2>${input.studyTitle ?? queue.studyId}</h2>
<p>${needs} Nothing is waiting for your score. Thank you.</p>`;
  return html`${head}${picker}
<h2>${input.studyTitle ?? queue.studyId}</h2>
<p>${needs} ${queue.remaining === 1 ? 'This is the last answer waiting for you.' : `${queue.remaining} answers wait for your score; this is the oldest.`}</p>
<section class="scoring-entry" aria-labelledby="scoring-question">
<h3 id="scoring-question">Question (${entry.itemId})</h3>
${entry.scoresNeeded === 3 ? html`<p class="notice">Third read: two people scored this answer 0 and 2. Your score decides.</p>` : ''}
${input.chartSvg === undefined ? '' : html`<figure class="bank-chart scoring-chart">${raw(input.chartSvg)}</figure>`}
<p>${entry.prompt}</p>
<h3>Answer</h3>
<blockquote class="scoring-answer"><p>${entry.text === '' ? '(empty)' : entry.text}</p></blockquote>
<form method="post" action="/console/scoring/${encodeURIComponent(entry.entryId)}">
<input type="hidden" name="csrf" value="${input.csrfToken}">
<input type="hidden" name="study" value="${queue.studyId}">
<fieldset>
<legend>Score against the rubric</legend>
<ul class="rubric-levels">${entry.rubric.map(
    (level) =>
      html`<li><button type="submit" name="score" value="${String(level.score)}" aria-describedby="rubric-level-${String(level.score)}">${String(level.score)}</button> <span id="rubric-level-${String(level.score)}">${level.description}</span></li>`,
  )}</ul>
</fieldset>
</form>
</section>`;
}
