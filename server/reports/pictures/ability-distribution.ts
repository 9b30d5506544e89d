import { element, textElement } from '../../charts/svg.js';
import { defaultTheme, type Theme } from '../../charts/theme.js';
import type { ReportAudience } from '../report-types.js';
import { logitScale } from './logit-scale.js';
import { pictureFrame } from './picture-frame.js';

/** Dash patterns that tell curves apart without colour (solid, dashed, dotted, dash-dot). */
const dashes = [undefined, '8 5', '2 4', '10 4 2 4'] as const;

/**
 * The estimated ability distribution of each audience (normal, mean and SD from the MML fit) as
 * curves on one logit axis. Each curve has its own dash pattern and a direct label at its peak, so
 * no legend colour has to be matched; the mean is marked with a tick below the axis line.
 */
export function renderAbilityDistribution(
  audiences: readonly ReportAudience[],
  options: { title: string; theme?: Theme },
): string {
  const theme = options.theme ?? defaultTheme;
  const width = 600;
  const height = 300;
  const left = 40;
  const right = width - 30;
  const base = height - 60;
  const top = 60;
  const x = logitScale(
    audiences.flatMap((a) => [a.ability.mean - 2.5 * a.ability.sd, a.ability.mean + 2.5 * a.ability.sd]),
    left,
    right,
  );
  const peak = Math.max(...audiences.map((a) => 1 / (a.ability.sd * Math.sqrt(2 * Math.PI))));
  const y = (density: number) => base - (density / peak) * (base - top);
  const body: string[] = [
    element('line', { x1: left, x2: right, y1: base, y2: base, stroke: theme.colours.axis }),
  ];
  for (const tick of x.ticks) {
    body.push(
      element('line', { x1: x(tick), x2: x(tick), y1: base, y2: base + 6, stroke: theme.colours.axis }),
      textElement(
        'text',
        {
          x: x(tick),
          y: base + 24,
          'text-anchor': 'middle',
          'font-size': theme.fontSize.tick,
          fill: theme.colours.text,
        },
        String(tick),
      ),
    );
  }
  body.push(
    textElement(
      'text',
      {
        x: (left + right) / 2,
        y: height - 10,
        'text-anchor': 'middle',
        'font-size': theme.fontSize.note,
        fill: theme.colours.text,
      },
      'ability, logits (higher reads harder charts)',
    ),
  );
  audiences.forEach((a, index) => {
    const colour = theme.colours.categorical[index % theme.colours.categorical.length]!;
    const { mean, sd } = a.ability;
    const points: string[] = [];
    for (let k = 0; k <= 80; k++) {
      const theta = x.domain[0] + ((x.domain[1] - x.domain[0]) * k) / 80;
      const density = Math.exp(-0.5 * ((theta - mean) / sd) ** 2) / (sd * Math.sqrt(2 * Math.PI));
      points.push(`${x(theta).toFixed(1)},${y(density).toFixed(1)}`);
    }
    const peakY = y(1 / (sd * Math.sqrt(2 * Math.PI)));
    body.push(
      element('polyline', {
        points: points.join(' '),
        fill: 'none',
        stroke: colour,
        'stroke-width': 3,
        'stroke-dasharray': dashes[index % dashes.length],
      }),
      element('line', {
        x1: x(mean),
        x2: x(mean),
        y1: base - 8,
        y2: base + 8,
        stroke: colour,
        'stroke-width': 3,
      }),
      textElement(
        'text',
        {
          x: x(mean),
          y: peakY - 8 - 18 * index,
          'text-anchor': 'middle',
          'font-size': theme.fontSize.note,
          fill: theme.colours.text,
        },
        `${a.label}: mean ${mean.toFixed(2)}, SD ${sd.toFixed(2)}`,
      ),
    );
  });
  const description = audiences
    .map(
      (a) =>
        `${a.label}: normal curve with mean ${a.ability.mean.toFixed(2)} and SD ${a.ability.sd.toFixed(2)} logits`,
    )
    .join('; ');
  return pictureFrame({ width, height, title: options.title, description: `${description}.`, theme }, body);
}
