import { z } from 'zod';
import { type AdaptiveState, type ItemStep, stopReasons } from './adaptive/adaptive-state.js';

/**
 * The attempt's `form` JSON: what it presents and how far it got.
 * - `items`: the ordered item ids with the version delivered;
 * - `presentedAt[p]`: when the item at position p was first shown (server clock), for server_ms;
 * - `backgroundDone`: the background step is behind the respondent;
 * - `ended`: 'declined' (no consent) or 'left' (kiosk start-over, idle reset, or leave);
 *   an ended attempt's token no longer opens anything.
 */
export const attemptFormSchema = z.object({
  design: z.enum(['fixed', 'rotated', 'adaptive']),
  booklet: z.number().int().min(0),
  items: z.array(z.object({ itemId: z.string(), version: z.number().int().min(1) })),
  presentedAt: z.array(z.string().nullable()),
  backgroundDone: z.boolean(),
  ended: z.enum(['declined', 'left']).nullable(),
  /** Seeds the option shuffle per attempt (random, not secret). */
  seed: z.string(),
  /**
   * Adaptive design only: the engine's state (plain JSON, see adaptive/adaptive-state.ts), the
   * item step now shown (`pending`, null once stopped), why the attempt stopped, and the
   * calibration whose difficulties it selects on. `items` grows by one entry per item shown.
   */
  adaptive: z
    .object({
      state: z.custom<AdaptiveState>((value) => typeof value === 'object' && value !== null),
      pending: z.custom<ItemStep>((value) => typeof value === 'object' && value !== null).nullable(),
      stop: z.enum(stopReasons).nullable(),
      calibrationId: z.string(),
      /** The stored Sympson–Hetter control the attempt started with (absent: randomesque only). */
      exposureControlId: z.string().optional(),
    })
    .optional(),
  /**
   * Pilot charts of this attempt (see server/delivery/pilots/pilot-slots.ts): each is shown just
   * before the bank item at position `at` (once `at` bank items are answered), and recorded here as
   * shown and answered. Bank positions, progress of the bank part and adaptive stop rules ignore them.
   */
  pilots: z
    .array(
      z.object({
        pilotId: z.string(),
        at: z.number().int().min(0),
        presentedAt: z.string().nullable(),
        answered: z.boolean(),
      }),
    )
    .optional(),
});
export type AttemptForm = z.infer<typeof attemptFormSchema>;
