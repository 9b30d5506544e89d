import { z } from 'zod';
import { kebabIdSchema, taskLevels } from '../bank/item-schema.js';
import { chartTypes } from '../charts/chart-spec.js';
import { adaptiveStudySettingsSchema } from './adaptive/adaptive-settings.js';

/** The option every background question offers, added by the server (never by the study author). */
export const preferNotToSay = 'prefer-not-to-say';

/**
 * One background question of a study (age band, schooling, works with data, ...). Answers are
 * option ids, never free text: no personal data by default. "Prefer not to say" is always added.
 */
export const backgroundQuestionSchema = z.strictObject({
  id: kebabIdSchema,
  prompt: z.string().min(1).max(200),
  options: z
    .array(z.strictObject({ id: kebabIdSchema, text: z.string().min(1).max(120) }))
    .min(2)
    .max(12)
    .refine((options) => new Set(options.map((o) => o.id)).size === options.length, {
      message: 'option ids must be unique',
    })
    .refine((options) => options.every((o) => o.id !== preferNotToSay), {
      message: `"${preferNotToSay}" is added by the server; do not list it`,
    }),
});
export type BackgroundQuestion = z.infer<typeof backgroundQuestionSchema>;

/**
 * Which items a study draws on. Filters combine with AND; an empty or absent filter allows all.
 * `itemIds`, when given, is the pool itself (in that order) and the other filters still apply.
 */
export const itemPoolSchema = z.strictObject({
  chartTypes: z.array(z.enum(chartTypes)).optional(),
  levels: z.array(z.enum(taskLevels)).optional(),
  scenarios: z.array(kebabIdSchema).optional(),
  itemIds: z.array(kebabIdSchema).min(1).optional(),
});
export type ItemPool = z.infer<typeof itemPoolSchema>;

export const formDesigns = ['fixed', 'rotated', 'adaptive'] as const;
export type FormDesign = (typeof formDesigns)[number];

/** What a study asks of its respondents: pool, form design, limits, consent, background, kiosk. */
export const studySettingsSchema = z
  .strictObject({
    title: z.string().trim().min(1).max(200),
    pool: itemPoolSchema.default({}),
    /**
     * `fixed`: everyone sees one order; `rotated`: linked booklets (see build-booklets.ts);
     * `adaptive`: each next item chosen from the answers so far (needs a calibration; see
     * server/delivery/adaptive-delivery.ts).
     */
    design: z.enum(formDesigns).default('fixed'),
    /** Adaptive design: stop rules, randomesque k, content targets, default prior (absent: defaults). */
    adaptive: adaptiveStudySettingsSchema.optional(),
    /** Items per attempt (per booklet when rotated; the upper bound when adaptive). */
    maxItems: z.number().int().min(1).max(200).default(20),
    /**
     * Rotated design: pool items every booklet opens with (a common block), e.g. items a fairness
     * check must compare across groups; the rest rotate (build-booklets.ts). Fixed and adaptive ignore it.
     */
    commonItems: z
      .array(kebabIdSchema)
      .max(100)
      .refine((ids) => new Set(ids).size === ids.length, { message: 'item ids must be unique' })
      .optional(),
    timeLimitSeconds: z
      .number()
      .int()
      .min(30)
      .max(24 * 3600)
      .optional(),
    consentText: z
      .string()
      .min(1)
      .max(4000)
      .default(
        'This is a short activity about reading charts. Your answers are stored without your name. You can stop at any time.',
      ),
    background: z
      .array(backgroundQuestionSchema)
      .max(10)
      .default([])
      .refine((questions) => new Set(questions.map((q) => q.id)).size === questions.length, {
        message: 'question ids must be unique',
      }),
    kiosk: z.boolean().default(false),
    /** Kiosk: seconds without input before the screen returns to the welcome screen. */
    idleSeconds: z.number().int().min(15).max(3600).default(90),
    /** Show "you read N charts" at the end. Off by default. */
    endSummary: z.boolean().default(false),
    /**
     * People who score each short-text answer against its rubric: 1 (default) or 2 (agreement is then
     * reported as weighted kappa). See server/delivery/rubric-scoring-service.ts.
     */
    rubricRaters: z.union([z.literal(1), z.literal(2)]).default(1),
    /** Pilot charts shown per attempt when the study has active pilots (absent: 1; 0: none). */
    pilotsPerAttempt: z.number().int().min(0).max(5).optional(),
  })
  .refine((s) => s.design !== 'rotated' || s.maxItems >= 2, {
    message: 'a rotated design needs at least 2 items per booklet',
    path: ['maxItems'],
  })
  .refine((s) => s.design !== 'rotated' || (s.commonItems?.length ?? 0) <= s.maxItems - 2, {
    message: 'common items must leave at least 2 places per booklet for rotated items',
    path: ['commonItems'],
  });

/** Settings as stored and used (defaults filled in). */
export type StudySettings = z.infer<typeof studySettingsSchema>;
/** Settings as an author writes them (defaults optional). */
export type StudySettingsInput = z.input<typeof studySettingsSchema>;
