import type { BackgroundQuestion, StudySettings } from '../../delivery/study-settings.js';

/**
 * What the study form holds, as typed (text), so a refused form is shown again exactly as it was
 * sent. `settingsFromForm` turns it into settings input for the shared zod schema
 * (server/delivery/study-settings.ts), which stays the one place that decides what is valid.
 */
export interface StudyFormValues {
  title: string;
  chartTypes: string[];
  levels: string[];
  scenarios: string[];
  design: string;
  maxItems: string;
  timeLimitSeconds: string;
  consentText: string;
  /** Background questions in the plain text format of {@link formatBackground}. */
  background: string;
  kiosk: boolean;
  idleSeconds: string;
  endSummary: boolean;
  /** People who score each written answer: `1` or `2` (setting `rubricRaters`). */
  rubricRaters: string;
  seTarget: string;
  minItems: string;
  /** `open` or `closed`; only on the edit form. */
  status: string;
}

/** The form's fields, in the order the form shows them: problems are listed in this order too. */
export const studyFormFields = [
  'title',
  'pool',
  'design',
  'seTarget',
  'minItems',
  'maxItems',
  'timeLimitSeconds',
  'consentText',
  'background',
  'kiosk',
  'idleSeconds',
  'endSummary',
  'rubricRaters',
  'status',
  /** Settings this form does not show (kept from the stored study): problems listed at the top. */
  'other',
] as const;
export type StudyFormField = (typeof studyFormFields)[number];

/** One problem with one field of the form, as shown next to the field. */
export interface FormProblem {
  field: StudyFormField;
  problem: string;
}

type FormBody = Readonly<Record<string, string | string[] | undefined>>;

const list = (value: string | string[] | undefined): string[] =>
  (value === undefined ? [] : Array.isArray(value) ? value : [value]).filter((v) => v !== '');
const text = (value: string | string[] | undefined): string =>
  value === undefined ? '' : Array.isArray(value) ? (value[0] ?? '') : value;

/** Form values from a posted form (urlencoded; repeated names are lists). */
export function formValuesFromBody(body: FormBody): StudyFormValues {
  return {
    title: text(body.title),
    chartTypes: list(body.chartTypes),
    levels: list(body.levels),
    scenarios: list(body.scenarios),
    design: text(body.design) || 'fixed',
    maxItems: text(body.maxItems).trim(),
    timeLimitSeconds: text(body.timeLimitSeconds).trim(),
    consentText: text(body.consentText).replace(/\r\n/g, '\n'),
    background: text(body.background).replace(/\r\n/g, '\n'),
    kiosk: text(body.kiosk) === 'on',
    idleSeconds: text(body.idleSeconds).trim(),
    endSummary: text(body.endSummary) === 'on',
    rubricRaters: text(body.rubricRaters) || '1',
    seTarget: text(body.seTarget).trim(),
    minItems: text(body.minItems).trim(),
    status: text(body.status) || 'open',
  };
}

/**
 * Background questions as plain text, one block per question:
 * ```
 * works-with-data: Do you work with data in your job?
 * - yes: Yes
 * - no: No
 * ```
 * "Prefer not to say" is added by the server and never written here.
 */
export function formatBackground(questions: readonly BackgroundQuestion[]): string {
  return questions
    .map((q) => [`${q.id}: ${q.prompt}`, ...q.options.map((o) => `- ${o.id}: ${o.text}`)].join('\n'))
    .join('\n\n');
}

/**
 * Parses the background text (see {@link formatBackground}) into question objects for the schema.
 * Only the shape of the text is checked here (a line that is neither a question nor an option);
 * ids, lengths and counts are the schema's.
 */
export function parseBackground(source: string): { questions: unknown[]; problems: string[] } {
  const questions: { id: string; prompt: string; options: { id: string; text: string }[] }[] = [];
  const problems: string[] = [];
  source.split('\n').forEach((rawLine, index) => {
    const line = rawLine.trim();
    if (line === '') return;
    const option = /^-\s*([^:]*):\s*(.*)$/.exec(line);
    if (option) {
      const question = questions[questions.length - 1];
      if (question === undefined) problems.push(`line ${index + 1}: an option before any question`);
      else question.options.push({ id: option[1]!.trim(), text: option[2]!.trim() });
      return;
    }
    const question = /^([^:-][^:]*):\s*(.*)$/.exec(line);
    if (question) {
      questions.push({ id: question[1]!.trim(), prompt: question[2]!.trim(), options: [] });
      return;
    }
    problems.push(`line ${index + 1}: write "id: question" or "- id: option text"`);
  });
  return { questions, problems };
}

