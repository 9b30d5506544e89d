import { z } from 'zod';
import { chartSpecSchema } from '../charts/chart-spec.js';
import { keyQuerySchema } from './key-query-schema.js';

/**
 * The item file format: one JSON file per item at `items/<scenario>/<id>.json`.
 *
 * An item is one chart with one question and a key. `read` items carry a key query that code
 * evaluates over the chart's rows (a typed-in key cannot disagree with the data); `interpret` and
 * `envision` items name the keyed option(s) explicitly and explain why in `rationale`.
 * Complexity features that can be computed from the chart are derived by `derive-features.ts`;
 * the file carries only the authored extras in `features`.
 */

/** kebab-case: lower-case letters and digits in groups joined by single hyphens. */
export const kebabIdSchema = z
  .string()
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'use kebab-case: lower-case letters, digits and single hyphens');

export const itemStatuses = ['active', 'retired', 'draft'] as const;
export type ItemStatus = (typeof itemStatuses)[number];

export const taskLevels = ['read', 'interpret', 'envision'] as const;
export type TaskLevel = (typeof taskLevels)[number];

/** One scenario of `items/scenarios.json`. */
export const scenarioSchema = z.strictObject({
  id: kebabIdSchema,
  name: z.string().min(1),
  summary: z.string().min(1),
});
export type Scenario = z.infer<typeof scenarioSchema>;
export const scenariosFileSchema = z.array(scenarioSchema).min(1);

/** A choice option. `value` is what a key query's answer is matched against (read items need it). */
export const optionSchema = z.strictObject({
  id: kebabIdSchema,
  text: z.string().min(1).max(200),
  value: z.union([z.string(), z.number().finite()]).optional(),
});
export type ItemOption = z.infer<typeof optionSchema>;

/**
 * May the delivery shuffle the options? `any`: yes; `fixed`: keep the authored order (ordered
 * numeric options, scales).
 */
const optionOrder = z.enum(['any', 'fixed']).default('any');

export const singleChoiceResponseSchema = z.strictObject({
  kind: z.literal('single-choice'),
  options: z.array(optionSchema).min(3).max(5),
  optionOrder,
});

/** Choose all that apply; scored correct when exactly the keyed options are chosen. */
export const multipleChoiceResponseSchema = z.strictObject({
  kind: z.literal('multiple-choice'),
  options: z.array(optionSchema).min(3).max(6),
  optionOrder,
});

/** A typed number; correct when |answer - key| <= tolerance. `min`/`max` bound what the input accepts. */
export const numericResponseSchema = z
  .strictObject({
    kind: z.literal('numeric'),
    unit: z.string().min(1),
    tolerance: z.number().finite().min(0),
    min: z.number().finite().optional(),
    max: z.number().finite().optional(),
  })
  .refine((r) => r.min === undefined || r.max === undefined || r.min < r.max, {
    message: 'min must be below max',
    path: ['max'],
  });

export const rubricLevelSchema = z.strictObject({
  score: z.union([z.literal(0), z.literal(1), z.literal(2)]),
  description: z.string().min(1),
});

/** Free text, scored later by people against a rubric with levels 0, 1 and 2. */
export const shortTextResponseSchema = z.strictObject({
  kind: z.literal('short-text'),
  maxLength: z.number().int().min(10).max(2000).default(300),
  rubric: z
    .array(rubricLevelSchema)
    .length(3)
    .refine((levels) => levels.map((l) => l.score).join() === '0,1,2', {
      message: 'rubric needs one level for each score 0, 1, 2 in that order',
    }),
});

export const responseSchema = z.discriminatedUnion('kind', [
  singleChoiceResponseSchema,
  multipleChoiceResponseSchema,
  numericResponseSchema,
  shortTextResponseSchema,
]);
export type ItemResponse = z.infer<typeof responseSchema>;
export type ResponseKind = ItemResponse['kind'];

/**
 * The key.
 * - `query`: computed from the chart data (required for read items with a choice or numeric response).
 *   Choice items: the keyed option(s) are those whose `value` equals the answer. Numeric: the number.
 * - `options`: explicit option ids (interpret and envision choice items).
 * - `number`: an explicit number (interpret and envision numeric items).
 * - `rubric`: short-text items; scored by people with the response's rubric.
 */
