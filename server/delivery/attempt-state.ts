import type { AttemptRecord } from '../storage/attempt-repository.js';
import type { PilotRecord } from '../storage/pilot-repository.js';
import type { AttemptForm } from './attempt-form.js';
import type { DeliveryBank, RespondentItemView } from './delivery-bank.js';
import { duePilot, pilotCount, pilotsAnswered } from './pilots/pilot-slots.js';
import { pilotItemView } from './pilots/pilot-view.js';
import { preferNotToSay, type StudySettings } from './study-settings.js';

export const attemptSteps = ['consent', 'background', 'item', 'finished', 'declined', 'left'] as const;
export type AttemptStep = (typeof attemptSteps)[number];

/** What the respondent page is told about its attempt. Never keys, scores, rationales or features. */
export interface AttemptState {
  step: AttemptStep;
  study: { title: string; consentText: string; kiosk: boolean; idleSeconds: number; endSummary: boolean };
  progress: { answered: number; total: number };
  background?: { id: string; prompt: string; options: { id: string; text: string }[] }[];
  item?: RespondentItemView & { version: number; position: number };
  summary?: { answered: number; chartsRead: number };
}

/** The text of the option every background question gets. */
export const preferNotToSayText = 'I prefer not to say';

/**
 * The step an attempt is at, from its stored record alone:
 * ended (declined/left) → finished → consent → background (when the study asks any) → item → finished.
 */
export function attemptStep(
  attempt: Pick<AttemptRecord, 'status' | 'consentedAt'>,
  form: AttemptForm,
  settings: StudySettings,
  answered: number,
): AttemptStep {
  if (form.ended !== null) return form.ended;
  if (attempt.status === 'finished') return 'finished';
  if (attempt.status === 'abandoned') return 'left';
  if (attempt.consentedAt === null) return 'consent';
  if (settings.background.length > 0 && !form.backgroundDone) return 'background';
  return answered < form.items.length || duePilot(form, answered) !== undefined ? 'item' : 'finished';
}

/**
 * Builds the AttemptState for the page. `answered` counts stored responses; `correct` those scored 1
 * (used only for the optional end summary's friendly count).
 */
export function buildAttemptState(input: {
  attempt: Pick<AttemptRecord, 'status' | 'consentedAt'>;
  form: AttemptForm;
  settings: StudySettings;
  answered: number;
  correct: number;
  bank: DeliveryBank;
  /** The pilot due now (see pilots/pilot-delivery.ts loadDuePilot); required when one is due. */
  pilot?: Pick<PilotRecord, 'id' | 'prompt' | 'alt' | 'options'> | undefined;
}): AttemptState {
  const { attempt, form, settings, answered, correct, bank } = input;
  // The respondent's count includes pilots, so a pilot looks like any other chart.
  const shown = answered + pilotsAnswered(form);
  const step = attemptStep(attempt, form, settings, answered);
  const state: AttemptState = {
    step,
    study: {
      title: settings.title,
      consentText: settings.consentText,
      kiosk: settings.kiosk,
      idleSeconds: settings.idleSeconds,
      endSummary: settings.endSummary,
    },
    // Adaptive: the attempt may stop earlier; the total is the upper bound until it stops.
    progress: {
      answered: shown,
      total:
        (form.adaptive === undefined || form.adaptive.stop !== null ? form.items.length : settings.maxItems) +
        pilotCount(form),
    },
  };
  if (step === 'background') {
    state.background = settings.background.map((question) => ({
      id: question.id,
      prompt: question.prompt,
      options: [
        ...question.options.map((o) => ({ id: o.id, text: o.text })),
        { id: preferNotToSay, text: preferNotToSayText },
      ],
    }));
  }
  const pilot = step === 'item' ? duePilot(form, answered) : undefined;
  if (pilot !== undefined) {
    if (input.pilot?.id !== pilot.pilotId) throw new Error(`buildAttemptState needs pilot ${pilot.pilotId}`);
    state.item = {
      ...pilotItemView(input.pilot, `${form.seed}:${pilot.pilotId}`),
      version: 1,
      position: shown,
    };
  } else if (step === 'item') {
    const entry = form.items[answered]!;
    state.item = {
      ...bank.view(entry.itemId, `${form.seed}:${entry.itemId}`),
      version: entry.version,
      position: shown,
    };
  }
  if (step === 'finished' && settings.endSummary) state.summary = { answered: shown, chartsRead: correct };
  return state;
}