/** A whole number typed in a field, or a problem; blank is undefined (the schema's default). */
function wholeNumber(value: string, field: StudyFormField, problems: FormProblem[]): number | undefined {
  if (value === '') return undefined;
  if (!/^-?\d+$/.test(value)) {
    problems.push({ field, problem: 'must be a whole number' });
    return undefined;
  }
  return Number(value);
}

function decimalNumber(value: string, field: StudyFormField, problems: FormProblem[]): number | undefined {
  if (value === '') return undefined;
  if (!/^-?(\d+\.?\d*|\.\d+)$/.test(value)) {
    problems.push({ field, problem: 'must be a number such as 0.45' });
    return undefined;
  }
  return Number(value);
}

/** The settings keys the form edits; every other stored key is kept as it is. */
const formKeys = [
  'title',
  'pool',
  'design',
  'adaptive',
  'maxItems',
  'timeLimitSeconds',
  'consentText',
  'background',
  'kiosk',
  'idleSeconds',
  'endSummary',
  'rubricRaters',
] as const;

/**
 * Settings input from the form, for the shared schema. Starts from the previous settings, so what
 * the form does not show (explicit item ids, common items, pilots per attempt, the
 * adaptive block's other keys, settings added later) is kept; the adaptive block is written only for
 * an adaptive design or when the study had one. A blank number takes the schema's default (a blank
 * time limit: none).
 */
export function settingsFromForm(
  values: StudyFormValues,
  previous?: StudySettings,
): { input: Record<string, unknown>; problems: FormProblem[] } {
  const problems: FormProblem[] = [];
  const maxItems = wholeNumber(values.maxItems, 'maxItems', problems);
  const timeLimitSeconds = wholeNumber(values.timeLimitSeconds, 'timeLimitSeconds', problems);
  const idleSeconds = wholeNumber(values.idleSeconds, 'idleSeconds', problems);
  const seTarget = decimalNumber(values.seTarget, 'seTarget', problems);
  const minItems = wholeNumber(values.minItems, 'minItems', problems);
  const rubricRaters = wholeNumber(values.rubricRaters, 'rubricRaters', problems);
  const background = parseBackground(values.background);
  for (const problem of background.problems) problems.push({ field: 'background', problem });

  const kept: Record<string, unknown> = { ...(previous ?? {}) };
  for (const key of formKeys) delete kept[key];
  const { chartTypes: _c, levels: _l, scenarios: _s, ...otherPool } = previous?.pool ?? {};
  const pool: Record<string, unknown> = {
    ...(values.chartTypes.length > 0 ? { chartTypes: values.chartTypes } : {}),
    ...(values.levels.length > 0 ? { levels: values.levels } : {}),
    ...(values.scenarios.length > 0 ? { scenarios: values.scenarios } : {}),
    ...otherPool,
  };
  const adaptive =
    values.design === 'adaptive' || previous?.adaptive !== undefined
      ? {
          ...(previous?.adaptive ?? {}),
          ...(seTarget === undefined ? {} : { seTarget }),
          ...(minItems === undefined ? {} : { minItems }),
        }
      : undefined;
  const input: Record<string, unknown> = {
    ...kept,
    title: values.title,
    pool,
    design: values.design,
    ...(adaptive === undefined ? {} : { adaptive }),
    ...(maxItems === undefined ? {} : { maxItems }),
    ...(timeLimitSeconds === undefined ? {} : { timeLimitSeconds }),
    ...(values.consentText.trim() === '' ? {} : { consentText: values.consentText }),
    background: background.questions,
    kiosk: values.kiosk,
    ...(idleSeconds === undefined ? {} : { idleSeconds }),
    endSummary: values.endSummary,
    ...(rubricRaters === undefined ? {} : { rubricRaters }),
  };
  return { input, problems };
}

