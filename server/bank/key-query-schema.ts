import { z } from 'zod';
import { fieldNameSchema } from '../charts/chart-spec.js';

/**
 * Declarative key queries: how the key of a `read` item is computed from its chart's rows.
 * One small zod schema per operation, discriminated by `op`. Evaluation lives in `key-query.ts`.
 *
 * A query answers a number (rounded to `round` decimals when given), a category (string or number
 * as it appears in the data), or a list of categories (`categories-where`, for multiple choice).
 */

/** Row filter: every named field equals the given value. */
export const whereSchema = z.record(fieldNameSchema, z.union([z.string(), z.number()]));
export type Where = z.infer<typeof whereSchema>;

/** Decimals kept in a numeric answer (round half away from zero). */
const round = z.number().int().min(0).max(6).optional();

/** How rows sharing a category are combined before comparing categories. */
export const aggregates = ['sum', 'mean', 'median', 'count'] as const;
export type Aggregate = (typeof aggregates)[number];
const aggregate = z.enum(aggregates).default('sum');

export interface ValueAtQuery {
  op: 'value-at';
  field: string;
  where: Where;
  round?: number | undefined;
}
export interface ExtremeQuery {
  op: 'largest' | 'smallest';
  field: string;
  by: string;
  aggregate: Aggregate;
  where?: Where | undefined;
}
export interface DifferenceQuery {
  op: 'difference';
  a: KeyQuery;
  b: KeyQuery;
  absolute: boolean;
  round?: number | undefined;
}
export interface RatioQuery {
  op: 'ratio';
  a: KeyQuery;
  b: KeyQuery;
  round?: number | undefined;
}
export interface SumQuery {
  op: 'sum';
  field: string;
  where?: Where | undefined;
  round?: number | undefined;
}
export interface CountQuery {
  op: 'count';
  where?: Where | undefined;
  field?: string | undefined;
  above?: number | undefined;
  below?: number | undefined;
}
export interface RankQuery {
  op: 'rank';
  field: string;
  by: string;
  equals: string | number;
  order: 'descending' | 'ascending';
  aggregate: Aggregate;
  where?: Where | undefined;
}
export interface CategoriesWhereQuery {
  op: 'categories-where';
  field: string;
  by: string;
  aggregate: Aggregate;
  above?: number | undefined;
  below?: number | undefined;
  where?: Where | undefined;
}
export interface BinCountQuery {
  op: 'bin-count';
  from: number;
  to: number;
}
export const boxStatistics = [
  'median',
  'lower-quartile',
  'upper-quartile',
  'interquartile-range',
  'lowest',
  'highest',
] as const;
export type BoxStatistic = (typeof boxStatistics)[number];
export interface BoxStatisticQuery {
  op: 'box-statistic';
  box: string | number;
  statistic: BoxStatistic;
  round?: number | undefined;
}
export interface DegreeQuery {
  op: 'degree';
  node: string;
  direction: 'all' | 'in' | 'out';
}
export interface MostConnectedQuery {
  op: 'most-connected';
  direction: 'all' | 'in' | 'out';
}
export interface ShareQuery {
  op: 'share';
  equals: string | number;
  by?: string | undefined;
  field?: string | undefined;
  where?: Where | undefined;
  round?: number | undefined;
}

export type KeyQuery =
  | ValueAtQuery
  | ExtremeQuery
  | DifferenceQuery
  | RatioQuery
  | SumQuery
  | CountQuery
  | RankQuery
  | CategoriesWhereQuery
  | BinCountQuery
  | BoxStatisticQuery
  | DegreeQuery
  | MostConnectedQuery
  | ShareQuery;

export type KeyQueryOp = KeyQuery['op'];

/** `value-at`: the value of `field` in the one row where every `where` field matches. */
export const valueAtQuerySchema = z.strictObject({
  op: z.literal('value-at'),
  field: fieldNameSchema,
  where: whereSchema,
  round,
});

/** `largest` / `smallest`: the `by` category whose aggregated `field` is highest / lowest. */
export const largestQuerySchema = z.strictObject({
  op: z.literal('largest'),
  field: fieldNameSchema,
  by: fieldNameSchema,
  aggregate,
  where: whereSchema.optional(),
});
export const smallestQuerySchema = largestQuerySchema.extend({ op: z.literal('smallest') });

