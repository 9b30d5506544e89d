import { taskLevels } from '../../bank/item-schema.js';
import { chartTypes } from '../../charts/chart-spec.js';
import { formDesigns } from '../../delivery/study-settings.js';
import { chartTypePluralNames } from '../../reports/chart-type-names.js';
import { html, type SafeHtml } from '../html.js';
import {
  type FormProblem,
  type StudyFormField,
  type StudyFormValues,
  studyFormFields,
} from './study-form-values.js';

export interface StudyFormOptions {
  /** Where the form posts. */
  action: string;
  values: StudyFormValues;
  problems: readonly FormProblem[];
  csrfToken: string;
  /** The bank's scenarios, for the pool filter. */
  scenarios: readonly { id: string; name: string }[];
  /** Items the pool filters select now (shown under the filters; the script keeps it live). */
  matchingItems: number;
  /** Items the stored pool lists by id (kept on save; the form edits only the filters). */
  listedItemIds?: number;
  /** The edit form shows the open/closed choice; the new-study form does not. */
  showStatus: boolean;
  submitLabel: string;
  /** sessionStorage key of the draft the script keeps (see console.js). */
  draftKey: string;
  /** The study being edited: the live count asks for its listed item ids too. */
  studyId?: string;
}

const designWords: Readonly<Record<(typeof formDesigns)[number], { label: string; hint: string }>> = {
  fixed: { label: 'Fixed', hint: 'everyone answers the same items in the same order' },
  rotated: {
    label: 'Rotated',
    hint: 'linked booklets of items; each person answers one booklet, all items end up on one scale',
  },
  adaptive: {
    label: 'Adaptive',
    hint: 'each next item is chosen from the answers so far; needs a calibration of the study first',
  },
};

const levelWords: Readonly<Record<(typeof taskLevels)[number], string>> = {
  read: 'Read (find a value)',
  interpret: 'Interpret (compare, see a pattern)',
  envision: 'Envision (reason beyond the chart)',
};

/** id of the message element of a field, for aria-describedby. */
const errorId = (field: StudyFormField) => `${field}-error`;

/**
 * The study form (new and edit): plain HTML controls with labels, every field's problems next to it
 * (`aria-invalid`, `aria-describedby`), a summary of problems at the top linking to the fields, and
 * the values as sent. Works without JavaScript; console.js adds the live item count and keeps a draft.
 */
