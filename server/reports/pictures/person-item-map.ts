import { element, textElement } from '../../charts/svg.js';
import { defaultTheme, type Theme } from '../../charts/theme.js';
import type { ReportItem } from '../report-types.js';
import { logitScale } from './logit-scale.js';
import { pictureFrame } from './picture-frame.js';

/** Short text codes of the task levels on the map. */
const levelCodes = { read: 'R', interpret: 'I', envision: 'E' } as const;

/** Width of one row of the map, logits. */
export const mapBinWidth = 0.5;

/**
 * The person-item map (Wright map): one vertical logit scale; persons to the left as a histogram of
 * their WLEs (bars grow leftwards, with counts), items to the right as text labels
 * `<chart type> <R|I|E>` in the row of their difficulty. Items are told apart by text, not colour.
 */
export function renderPersonItemMap(
  persons: readonly number[],
  items: readonly ReportItem[],
  options: { title: string; theme?: Theme },
): string {
  const theme = options.theme ?? defaultTheme;
  const placed = items.filter((i) => i.chartType !== null && i.level !== null);
  const values = [...persons, ...placed.map((i) => i.difficulty)];
  const low = Math.floor(Math.min(...values, -2));
  const high = Math.ceil(Math.max(...values, 2));
  const bins: { from: number; persons: number; items: string[] }[] = [];
  for (let from = low; from < high; from += mapBinWidth) bins.push({ from, persons: 0, items: [] });
  const binOf = (v: number) => Math.min(Math.max(Math.floor((v - low) / mapBinWidth), 0), bins.length - 1);
  for (const p of persons) bins[binOf(p)]!.persons++;
  for (const item of placed)
    bins[binOf(item.difficulty)]!.items.push(`${item.chartType} ${levelCodes[item.level!]}`);
  const rowHeight = 20;
  const axisX = 220;
  const top = 40;
  const maxLabels = 5;
  const height = top + bins.length * rowHeight + 40;
  const width = 900;
  const y = logitScale([low, high], top + bins.length * rowHeight, top);
  const maxPersons = Math.max(...bins.map((b) => b.persons), 1);
  const body: string[] = [
    textElement(
      'text',
      {
        x: axisX - 10,
        y: 22,
        'text-anchor': 'end',
        'font-size': theme.fontSize.note,
        fill: theme.colours.text,
      },
      'persons (count)',
    ),
    textElement(
      'text',
      { x: axisX + 10, y: 22, 'font-size': theme.fontSize.note, fill: theme.colours.text },
      'items (chart type, R read · I interpret · E envision)',
    ),
    element('line', {
      x1: axisX,
      x2: axisX,
      y1: top,
      y2: top + bins.length * rowHeight,
      stroke: theme.colours.axis,
      'stroke-width': 2,
    }),
  ];
  bins.forEach((bin, index) => {
    const rowTop = top + (bins.length - 1 - index) * rowHeight;
    const barWidth = (bin.persons / maxPersons) * (axisX - 90);
    if (bin.persons > 0) {
      body.push(
        element('rect', {
          x: axisX - 4 - barWidth,
          y: rowTop + 3,
          width: barWidth,
          height: rowHeight - 6,
          fill: theme.colours.categorical[0]!,
        }),
        textElement(
          'text',
          {
            x: axisX - 8 - barWidth,
            y: rowTop + 15,
            'text-anchor': 'end',
            'font-size': theme.fontSize.note,
            fill: theme.colours.text,
          },
          String(bin.persons),
        ),
      );
    }
    if (bin.items.length > 0) {
      const shown = bin.items.slice(0, maxLabels).join(', ');
      const more = bin.items.length > maxLabels ? ` +${bin.items.length - maxLabels} more` : '';
      body.push(
        textElement(
          'text',
          { x: axisX + 10, y: rowTop + 15, 'font-size': theme.fontSize.note, fill: theme.colours.text },
          shown + more,
        ),
      );
    }
  });
  for (let tick = low; tick <= high; tick++) {
    body.push(
      element('line', { x1: axisX - 5, x2: axisX + 5, y1: y(tick), y2: y(tick), stroke: theme.colours.axis }),
      textElement(
        'text',
        {
          x: 30,
          y: y(tick) + 5,
          'text-anchor': 'end',
          'font-size': theme.fontSize.note,
          fill: theme.colours.mutedText,
        },
        String(tick),
      ),
    );
  }
  body.push(
    textElement(
      'text',
      { x: 8, y: height - 12, 'font-size': theme.fontSize.note, fill: theme.colours.mutedText },
      'logits: higher = more able persons, harder items',
    ),
  );
  const description = `Person-item map on one logit scale from ${low} to ${high}. ${persons.length} persons as a histogram on the left; ${placed.length} items on the right, labelled by chart type and task level, in rows of ${mapBinWidth} logits.`;
  return pictureFrame({ width, height, title: options.title, description, theme }, body);
}