export const keySchema = z.discriminatedUnion('by', [
  z.strictObject({ by: z.literal('query'), query: keyQuerySchema }),
  z.strictObject({ by: z.literal('options'), options: z.array(kebabIdSchema).min(1) }),
  z.strictObject({ by: z.literal('number'), value: z.number().finite() }),
  z.strictObject({ by: z.literal('rubric') }),
]);
export type ItemKey = z.infer<typeof keySchema>;

/** Kinds of distractor, named after the reading mistake each one diagnoses. */
export const distractorKinds = [
  'neighbour',
  'gridline',
  'legend-confusion',
  'stacked-top',
  'area-as-length',
  'angle-as-length',
  'ignored-log-scale',
  'truncated-axis',
  'correlation-as-cause',
  'outlier-as-trend',
  'everyday-expectation',
  'wrong-operation',
  'other',
] as const;
export type DistractorKind = (typeof distractorKinds)[number];

/** Authored complexity features; the rest are derived from the chart. */
export const authoredFeaturesSchema = z.strictObject({
  /** The item deliberately tests precise reading (distractors closer than one tick step). */
  precision: z.boolean().optional(),
  /** The mistakes the distractors model. */
  distractorKinds: z.array(z.enum(distractorKinds)).optional(),
  /** The item needs more than one step (e.g. read two values, then subtract). */
  multiStep: z.boolean().optional(),
});
export type AuthoredFeatures = z.infer<typeof authoredFeaturesSchema>;

export const itemSchema = z
  .strictObject({
    id: kebabIdSchema,
    scenario: kebabIdSchema,
    status: z.enum(itemStatuses),
    level: z.enum(taskLevels),
    chart: chartSpecSchema,
    prompt: z.string().min(5).max(400),
    response: responseSchema,
    key: keySchema,
    /** Text alternative: describes the chart without giving the answer. */
    alt: z.string().min(1).max(1000),
    /** The author's reasoning for the key, grounded in the data. */
    rationale: z.string().min(10).max(1000),
    features: authoredFeaturesSchema.default({}),
  })
  .superRefine((item, ctx) => {
    const { response, key, level } = item;
    const choice = response.kind === 'single-choice' || response.kind === 'multiple-choice';
    if (choice) {
      const ids = response.options.map((o) => o.id);
      ids.forEach((id, index) => {
        if (ids.indexOf(id) !== index) {
          ctx.addIssue({
            code: 'custom',
            path: ['response', 'options', index, 'id'],
            message: `duplicate option id "${id}"`,
          });
        }
      });
    }
    if (response.kind === 'short-text') {
      if (key.by !== 'rubric')
        ctx.addIssue({
          code: 'custom',
          path: ['key', 'by'],
          message: 'a short-text item needs key { "by": "rubric" }',
        });
      return;
    }
    if (key.by === 'rubric') {
      ctx.addIssue({
        code: 'custom',
        path: ['key', 'by'],
        message: 'key "rubric" is only for short-text items',
      });
      return;
    }
    if (level === 'read' && key.by !== 'query') {
      ctx.addIssue({
        code: 'custom',
        path: ['key', 'by'],
        message: 'a read item needs a key query computed from the data',
      });
    }
    if (key.by === 'number' && response.kind !== 'numeric') {
      ctx.addIssue({
        code: 'custom',
        path: ['key', 'by'],
        message: 'key "number" is only for numeric items',
      });
    }
    if (key.by === 'options') {
      if (!choice) {
        ctx.addIssue({
          code: 'custom',
          path: ['key', 'by'],
          message: 'key "options" is only for choice items',
        });
        return;
      }
      const ids = new Set(response.options.map((o) => o.id));
      key.options.forEach((id, index) => {
        if (!ids.has(id))
          ctx.addIssue({
            code: 'custom',
            path: ['key', 'options', index],
            message: `no option with id "${id}"`,
          });
      });
      if (response.kind === 'single-choice' && key.options.length !== 1) {
        ctx.addIssue({
          code: 'custom',
          path: ['key', 'options'],
          message: 'a single-choice item keys exactly one option',
        });
      }
    }
    if (key.by === 'query' && choice) {
      response.options.forEach((option, index) => {
        if (option.value === undefined) {
          ctx.addIssue({
            code: 'custom',
            path: ['response', 'options', index, 'value'],
            message: 'options of an item keyed by a query need a value',
          });
        }
      });
    }
  });

/** An item file as parsed (defaults filled in). */
export type Item = z.infer<typeof itemSchema>;
/** An item file as written by authors (defaults optional). */
export type ItemInput = z.input<typeof itemSchema>;
