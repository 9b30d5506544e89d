import { describe, expect, it } from 'vitest';
import { studySettingsSchema } from '../../server/delivery/study-settings.js';
import { consentLine, startPage } from '../../server/pages/console/kiosk-sign-page.js';
import {
  describeProblem,
  formatBackground,
  formFieldOf,
  formValuesFromBody,
  formValuesFromSettings,
  parseBackground,
  plainProblem,
  settingsFromForm,
} from '../../server/pages/console/study-form-values.js';

describe('study form values', () => {
  it('reads repeated checkboxes as lists, unticked boxes as off, and keeps typed text', () => {
    const values = formValuesFromBody({
      title: ' Corrowen library ',
      levels: ['read', 'envision'],
      chartTypes: 'bar',
      kiosk: 'on',
      maxItems: ' 12 ',
      consentText: 'Line one\r\nLine two',
    });
    expect(values).toMatchObject({
      title: ' Corrowen library ',
      levels: ['read', 'envision'],
      chartTypes: ['bar'],
      scenarios: [],
      kiosk: true,
      endSummary: false,
      design: 'fixed',
      maxItems: '12',
      consentText: 'Line one\nLine two',
    });
  });

  it('round-trips background questions through the text format', () => {
    const questions = [
      {
        id: 'visits',
        prompt: 'How often do you come to Corrowen library: weekly?',
        options: [
          { id: 'weekly', text: 'Every week' },
          { id: 'rarely', text: 'Now and then: a few times a year' },
        ],
      },
      {
        id: 'age-band',
        prompt: 'Your age',
        options: [
          { id: 'under-18', text: 'Under 18' },
          { id: 'adult', text: '18 or older' },
        ],
      },
    ];
    const text = formatBackground(questions);
    expect(text).toBe(
      'visits: How often do you come to Corrowen library: weekly?\n- weekly: Every week\n- rarely: Now and then: a few times a year\n\nage-band: Your age\n- under-18: Under 18\n- adult: 18 or older',
    );
    expect(parseBackground(text)).toEqual({ questions, problems: [] });
  });

  it('names the line of a background text it cannot read', () => {
    expect(parseBackground('- yes: Yes\nq: A question\nno colon here').problems).toEqual([
      'line 1: an option before any question',
      'line 3: write "id: question" or "- id: option text"',
    ]);
  });

  it('builds schema input: blank numbers take the defaults, a word in a number field is a problem', () => {
    const values = formValuesFromBody({
      title: 'T',
      maxItems: '',
      idleSeconds: 'soon',
      seTarget: '0,4',
      design: 'adaptive',
    });
    const { input, problems } = settingsFromForm(values);
    expect(problems).toEqual([
      { field: 'idleSeconds', problem: 'must be a whole number' },
      { field: 'seTarget', problem: 'must be a number such as 0.45' },
    ]);
    expect(input.maxItems).toBeUndefined();
    // An adaptive design gets its block; the refused SE target and the blank minimum are left to the defaults.
    expect(input.adaptive).toEqual({});
    const parsed = studySettingsSchema.parse(settingsFromForm(formValuesFromBody({ title: 'T' })).input);
    expect(parsed).toMatchObject({ maxItems: 20, idleSeconds: 90, design: 'fixed', background: [] });
    expect(parsed.adaptive).toBeUndefined();
  });

  it('keeps every stored setting the form does not show, and lets a blank time limit remove the limit', () => {
    const previous = studySettingsSchema.parse({
      title: 'Before',
      design: 'rotated',
      maxItems: 6,
      timeLimitSeconds: 900,
      commonItems: ['a-item'],
      rubricRaters: 2,
      pilotsPerAttempt: 0,
    });
    const values = { ...formValuesFromSettings(previous, 'open'), timeLimitSeconds: '', title: 'After' };
    const { input } = settingsFromForm(values, previous);
    expect(input).toMatchObject({
      title: 'After',
      commonItems: ['a-item'],
      rubricRaters: 2,
      pilotsPerAttempt: 0,
      maxItems: 6,
    });
    expect(input.timeLimitSeconds).toBeUndefined();
    expect(studySettingsSchema.parse(input).timeLimitSeconds).toBeUndefined();
  });

  it('keeps what the form cannot edit: listed item ids and the other adaptive keys', () => {
    const previous = studySettingsSchema.parse({
      title: 'Before',
      design: 'adaptive',
      pool: { itemIds: ['a-item', 'b-item'] },
      adaptive: { seTarget: 0.5, randomesque: 3, contentBalance: 'none' },
    });
    const values = { ...formValuesFromSettings(previous, 'open'), seTarget: '0.4' };
    const { input } = settingsFromForm(values, previous);
    expect(input.pool).toEqual({ itemIds: ['a-item', 'b-item'] });
    expect(input.adaptive).toMatchObject({
      seTarget: 0.4,
      randomesque: 3,
      contentBalance: 'none',
      minItems: 5,
    });
  });

  it('sets two scorers per written answer, shows it again on the edit form, and refuses a third', () => {
    const two = settingsFromForm(formValuesFromBody({ title: 'Sprout Lane tasters', rubricRaters: '2' }));
    expect(two.problems).toEqual([]);
    const settings = studySettingsSchema.parse(two.input);
    expect(settings.rubricRaters).toBe(2);
    expect(formValuesFromSettings(settings, 'open').rubricRaters).toBe('2');
    // Left unset, the schema's default of one scorer stands.
    const one = settingsFromForm(formValuesFromBody({ title: 'Sprout Lane tasters' }));
    expect(studySettingsSchema.parse(one.input).rubricRaters).toBe(1);
    // A forged 3 reaches the schema and is refused on this field.
    const three = studySettingsSchema.safeParse(
      settingsFromForm(formValuesFromBody({ title: 'x', rubricRaters: '3' })).input,
    );
    expect(three.success).toBe(false);
    expect(three.error?.issues.map((i) => formFieldOf(i.path.map(String)))).toContain('rubricRaters');
  });

  it('maps schema paths to form fields and says range problems plainly', () => {
    expect(formFieldOf(['body', 'pool', 'chartTypes', '0'])).toBe('pool');
    expect(formFieldOf(['adaptive', 'seTarget'])).toBe('seTarget');
    expect(formFieldOf(['adaptive', 'minItems'])).toBe('minItems');
    expect(formFieldOf(['background', '1', 'options'])).toBe('background');
    expect(formFieldOf(['maxItems'])).toBe('maxItems');
    expect(formFieldOf(['commonItems'])).toBe('other');
    expect(describeProblem(['body', 'commonItems'], 'not items of the pool')).toBe(
      'commonItems: not items of the pool',
    );
    expect(
      describeProblem(['background', '1', 'options'], 'Too small: expected array to have >=2 items'),
    ).toBe('question 2 (options): needs at least 2');
    expect(describeProblem(['pool', 'scenarios', '0'], 'use kebab-case')).toBe('scenarios: use kebab-case');
    expect(plainProblem('Too small: expected number to be >=30')).toBe('must be at least 30');
    expect(plainProblem('Too big: expected number to be <=3600')).toBe('must be at most 3600');
    expect(plainProblem('Too small: expected string to have >=1 characters')).toBe('must not be empty');
    expect(plainProblem('option ids must be unique')).toBe('option ids must be unique');
  });
});

describe('consentLine', () => {
  it('takes the first sentence of the consent text', () => {
    expect(consentLine('Taking part is up to you. Answers are stored without names.')).toBe(
      'Taking part is up to you.',
    );
    expect(consentLine('No full stop here')).toBe('No full stop here');
    expect(consentLine('Version 2.5 of the activity is short! More text.')).toBe(
      'Version 2.5 of the activity is short!',
    );
  });

  it('cuts a long first sentence at a word, at most 160 characters', () => {
    const long = `${'word '.repeat(60)}end.`;
    const line = consentLine(long);
    expect(line.length).toBeLessThanOrEqual(160);
    expect(line.endsWith('…')).toBe(true);
    expect(line).not.toMatch(/wor…$/);
  });
});

describe('startPage', () => {
  it('is the join link without its /join/<code> part', () => {
    expect(startPage('https://charts.example.org/join/ABCD-12')).toBe('https://charts.example.org/');
    expect(startPage('https://charts.example.org/museum/join/ABCD-12')).toBe(
      'https://charts.example.org/museum/',
    );
  });
});
