import { html, type SafeHtml } from '../html.js';
import { bankStylesheet } from './bank-browser-page.js';

/** Option rows the form offers (a pilot takes 2 to 8 options; blank rows are left out). */
export const pilotFormOptionRows = 5;

/** The option id of row `index` (0-based): a, b, c, ... */
export function pilotOptionId(index: number): string {
  return String.fromCharCode(97 + index);
}

/** What the form holds, to fill it again after a refusal (never the image). */
export interface PilotFormValues {
  prompt: string;
  alt: string;
  options: string[];
  key: string;
  minResponses: string;
}

export const emptyPilotForm: PilotFormValues = {
  prompt: '',
  alt: '',
  options: Array.from({ length: pilotFormOptionRows }, () => ''),
  key: '',
  minResponses: '100',
};

/** A problem with one form field: `field` is the id of the control it belongs to. */
export interface PilotFormProblem {
  field: string;
  problem: string;
}

export interface PilotFormInput {
  studyId: string;
  studyTitle: string;
  csrfToken: string;
  values: PilotFormValues;
  problems: readonly PilotFormProblem[];
  /** The study's pilots so far, newest last. */
  pilots: readonly { id: string; prompt: string; alt: string; minResponses: number; status: string }[];
  /** A notice after a pilot was added or retired. */
  notice?: string | undefined;
}

/** The form field names and control ids: `prompt`, `alt`, `option-a` …, `key-a` …, `image`, `min-responses`. */
export const pilotFieldLabels: Readonly<Record<string, string>> = {
  prompt: 'Question',
  alt: 'Text alternative',
  options: 'Answer options',
  key: 'Right answer',
  image: 'Chart image',
  'min-responses': 'Answers needed before it is calibrated',
  csrf: 'Form',
};

/**
 * `GET /console/studies/:studyId/pilots/new`: a plain multipart form (works without JavaScript)
 * that adds a pilot chart to the study through the same checks as the admin API. After a refusal
 * the form comes back filled in, with a list of problems linked to their fields.
 */
export function pilotFormMain(input: PilotFormInput): SafeHtml {
  const problemOf = (field: string) => input.problems.find((p) => p.field === field);
  const invalid = (field: string) => {
    const problem = problemOf(field);
    return problem === undefined ? '' : html` aria-invalid="true" aria-describedby="${field}-problem"`;
  };
  const note = (field: string) => {
    const problem = problemOf(field);
    return problem === undefined
      ? ''
      : html`<p class="field-error" id="${field}-problem">${problem.problem}</p>`;
  };
  const v = input.values;
  const rows = Array.from({ length: pilotFormOptionRows }, (_, i) => {
    const id = pilotOptionId(i);
    return html`<div class="bank-option-row">
<label for="option-${id}">Option ${id.toUpperCase()}</label>
<input type="text" id="option-${id}" name="option-${id}" maxlength="120" value="${v.options[i] ?? ''}"${invalid(`option-${id}`)}>
<span class="choice"><input type="radio" id="key-${id}" name="key" value="${id}"${v.key === id ? html` checked` : ''}>
<label for="key-${id}">Option ${id.toUpperCase()} is right</label></span>
${note(`option-${id}`)}
</div>`;
  });
  const studyPath = `/console/studies/${encodeURIComponent(input.studyId)}`;
  return html`${bankStylesheet}
<p class="breadcrumb"><a href="${studyPath}">Back to the study</a></p>
<h1>Add a pilot chart</h1>
${input.notice === undefined ? '' : html`<p class="notice-ok" role="status">${input.notice}</p>`}
<p>Study: ${input.studyTitle}. A pilot chart is tried on the study's audience and never counts toward anyone's result. Upload an SVG or PNG of at most 256 KiB; SVG is cleaned of scripts and outside links before it is stored.</p>
${
  input.problems.length === 0
    ? ''
    : html`<div class="form-problems" role="alert" aria-labelledby="problems-heading">
<h2 id="problems-heading">The pilot was not added</h2>
<ul>${input.problems.map((p) => html`<li><a href="#${p.field}">${pilotFieldLabels[p.field.startsWith('option-') ? 'options' : p.field.startsWith('key') ? 'key' : p.field] ?? p.field}: ${p.problem}</a></li>`)}</ul>
</div>`
}
<form method="post" action="${studyPath}/pilots" enctype="multipart/form-data" class="bank-pilot-form">
<input type="hidden" name="csrf" value="${input.csrfToken}">
<div class="field">
<label for="image">Chart image (SVG or PNG)</label>
<input type="file" id="image" name="image" accept="image/svg+xml,image/png" required${invalid('image')}>
${note('image')}
</div>
<div class="field">
<label for="alt">Text alternative (describes the chart, never gives the answer)</label>
<textarea id="alt" name="alt" rows="3" maxlength="1000" required${invalid('alt')}>${v.alt}</textarea>
${note('alt')}
</div>
<div class="field">
<label for="prompt">Question</label>
<textarea id="prompt" name="prompt" rows="2" maxlength="300" required${invalid('prompt')}>${v.prompt}</textarea>
${note('prompt')}
</div>
<fieldset class="bank-options-field" id="key"${problemOf('key') === undefined ? '' : html` aria-describedby="key-problem"`}>
<legend>Answer options (at least two) and the right one</legend>
${rows}
${note('key')}
</fieldset>
<div class="field">
<label for="min-responses">Answers needed before it is calibrated (30 to 5000)</label>
<input type="number" id="min-responses" name="min-responses" min="30" max="5000" step="1" value="${v.minResponses}"${invalid('min-responses')}>
${note('min-responses')}
</div>
<button type="submit">Add the pilot chart</button>
</form>
<section aria-labelledby="pilots-heading">
<h2 id="pilots-heading">Pilot charts of this study</h2>
${
  input.pilots.length === 0
    ? html`<p>None yet.</p>`
    : html`<ul class="bank-pilots">${input.pilots.map(
        (p) => html`<li><figure class="bank-pilot">
<img src="/api/admin/studies/${encodeURIComponent(input.studyId)}/pilots/${encodeURIComponent(p.id)}/image" alt="${p.alt}">
<figcaption>${p.prompt} <span class="bank-pilot-meta">(${p.status === 'retired' ? 'no longer given to new attempts' : 'given to new attempts'}; calibrated after ${p.minResponses} answers)</span></figcaption>
</figure>
${
  p.status === 'retired'
    ? ''
    : html`<form method="post" action="/console/studies/${encodeURIComponent(input.studyId)}/pilots/${encodeURIComponent(p.id)}/retire">
<input type="hidden" name="csrf" value="${input.csrfToken}">
<button type="submit" class="secondary">Stop giving this chart to new attempts</button>
</form>`
}</li>`,
      )}</ul>`
}
</section>`;
}
