import { z } from 'zod';

/**
 * The attempt's `form` JSON: what it presents and how far it got.
 * - `items`: the ordered item ids with the version delivered;
 * - `presentedAt[p]`: when the item at position p was first shown (server clock), for server_ms;
 * - `backgroundDone`: the background step is behind the respondent;
 * - `ended`: 'declined' (no consent) or 'left' (kiosk start-over, idle reset, or leave);
 *   an ended attempt's token no longer opens anything.
 */
export const attemptFormSchema = z.object({
  design: z.enum(['fixed', 'rotated']),
  booklet: z.number().int().min(0),
  items: z.array(z.object({ itemId: z.string(), version: z.number().int().min(1) })),
  presentedAt: z.array(z.string().nullable()),
  backgroundDone: z.boolean(),
  ended: z.enum(['declined', 'left']).nullable(),
  /** Seeds the option shuffle per attempt (random, not secret). */
  seed: z.string(),
});
export type AttemptForm = z.infer<typeof attemptFormSchema>;
