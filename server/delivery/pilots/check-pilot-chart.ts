/**
 * A pilot given in the bank's chart format (a chart spec: data + encoding) instead of an image:
 * checked with the bank's chart lint rules that apply to a chart on its own, then drawn by the
 * bank's renderer to the SVG that is stored and shown (exactly as bank charts are drawn).
 */
import type { Item } from '../../bank/item-schema.js';
import { altText } from '../../bank/lint/alt-text.js';
import { colourVision } from '../../bank/lint/colour-vision.js';
import { contrast } from '../../bank/lint/contrast.js';
import { encodingFields } from '../../bank/lint/encoding-fields.js';
import { fieldKinds } from '../../bank/lint/field-kinds.js';
import { labelOverlap } from '../../bank/lint/label-overlap.js';
import type { LintRule } from '../../bank/lint/lint-types.js';
import type { ChartSpec, StoredMap } from '../../charts/chart-spec.js';
import { collectLabelBoxes, renderChart } from '../../charts/render-chart.js';
import { defaultTheme } from '../../charts/theme.js';
import { AppError } from '../../errors.js';

/** The bank's lint rules that judge a chart and its alt text without the rest of an item. */
export const pilotChartRules: readonly LintRule[] = [
  encodingFields,
  fieldKinds,
  contrast,
  colourVision,
  altText,
  labelOverlap,
];

export interface PilotChartInput {
  readonly chart: ChartSpec;
  readonly alt: string;
  readonly prompt: string;
  readonly options: readonly { id: string; text: string }[];
  readonly key: string;
}

/** Maps a lint field (a path inside an item) to the request body's field. */
function bodyField(field: string): string {
  if (field === '-' || field === 'theme') return 'body.chart';
  if (field.startsWith('response.options')) return field.replace('response.options', 'body.options');
  return `body.${field}`;
}

/**
 * Lints and draws a pilot chart spec.
 *
 * @param maps the bank's stored maps (for map charts).
 * @returns the SVG text to store.
 * @throws AppError VALIDATION_FAILED listing every lint error with its body field (warnings pass),
 *   or naming `body.chart` when the renderer refuses the spec (e.g. an unknown stored map).
 */
export function renderPilotChart(input: PilotChartInput, maps: ReadonlyMap<string, StoredMap>): string {
  // The pilot seen as a bank item, so the bank's own rules can judge it (never stored as an item).
  const item = {
    id: 'pilot-chart',
    scenario: 'pilot',
    status: 'draft',
    level: 'interpret',
    chart: input.chart,
    prompt: input.prompt,
    response: { kind: 'single-choice', options: input.options.map((o) => ({ ...o })), optionOrder: 'any' },
    key: { by: 'options', options: [input.key] },
    alt: input.alt,
    rationale: 'A pilot chart checked before it is stored.',
    features: {},
  } as unknown as Item;
  const file = 'pilot';
  const context = {
    entries: [{ file, raw: item, item }],
    scenarios: [],
    maps,
    theme: defaultTheme,
    labelBoxes: (i: Item) => collectLabelBoxes(i.chart, { maps, description: i.alt }),
  };
  let problems: { field: string; problem: string }[];
  try {
    problems = pilotChartRules
      .flatMap((rule) => rule.check(context))
      .filter((p) => p.severity === 'error')
      .map((p) => ({ field: bodyField(p.field), problem: p.message }));
  } catch (error) {
    problems = [{ field: 'body.chart', problem: error instanceof Error ? error.message : String(error) }];
  }
  if (problems.length === 0) {
    try {
      return renderChart(input.chart, { maps, description: input.alt, idPrefix: 'pilot-' });
    } catch (error) {
      problems = [{ field: 'body.chart', problem: error instanceof Error ? error.message : String(error) }];
    }
  }
  throw new AppError('VALIDATION_FAILED', `${problems[0]!.field}: ${problems[0]!.problem}`, { problems });
}
