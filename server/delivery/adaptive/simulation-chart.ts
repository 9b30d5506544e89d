/**
 * The simulation study as an SVG picture with a text alternative: items each design needs for the
 * same precision, per audience (left), and the adaptive item exposure rates, highest first, against
 * the largest exposure allowed (right). Pure string building with the chart helpers and theme.
 *
 * @see W3C, WCAG 2.1 SC 1.1.1 Non-text Content (a text alternative: `<title>`, `<desc>`, and the
 *   same numbers as a table in the command's output).
 */
import { element, textElement } from '../../charts/svg.js';
import { wrapText } from '../../charts/text-metrics.js';
import { defaultTheme, type Theme } from '../../charts/theme.js';
import type { AudienceResult, SimulationResult } from './simulate-adaptive.js';

/** What the picture states besides the result. */
export interface SimulationChartOptions {
  readonly seTarget: number;
  readonly maxExposure: number;
  /** One line naming the bank and the exposure control, shown under the title. */
  readonly subtitle: string;
  readonly theme?: Theme;
}

const designs = [
  { key: 'adaptive', label: 'adaptive (mean)' },
  { key: 'bound', label: 'information bound (mean)' },
  { key: 'spanning', label: 'fixed, spanning' },
  { key: 'bestTargeted', label: 'fixed, peaked' },
  { key: 'poolOrder', label: 'fixed, pool order' },
] as const;
type DesignKey = (typeof designs)[number]['key'];

/** Items per person of one design for one audience (null: not run, or no fixed form reaches it). */
function itemsOf(a: AudienceResult, key: DesignKey): number | null {
  if (key === 'adaptive') return a.adaptive.items;
  if (key === 'bound') return a.bound?.items ?? null;
  return a.fixed[key]?.length ?? null;
}

/**
 * A short text alternative: one sentence per audience and one on exposure.
 *
 * @example
 * describeSimulation(result, 0.3);
 * // 'mean -1: adaptive 22.3 items; fixed form spanning the bank 28 items (ratio 0.80, bound 0.84) ...'
 */
export function describeSimulation(result: SimulationResult, maxExposure: number): string {
  const lines = result.audiences.map((a) => {
    const span = a.fixed.spanning;
    const fixed =
      span === null
        ? 'no spanning fixed form of the bank reaches the same precision'
        : `fixed form spanning the bank ${span.length} items (ratio ${a.itemRatio.spanning!.toFixed(2)}${a.bound?.ratio == null ? '' : `, bound ${a.bound.ratio.toFixed(2)}`})`;
    const peaked = a.fixed.bestTargeted;
    const other =
      peaked === null ? 'peaked form does not reach it' : `form peaked at the centre ${peaked.length} items`;
    return `${a.audience.label}: adaptive ${a.adaptive.items.toFixed(1)} items; ${fixed}; ${other}.`;
  });
  lines.push(
    `Largest adaptive item exposure ${result.maxExposure.toFixed(2)} (allowed ${maxExposure}); ${(result.neverUsed * 100).toFixed(0)}% of the bank never used.`,
  );
  return lines.join(' ');
}

/**
 * Renders the picture.
 *
 * @param result the simulation result.
 * @param options SE target, exposure limit, subtitle, theme.
 * @returns a standalone SVG document string.
 * @example
 * renderSimulationChart(result, { seTarget: 0.45, maxExposure: 0.3, subtitle: '107 items' }).startsWith('<svg'); // true
 */
