import { z } from 'zod';

/**
 * The chart part of an item: data plus how it is drawn. One zod schema per chart type,
 * discriminated by `type`. Renderers (`server/charts/<type>-chart.ts`) take the parsed spec and
 * return an SVG string; the bank's key queries and lint read the same `data` and `fields`.
 *
 * Data are always plain rows (`data`), described once by `fields`; an encoding names fields.
 * Networks add `nodes` with stored positions, maps name a stored map in `items/maps/`.
 */

export const chartTypes = [
  'table',
  'bar',
  'grouped-bar',
  'stacked-bar',
  'line',
  'area',
  'pie',
  'scatter',
  'bubble',
  'histogram',
  'box-plot',
  'heatmap',
  'choropleth-map',
  'symbol-map',
  'network',
  'treemap',
] as const;
export type ChartType = (typeof chartTypes)[number];

/** A field or id name: lower case, digits and underscores. */
export const fieldNameSchema = z.string().regex(/^[a-z][a-z0-9_]*$/, 'use lower case letters, digits and _');

export const cellSchema = z.union([z.string(), z.number().finite(), z.null()]);
export type Cell = z.infer<typeof cellSchema>;

export const rowSchema = z.record(fieldNameSchema, cellSchema);
export type Row = z.infer<typeof rowSchema>;

/**
 * Level of measurement of a field (Stevens 1946, "On the theory of scales of measurement",
 * Science 103). Temporal values are ISO dates (`2031-04`, `2031-04-15`) or whole years.
 */
export const fieldKinds = ['nominal', 'ordinal', 'quantitative', 'temporal'] as const;
export type FieldKind = (typeof fieldKinds)[number];

export const fieldSchema = z.strictObject({
  name: fieldNameSchema,
  kind: z.enum(fieldKinds),
  /** What the field is called on the chart (axis title, column head, legend title). */
  label: z.string().min(1),
  /** Unit shown with values, e.g. "visitors", "°C", "%". */
  unit: z.string().min(1).optional(),
  /** For ordinal fields: the order of the categories, lowest first. */
  order: z.array(z.string()).min(2).optional(),
});
export type Field = z.infer<typeof fieldSchema>;

/** A numeric axis: linear or logarithmic, optionally a fixed (possibly truncated) domain. */
export const axisSchema = z.strictObject({
  scale: z.enum(['linear', 'log']).default('linear'),
  domain: z.tuple([z.number().finite(), z.number().finite()]).optional(),
  /** Distance between labelled ticks; chosen by d3's tick rules when absent. */
  tickStep: z.number().positive().optional(),
});
export type Axis = z.infer<typeof axisSchema>;

/** A short note drawn on the chart, pointing at one mark (the row where `field` equals `equals`). */
export const annotationSchema = z.strictObject({
  text: z.string().min(1).max(80),
  field: fieldNameSchema,
  equals: z.union([z.string(), z.number()]),
});

