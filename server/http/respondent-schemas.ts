import { z } from 'zod';
import { answerSchema } from '../delivery/answer.js';
import { attemptSteps } from '../delivery/attempt-state.js';

/**
 * Response schemas of the respondent API. They are the last guard against leaks: the serializer
 * drops every key not listed here, so a key, score or rationale added to a view by mistake never
 * reaches the page.
 */
const optionSchema = z.object({ id: z.string(), text: z.string() });

export const attemptStateSchema = z.object({
  step: z.enum(attemptSteps),
  study: z.object({
    title: z.string(),
    consentText: z.string(),
    kiosk: z.boolean(),
    idleSeconds: z.number().int(),
    endSummary: z.boolean(),
  }),
  progress: z.object({ answered: z.number().int(), total: z.number().int() }),
  background: z
    .array(z.object({ id: z.string(), prompt: z.string(), options: z.array(optionSchema) }))
    .optional(),
  item: z
    .object({
      itemId: z.string(),
      version: z.number().int(),
      chartSvg: z.string(),
      chartImage: z.object({ src: z.string(), alt: z.string() }).optional(),
      prompt: z.string(),
      responseKind: z.enum(['single-choice', 'multiple-choice', 'numeric', 'short-text']),
      options: z.array(optionSchema).optional(),
      unit: z.string().optional(),
      min: z.number().optional(),
      max: z.number().optional(),
      maxLength: z.number().int().optional(),
      position: z.number().int(),
    })
    .optional(),
  summary: z.object({ answered: z.number().int(), chartsRead: z.number().int() }).optional(),
});

export const joinBodySchema = z.strictObject({ code: z.string().min(1).max(40) });
export const joinReplySchema = z.object({ token: z.string(), attempt: attemptStateSchema });
export const consentBodySchema = z.strictObject({ agree: z.boolean() });
export const backgroundBodySchema = z.strictObject({
  answers: z.record(z.string().max(60), z.string().max(60)),
});
export const responseBodySchema = z.strictObject({
  itemId: z.string().min(1).max(120),
  answer: answerSchema,
  clientMs: z
    .number()
    .min(0)
    .max(24 * 3600 * 1000)
    .optional(),
});
export const responseReplySchema = z.object({
  status: z.enum(['stored', 'already-stored']),
  attempt: attemptStateSchema,
});