export function renderStudyForm(options: StudyFormOptions): SafeHtml {
  const { values, problems } = options;
  const byField = new Map<StudyFormField, string[]>();
  for (const p of problems) byField.set(p.field, [...(byField.get(p.field) ?? []), p.problem]);
  const invalid = (field: StudyFormField) => (byField.has(field) ? html` aria-invalid="true"` : '');
  const described = (field: StudyFormField, hint?: string) => {
    const ids = [hint, byField.has(field) ? errorId(field) : undefined].filter((id) => id !== undefined);
    return ids.length > 0 ? html` aria-describedby="${ids.join(' ')}"` : '';
  };
  const message = (field: StudyFormField) => {
    const list = byField.get(field);
    return list === undefined
      ? ''
      : html`<p class="field-error" id="${errorId(field)}">${list.join('; ')}</p>`;
  };
  const checked = (on: boolean) => (on ? html` checked` : '');
  const checkbox = (name: string, value: string, label: string, on: boolean, index: number) =>
    html`<div class="choice"><input type="checkbox" id="${name}-${index}" name="${name}" value="${value}"${checked(on)}><label for="${name}-${index}">${label}</label></div>`;

  const summary =
    problems.length === 0
      ? ''
      : html`<div class="form-problems" role="alert" tabindex="-1" id="form-problems">
<h2>Please correct ${problems.length === 1 ? 'this' : `these ${problems.length}`} before saving</h2>
<ul>${[...problems].sort((a, b) => studyFormFields.indexOf(a.field) - studyFormFields.indexOf(b.field)).map((p) => html`<li><a href="#${fieldAnchor(p.field)}">${fieldLabels[p.field]}: ${p.problem}</a></li>`)}</ul>
</div>`;

  return html`<form method="post" action="${options.action}" class="study-form" data-draft-key="${options.draftKey}"${problems.length > 0 ? html` data-has-problems="true"` : ''} novalidate>
${summary}
<input type="hidden" name="csrf" value="${options.csrfToken}">
${byField.has('other') ? html`<p class="field-error" id="other-error" tabindex="-1">Settings not on this form (change them with the admin API): ${byField.get('other')!.join('; ')}</p>` : ''}
<div class="field">
<label for="title">Title</label>
<input type="text" id="title" name="title" value="${values.title}" maxlength="200" required${invalid('title')}${described('title')}>
${message('title')}
</div>

<fieldset class="pool" id="pool"${invalid('pool')}${described('pool', 'pool-hint')}>
<legend>Item pool</legend>
<p class="hint" id="pool-hint">Tick what the study may use. Nothing ticked in a group means every option of that group.</p>
${message('pool')}
<fieldset class="choices"><legend>Chart types</legend>
${chartTypes.map((type, i) => checkbox('chartTypes', type, capitalise(chartTypePluralNames[type]), values.chartTypes.includes(type), i))}
</fieldset>
<fieldset class="choices"><legend>Task levels</legend>
${taskLevels.map((level, i) => checkbox('levels', level, levelWords[level], values.levels.includes(level), i))}
</fieldset>
<fieldset class="choices"><legend>Scenarios</legend>
${options.scenarios.map((s, i) => checkbox('scenarios', s.id, s.name, values.scenarios.includes(s.id), i))}
</fieldset>
<p class="pool-count"><output id="pool-count" aria-live="polite" data-count="${options.matchingItems}"${options.studyId === undefined ? '' : html` data-study="${options.studyId}"`}>${countSentence(options.matchingItems)}</output></p>
${options.listedItemIds === undefined ? '' : html`<p class="hint">This study lists ${options.listedItemIds} items by id; the filters above narrow that list.</p>`}
</fieldset>

<fieldset id="design"${invalid('design')}${described('design')}>
<legend>Form design</legend>
${formDesigns.map(
  (design) =>
    html`<div class="choice"><input type="radio" id="design-${design}" name="design" value="${design}"${checked(values.design === design)}><label for="design-${design}"><strong>${designWords[design].label}</strong>: ${designWords[design].hint}</label></div>`,
)}
${message('design')}
</fieldset>

<fieldset class="adaptive">
<legend>Adaptive design</legend>
<p class="hint" id="adaptive-hint">Used only when the design is adaptive.</p>
<div class="field">
<label for="seTarget">Stop at standard error (logits)</label>
<input type="text" inputmode="decimal" id="seTarget" name="seTarget" value="${values.seTarget}"${invalid('seTarget')}${described('seTarget', 'adaptive-hint')}>
${message('seTarget')}
</div>
<div class="field">
<label for="minItems">At least this many items before stopping</label>
<input type="text" inputmode="numeric" id="minItems" name="minItems" value="${values.minItems}"${invalid('minItems')}${described('minItems', 'adaptive-hint')}>
${message('minItems')}
</div>
</fieldset>

<fieldset>
<legend>Limits</legend>
<div class="field">
<label for="maxItems">Items per attempt</label>
<input type="text" inputmode="numeric" id="maxItems" name="maxItems" value="${values.maxItems}"${invalid('maxItems')}${described('maxItems', 'maxItems-hint')}>
<p class="hint" id="maxItems-hint">Per booklet when rotated; the most an adaptive attempt gives.</p>
${message('maxItems')}
</div>
<div class="field">
<label for="timeLimitSeconds">Time limit in seconds (blank: none)</label>
<input type="text" inputmode="numeric" id="timeLimitSeconds" name="timeLimitSeconds" value="${values.timeLimitSeconds}"${invalid('timeLimitSeconds')}${described('timeLimitSeconds')}>
${message('timeLimitSeconds')}
</div>
</fieldset>

<div class="field">
<label for="consentText">Consent text</label>
<textarea id="consentText" name="consentText" rows="4"${invalid('consentText')}${described('consentText')}>${values.consentText}</textarea>
${message('consentText')}
</div>

<div class="field">
<label for="background">Background questions</label>
<p class="hint" id="background-hint">One block per question: a line <code>id: question</code>, then one line <code>- id: answer</code> per answer (2 to 12). Ids are lower case words joined by hyphens. "Prefer not to say" is added for you. Blank: no questions.</p>
<textarea id="background" name="background" rows="6" class="code"${invalid('background')}${described('background', 'background-hint')}>${values.background}</textarea>
${message('background')}
</div>

<fieldset>
<legend>Kiosk</legend>
<div class="choice"><input type="checkbox" id="kiosk" name="kiosk"${checked(values.kiosk)}${invalid('kiosk')}><label for="kiosk">Kiosk mode (a shared screen that returns to the start after each visitor)</label></div>
${message('kiosk')}
<div class="field">
<label for="idleSeconds">Seconds without a touch before the kiosk starts over</label>
<input type="text" inputmode="numeric" id="idleSeconds" name="idleSeconds" value="${values.idleSeconds}"${invalid('idleSeconds')}${described('idleSeconds')}>
${message('idleSeconds')}
</div>
<div class="choice"><input type="checkbox" id="endSummary" name="endSummary"${checked(values.endSummary)}><label for="endSummary">Tell each person at the end how many charts they read</label></div>
${message('endSummary')}
</fieldset>

<fieldset>
<legend>Written answers</legend>
<p class="hint" id="rubricRaters-hint">Short written answers are scored later in the scoring queue. With two people, each answer counts once both have scored it, and the report shows how well they agree.</p>
<div class="choice"><input type="radio" id="rubricRaters-1" name="rubricRaters" value="1"${checked(values.rubricRaters !== '2')}${invalid('rubricRaters')}${described('rubricRaters', 'rubricRaters-hint')}><label for="rubricRaters-1">One person scores each answer</label></div>
<div class="choice"><input type="radio" id="rubricRaters-2" name="rubricRaters" value="2"${checked(values.rubricRaters === '2')}${invalid('rubricRaters')}${described('rubricRaters', 'rubricRaters-hint')}><label for="rubricRaters-2">Two people score each answer</label></div>
${message('rubricRaters')}
</fieldset>

${
  options.showStatus
    ? html`<div class="field">
<label for="status">Status</label>
<select id="status" name="status"${invalid('status')}${described('status', 'status-hint')}>
<option value="open"${values.status === 'open' ? html` selected` : ''}>Open: join codes work</option>
<option value="closed"${values.status === 'closed' ? html` selected` : ''}>Closed: join codes stop working</option>
</select>
<p class="hint" id="status-hint">Attempts already started keep the items they were given.</p>
${message('status')}
</div>`
    : ''
}
<p class="draft-note" id="draft-note" hidden></p>
<button type="submit">${options.submitLabel}</button>
</form>`;
}

const fieldLabels: Readonly<Record<StudyFormField, string>> = {
  title: 'Title',
  pool: 'Item pool',
  design: 'Form design',
  seTarget: 'Stop at standard error',
  minItems: 'At least this many items',
  maxItems: 'Items per attempt',
  timeLimitSeconds: 'Time limit',
  consentText: 'Consent text',
  background: 'Background questions',
  kiosk: 'Kiosk mode',
  idleSeconds: 'Seconds before the kiosk starts over',
  endSummary: 'End summary',
  rubricRaters: 'Scores per written answer',
  status: 'Status',
  other: 'Settings not on this form',
};

/** The element a problem in the summary links to. */
function fieldAnchor(field: StudyFormField): string {
  if (field === 'design') return 'design-fixed';
  if (field === 'rubricRaters') return 'rubricRaters-1';
  if (field === 'other') return 'other-error';
  return field;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** "1 item matches", "12 items match", "No item matches: widen the filters." */
export function countSentence(count: number): string {
  if (count === 0) return 'No item matches these filters: widen them.';
  return count === 1 ? '1 item matches these filters.' : `${count} items match these filters.`;
}