export function renderSimulationChart(result: SimulationResult, options: SimulationChartOptions): string {
  const theme = options.theme ?? defaultTheme;
  const width = 900;
  const height = 660;
  const pad = theme.padding * 2;
  const font = theme.fontSize;
  const colours = theme.colours;
  const parts: string[] = [];
  const title = `Adaptive vs fixed forms at the same precision (SE target ${options.seTarget})`;
  parts.push(textElement('title', { id: 'sim-title' }, title));
  parts.push(textElement('desc', { id: 'sim-desc' }, describeSimulation(result, options.maxExposure)));
  parts.push(element('rect', { x: 0, y: 0, width, height, fill: colours.background }));
  parts.push(
    textElement(
      'text',
      { x: pad, y: pad + font.title, 'font-size': font.title, fill: colours.text, 'font-weight': 'bold' },
      title,
    ),
  );
  // The subtitle wraps onto at most three lines; the panels move down under it.
  const subtitleLines = wrapText(options.subtitle, font.note, width - 2 * pad).slice(0, 3);
  subtitleLines.forEach((line, k) => {
    parts.push(
      textElement(
        'text',
        {
          x: pad,
          y: pad + font.title + (font.note + 6) * (k + 1) + 2,
          'font-size': font.note,
          fill: colours.mutedText,
        },
        line,
      ),
    );
  });

  // Left panel: horizontal bars, items needed per audience and design.
  const top = 90 + (font.note + 6) * subtitleLines.length;
  const left = pad + 110;
  const panelWidth = 330;
  const rows = result.audiences.length * (designs.length + 1);
  const rowHeight = Math.min(22, (height - top - 100) / rows);
  const lengths = result.audiences.flatMap((a) => designs.map((d) => itemsOf(a, d.key) ?? 0));
  const scaleMax = Math.max(1, ...lengths) * 1.1;
  const x = (v: number) => left + (v / scaleMax) * panelWidth;
  parts.push(
    textElement(
      'text',
      { x: pad, y: top - 14, 'font-size': font.axisTitle, fill: colours.text },
      'Items per person',
    ),
  );
  result.audiences.forEach((a, g) => {
    const y0 = top + g * (designs.length + 1) * rowHeight;
    parts.push(
      textElement(
        'text',
        { x: pad, y: y0 + rowHeight * 1.6, 'font-size': font.label, fill: colours.text },
        a.audience.label,
      ),
    );
    designs.forEach((d, k) => {
      const value = itemsOf(a, d.key);
      const y = y0 + k * rowHeight;
      if (value === null) {
        parts.push(
          textElement(
            'text',
            { x: left + 4, y: y + rowHeight * 0.75, 'font-size': font.note, fill: colours.mutedText },
            'not reached',
          ),
        );
        return;
      }
      parts.push(
        element('rect', {
          x: left,
          y: y + 2,
          width: x(value) - left,
          height: rowHeight - 4,
          fill: colours.categorical[k]!,
        }),
      );
      parts.push(
        textElement(
          'text',
          { x: x(value) + 4, y: y + rowHeight * 0.75, 'font-size': font.note, fill: colours.text },
          value.toFixed(d.key === 'adaptive' || d.key === 'bound' ? 1 : 0),
        ),
      );
    });
  });
  designs.forEach((d, k) => {
    // Legend in rows of three under the bars.
    const legendY = height - 70 + Math.floor(k / 3) * 26;
    const lx = pad + (k % 3) * 240;
    parts.push(element('rect', { x: lx, y: legendY, width: 14, height: 14, fill: colours.categorical[k]! }));
    parts.push(
      textElement(
        'text',
        { x: lx + 20, y: legendY + 13, 'font-size': font.note, fill: colours.text },
        d.label,
      ),
    );
  });

  // Right panel: exposure rates, highest first, with the allowed maximum.
  const rx = 540;
  const rw = width - rx - pad;
  const ph = height - top - 130;
  const sorted = Float64Array.from(result.exposure).sort().reverse();
  const yMax = Math.max(0.05, sorted[0] ?? 0, options.maxExposure) * 1.1;
  const ey = (v: number) => top + ph - (v / yMax) * ph;
  parts.push(
    textElement(
      'text',
      { x: rx, y: top - 14, 'font-size': font.axisTitle, fill: colours.text },
      'Adaptive exposure per item, highest first',
    ),
  );
  parts.push(element('line', { x1: rx, y1: top + ph, x2: rx + rw, y2: top + ph, stroke: colours.axis }));
  parts.push(element('line', { x1: rx, y1: top, x2: rx, y2: top + ph, stroke: colours.axis }));
  for (const tick of [0, 0.25, 0.5, 0.75, 1].filter((t) => t <= yMax)) {
    parts.push(
      textElement(
        'text',
        { x: rx - 6, y: ey(tick) + 5, 'font-size': font.note, fill: colours.text, 'text-anchor': 'end' },
        tick.toFixed(2),
      ),
    );
  }
  const barWidth = rw / Math.max(1, sorted.length);
  sorted.forEach((v, i) => {
    if (v > 0)
      parts.push(
        element('rect', {
          x: rx + i * barWidth,
          y: ey(v),
          width: Math.max(barWidth, 0.5),
          height: top + ph - ey(v),
          fill: colours.categorical[0]!,
        }),
      );
  });
  parts.push(
    element('line', {
      x1: rx,
      y1: ey(options.maxExposure),
      x2: rx + rw,
      y2: ey(options.maxExposure),
      stroke: colours.text,
      'stroke-dasharray': '6 4',
    }),
  );
  parts.push(
    textElement(
      'text',
      {
        x: rx + rw,
        y: ey(options.maxExposure) - 6,
        'font-size': font.note,
        fill: colours.text,
        'text-anchor': 'end',
      },
      `allowed ${options.maxExposure}`,
    ),
  );
  parts.push(
    textElement(
      'text',
      { x: rx, y: top + ph + 22, 'font-size': font.note, fill: colours.mutedText },
      `${sorted.length} items; ${(result.neverUsed * 100).toFixed(0)}% never used`,
    ),
  );

  return element(
    'svg',
    {
      xmlns: 'http://www.w3.org/2000/svg',
      viewBox: `0 0 ${width} ${height}`,
      role: 'img',
      'aria-labelledby': 'sim-title sim-desc',
      'font-family': theme.fontFamily,
    },
    parts,
  );
}