/** `difference`: a minus b (or |a - b| with `absolute`), both numeric sub-queries. */
export const differenceQuerySchema = z.strictObject({
  op: z.literal('difference'),
  get a(): z.ZodType<KeyQuery> {
    return keyQuerySchema;
  },
  get b(): z.ZodType<KeyQuery> {
    return keyQuerySchema;
  },
  absolute: z.boolean().default(false),
  round,
});

/** `ratio`: a divided by b, both numeric sub-queries. */
export const ratioQuerySchema = z.strictObject({
  op: z.literal('ratio'),
  get a(): z.ZodType<KeyQuery> {
    return keyQuerySchema;
  },
  get b(): z.ZodType<KeyQuery> {
    return keyQuerySchema;
  },
  round,
});

/** `sum`: total of `field` over the rows matching `where` (all rows when absent). */
export const sumQuerySchema = z.strictObject({
  op: z.literal('sum'),
  field: fieldNameSchema,
  where: whereSchema.optional(),
  round,
});

/** `count`: rows matching `where` whose `field` is strictly above / below the thresholds. */
export const countQuerySchema = z
  .strictObject({
    op: z.literal('count'),
    where: whereSchema.optional(),
    field: fieldNameSchema.optional(),
    above: z.number().finite().optional(),
    below: z.number().finite().optional(),
  })
  .refine((q) => q.field !== undefined || (q.above === undefined && q.below === undefined), {
    message: 'count with above or below needs field',
    path: ['field'],
  });

/** `rank`: 1-based position of category `equals` when categories are sorted by aggregated `field`. */
export const rankQuerySchema = z.strictObject({
  op: z.literal('rank'),
  field: fieldNameSchema,
  by: fieldNameSchema,
  equals: z.union([z.string(), z.number()]),
  order: z.enum(['descending', 'ascending']).default('descending'),
  aggregate,
  where: whereSchema.optional(),
});

/** `categories-where`: every `by` category whose aggregated `field` is above / below a threshold. */
export const categoriesWhereQuerySchema = z
  .strictObject({
    op: z.literal('categories-where'),
    field: fieldNameSchema,
    by: fieldNameSchema,
    aggregate,
    above: z.number().finite().optional(),
    below: z.number().finite().optional(),
    where: whereSchema.optional(),
  })
  .refine((q) => q.above !== undefined || q.below !== undefined, {
    message: 'categories-where needs above or below',
    path: ['above'],
  });

/** `bin-count` (histogram): observations of the chart's `value` field in [from, to). */
export const binCountQuerySchema = z
  .strictObject({ op: z.literal('bin-count'), from: z.number().finite(), to: z.number().finite() })
  .refine((q) => q.to > q.from, { message: 'bin-count needs to > from', path: ['to'] });

/** `box-statistic` (box plot): a statistic of one box; quartiles by R type 7 (= d3.quantile). */
export const boxStatisticQuerySchema = z.strictObject({
  op: z.literal('box-statistic'),
  box: z.union([z.string(), z.number()]),
  statistic: z.enum(boxStatistics),
  round,
});

const direction = z.enum(['all', 'in', 'out']).default('all');

/** `degree` (network): number of links that touch `node` (in, out or all for directed networks). */
export const degreeQuerySchema = z.strictObject({
  op: z.literal('degree'),
  node: fieldNameSchema,
  direction,
});

/** `most-connected` (network): the id of the node with the highest degree. */
export const mostConnectedQuerySchema = z.strictObject({ op: z.literal('most-connected'), direction });

/**
 * `share` (pie, treemap, any chart with a category and a value): percent of the total of `field`
 * held by rows whose `by` equals `equals`. `by` and `field` default to the chart's category and value.
 */
export const shareQuerySchema = z.strictObject({
  op: z.literal('share'),
  equals: z.union([z.string(), z.number()]),
  by: fieldNameSchema.optional(),
  field: fieldNameSchema.optional(),
  where: whereSchema.optional(),
  round,
});

export const keyQuerySchema: z.ZodType<KeyQuery> = z.discriminatedUnion('op', [
  valueAtQuerySchema,
  largestQuerySchema,
  smallestQuerySchema,
  differenceQuerySchema,
  ratioQuerySchema,
  sumQuerySchema,
  countQuerySchema,
  rankQuerySchema,
  categoriesWhereQuerySchema,
  binCountQuerySchema,
  boxStatisticQuerySchema,
  degreeQuerySchema,
  mostConnectedQuerySchema,
  shareQuerySchema,
]);

/** What a key query answers. */
export type KeyAnswer = number | string | readonly (string | number)[];