/** The form showing stored settings (the edit page). */
export function formValuesFromSettings(settings: StudySettings, status: 'open' | 'closed'): StudyFormValues {
  return {
    title: settings.title,
    chartTypes: [...(settings.pool.chartTypes ?? [])],
    levels: [...(settings.pool.levels ?? [])],
    scenarios: [...(settings.pool.scenarios ?? [])],
    design: settings.design,
    maxItems: String(settings.maxItems),
    timeLimitSeconds: settings.timeLimitSeconds === undefined ? '' : String(settings.timeLimitSeconds),
    consentText: settings.consentText,
    background: formatBackground(settings.background),
    kiosk: settings.kiosk,
    idleSeconds: String(settings.idleSeconds),
    endSummary: settings.endSummary,
    rubricRaters: String(settings.rubricRaters),
    seTarget: settings.adaptive === undefined ? '0.45' : String(settings.adaptive.seTarget),
    minItems: settings.adaptive === undefined ? '5' : String(settings.adaptive.minItems),
    status,
  };
}

/** The new-study form: the schema's defaults, an empty title. */
export function emptyFormValues(defaultConsent: string): StudyFormValues {
  return {
    title: '',
    chartTypes: [],
    levels: [],
    scenarios: [],
    design: 'fixed',
    maxItems: '20',
    timeLimitSeconds: '',
    consentText: defaultConsent,
    background: '',
    kiosk: false,
    idleSeconds: '90',
    endSummary: false,
    rubricRaters: '1',
    seTarget: '0.45',
    minItems: '5',
    status: 'open',
  };
}

/**
 * The form field a settings problem belongs to, from the schema's path (`body.pool.chartTypes.0`,
 * `adaptive.seTarget`, `background.1.options`): the pool's filters are one field, the adaptive
 * block's keys are their own fields, a setting the form does not show is `other` (listed at the top).
 */
export function formFieldOf(path: readonly string[]): StudyFormField {
  const parts = path[0] === 'body' ? path.slice(1) : path;
  const [head, next] = parts;
  if (head === 'pool') return 'pool';
  if (head === 'adaptive') return next === 'minItems' ? 'minItems' : 'seTarget';
  if (head === 'other') return 'other';
  if (head !== undefined && (studyFormFields as readonly string[]).includes(head))
    return head as StudyFormField;
  return 'other';
}

const plainWords: readonly [RegExp, (n: string) => string][] = [
  [/^Too small: expected number to be >=(\S+)$/, (n) => `must be at least ${n}`],
  [/^Too big: expected number to be <=(\S+)$/, (n) => `must be at most ${n}`],
  [/^Too small: expected string to have >=1 characters$/, () => 'must not be empty'],
  [/^Too small: expected string to have >=(\d+) characters$/, (n) => `must have at least ${n} characters`],
  [/^Too big: expected string to have <=(\d+) characters$/, (n) => `must have at most ${n} characters`],
  [/^Too small: expected array to have >=(\d+) items$/, (n) => `needs at least ${n}`],
  [/^Too big: expected array to have <=(\d+) items$/, (n) => `takes at most ${n}`],
  [/^Invalid option: expected one of .*$/, () => 'is not one of the choices'],
];

/** The schema's range messages in plain words ("Too small: expected number to be >=1" → "must be at least 1"). */
export function plainProblem(problem: string): string {
  for (const [pattern, say] of plainWords) {
    const match = pattern.exec(problem);
    if (match) return say(match[1] ?? '');
  }
  return problem;
}

/** A schema problem in the words of the form: background problems name the question. */
export function describeProblem(path: readonly string[], rawProblem: string): string {
  const problem = plainProblem(rawProblem);
  const parts = path[0] === 'body' ? path.slice(1) : path;
  if (parts[0] === 'background' && parts[1] !== undefined && /^\d+$/.test(parts[1])) {
    const rest = parts.slice(2).filter((p) => !/^\d+$/.test(p));
    return `question ${Number(parts[1]) + 1}${rest.length > 0 ? ` (${rest.join('.')})` : ''}: ${problem}`;
  }
  if (parts[0] === 'pool' && parts.length > 1) return `${parts[1]}: ${problem}`;
  if (formFieldOf(parts) === 'other' && parts.length > 0) return `${parts.join('.')}: ${problem}`;
  return problem;
}
