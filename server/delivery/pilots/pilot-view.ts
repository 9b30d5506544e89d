import type { PilotRecord } from '../../storage/pilot-repository.js';
import type { RespondentItemView } from '../delivery-bank.js';
import { seededOrder } from '../item-view.js';

/** Where a respondent's page fetches a pilot's image (with its attempt token). */
export function pilotImagePath(pilotId: string): string {
  return `/api/attempt/pilots/${encodeURIComponent(pilotId)}/image`;
}

/**
 * What a respondent sees of a pilot: the same shape as a bank item's view (a single-choice
 * question with "I don't know"), its chart an image with the pilot's alt text. Never the key, and
 * nothing that says it is a pilot; options are shuffled per attempt like a bank item's.
 *
 * @param seed the attempt's option-order seed for this pilot.
 */
export function pilotItemView(
  pilot: Pick<PilotRecord, 'id' | 'prompt' | 'alt' | 'options'>,
  seed: string,
): RespondentItemView {
  const order = seededOrder(pilot.options.length, seed);
  return {
    itemId: pilot.id,
    chartSvg: '',
    chartImage: { src: pilotImagePath(pilot.id), alt: pilot.alt },
    prompt: pilot.prompt,
    responseKind: 'single-choice',
    options: order.map((i) => ({ id: pilot.options[i]!.id, text: pilot.options[i]!.text })),
  };
}