/** Colour: #rgb or #rrggbb. */
export const colourSchema = z.string().regex(/^#([0-9a-fA-F]{3}|[0-9a-fA-F]{6})$/, 'use #rgb or #rrggbb');

const common = {
  title: z.string().min(1).max(120),
  fields: z.array(fieldSchema).min(1),
  data: z.array(rowSchema).min(1),
  /** How series or categories are identified: a legend, labels next to the marks, or neither. */
  labelling: z.enum(['legend', 'direct', 'none']).default('direct'),
  gridlines: z.boolean().default(false),
  annotation: annotationSchema.optional(),
  /** Categorical colours in series order; the theme palette when absent. */
  colours: z.array(colourSchema).min(1).optional(),
  /** Invented source line under the chart ("Harbour office counts, 2031"). */
  note: z.string().max(120).optional(),
};

const orientation = z.enum(['vertical', 'horizontal']).default('vertical');
const sort = z.enum(['none', 'ascending', 'descending']).default('none');

export const tableSpecSchema = z.strictObject({
  type: z.literal('table'),
  ...common,
  columns: z.array(fieldNameSchema).min(1),
});

export const barSpecSchema = z.strictObject({
  type: z.literal('bar'),
  ...common,
  category: fieldNameSchema,
  value: fieldNameSchema,
  orientation,
  sort,
  valueAxis: axisSchema.default({ scale: 'linear' }),
  /** Print each bar's value at its end. */
  valueLabels: z.boolean().default(false),
});

export const groupedBarSpecSchema = z.strictObject({
  type: z.literal('grouped-bar'),
  ...common,
  category: fieldNameSchema,
  series: fieldNameSchema,
  value: fieldNameSchema,
  orientation,
  valueAxis: axisSchema.default({ scale: 'linear' }),
});

export const stackedBarSpecSchema = z.strictObject({
  type: z.literal('stacked-bar'),
  ...common,
  category: fieldNameSchema,
  series: fieldNameSchema,
  value: fieldNameSchema,
  orientation,
  /** Each bar scaled to 100 %. */
  normalised: z.boolean().default(false),
  valueAxis: axisSchema.default({ scale: 'linear' }),
});

export const lineSpecSchema = z.strictObject({
  type: z.literal('line'),
  ...common,
  x: fieldNameSchema,
  y: fieldNameSchema,
  series: fieldNameSchema.optional(),
  markers: z.boolean().default(true),
  valueAxis: axisSchema.default({ scale: 'linear' }),
});

export const areaSpecSchema = z.strictObject({
  type: z.literal('area'),
  ...common,
  x: fieldNameSchema,
  y: fieldNameSchema,
  /** Several series are stacked. */
  series: fieldNameSchema.optional(),
  valueAxis: axisSchema.default({ scale: 'linear' }),
});

export const pieSpecSchema = z.strictObject({
  type: z.literal('pie'),
  ...common,
  category: fieldNameSchema,
  value: fieldNameSchema,
  donut: z.boolean().default(false),
  /** What is printed beside each slice. */
  sliceLabels: z.enum(['category', 'category-and-percent', 'none']).default('category'),
});

export const scatterSpecSchema = z.strictObject({
  type: z.literal('scatter'),
  ...common,
  x: fieldNameSchema,
  y: fieldNameSchema,
  /** Field whose value is printed beside each point (e.g. a name). */
  pointLabel: fieldNameSchema.optional(),
  series: fieldNameSchema.optional(),
  xAxis: axisSchema.default({ scale: 'linear' }),
  yAxis: axisSchema.default({ scale: 'linear' }),
  /** Least-squares line through the points. */
  trendLine: z.boolean().default(false),
});

export const bubbleSpecSchema = z.strictObject({
  type: z.literal('bubble'),
  ...common,
  x: fieldNameSchema,
  y: fieldNameSchema,
  /** Bubble area is proportional to this field. */
  size: fieldNameSchema,
  pointLabel: fieldNameSchema.optional(),
  series: fieldNameSchema.optional(),
  xAxis: axisSchema.default({ scale: 'linear' }),
  yAxis: axisSchema.default({ scale: 'linear' }),
});

export const histogramSpecSchema = z.strictObject({
  type: z.literal('histogram'),
  ...common,
  /** One row per observation; bars count observations per bin. */
  value: fieldNameSchema,
  binWidth: z.number().positive(),
  /** First bin starts at binStart. */
  binStart: z.number().finite(),
  countAxis: axisSchema.default({ scale: 'linear' }),
});

export const boxPlotSpecSchema = z.strictObject({
  type: z.literal('box-plot'),
  ...common,
  /** One row per observation. */
  category: fieldNameSchema,
  value: fieldNameSchema,
  orientation,
  /** Whisker rule: 1.5 x IQR with outliers drawn as points (Tukey 1977), or min to max. */
  whiskers: z.enum(['tukey', 'min-max']).default('tukey'),
  valueAxis: axisSchema.default({ scale: 'linear' }),
});

export const heatmapSpecSchema = z.strictObject({
  type: z.literal('heatmap'),
  ...common,
  x: fieldNameSchema,
  y: fieldNameSchema,
  value: fieldNameSchema,
  /** Print the value in each cell. */
  cellLabels: z.boolean().default(false),
  /** Number of colour classes of the sequential ramp (equal-interval). */
  classes: z.number().int().min(3).max(7).default(5),
});

export const choroplethMapSpecSchema = z.strictObject({
  type: z.literal('choropleth-map'),
  ...common,
  /** Name of a stored map: items/maps/<map>.geojson, features with properties.id and properties.name. */
  map: fieldNameSchema,
  /** Field holding the feature id of each row. */
  region: fieldNameSchema,
  value: fieldNameSchema,
  classes: z.number().int().min(3).max(7).default(5),
  /** Print region names on the map. */
  regionLabels: z.boolean().default(true),
});

export const symbolMapSpecSchema = z.strictObject({
  type: z.literal('symbol-map'),
  ...common,
  map: fieldNameSchema,
  region: fieldNameSchema,
  /** Circle area is proportional to this field. */
  value: fieldNameSchema,
  regionLabels: z.boolean().default(true),
});

export const networkNodeSchema = z.strictObject({
  id: fieldNameSchema,
  label: z.string().min(1),
  group: z.string().optional(),
  /** Stored layout position in [0, 1] x [0, 1], so the drawing is deterministic. */
  x: z.number().min(0).max(1),
  y: z.number().min(0).max(1),
});

export const networkSpecSchema = z.strictObject({
  type: z.literal('network'),
  ...common,
  /** `data` rows are links: `source` and `target` name node ids. */
  nodes: z.array(networkNodeSchema).min(2),
  source: fieldNameSchema,
  target: fieldNameSchema,
  /** Optional link weight drawn as line width. */
  weight: fieldNameSchema.optional(),
  directed: z.boolean().default(false),
});

export const treemapSpecSchema = z.strictObject({
  type: z.literal('treemap'),
  ...common,
  /** Leaf label field. */
  category: fieldNameSchema,
  /** Optional parent group field; leaves are coloured by group. */
  group: fieldNameSchema.optional(),
  value: fieldNameSchema,
});

export const chartSpecSchema = z.discriminatedUnion('type', [
  tableSpecSchema,
  barSpecSchema,
  groupedBarSpecSchema,
  stackedBarSpecSchema,
  lineSpecSchema,
  areaSpecSchema,
  pieSpecSchema,
  scatterSpecSchema,
  bubbleSpecSchema,
  histogramSpecSchema,
  boxPlotSpecSchema,
  heatmapSpecSchema,
  choroplethMapSpecSchema,
  symbolMapSpecSchema,
  networkSpecSchema,
  treemapSpecSchema,
]);

export type ChartSpec = z.infer<typeof chartSpecSchema>;
export type ChartSpecOf<T extends ChartType> = Extract<ChartSpec, { type: T }>;

/** A stored map (GeoJSON FeatureCollection in invented planar coordinates), passed to map renderers. */
export interface StoredMap {
  readonly type: 'FeatureCollection';
  readonly features: ReadonlyArray<{
    readonly type: 'Feature';
    readonly properties: { readonly id: string; readonly name: string };
    readonly geometry: { readonly type: 'Polygon' | 'MultiPolygon'; readonly coordinates: unknown };
  }>;
}
