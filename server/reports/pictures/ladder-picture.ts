import { element, textElement } from '../../charts/svg.js';
import { defaultTheme, type Theme } from '../../charts/theme.js';
import { chartTypePluralNames } from '../chart-type-names.js';
import type { ReportLadder } from '../report-types.js';
import { percentText, pictureFrame } from './picture-frame.js';

/**
 * The complexity ladder: cells from easiest (top) to hardest (bottom) by RP location, each a bar as
 * long as the share of the audience who can handle it, with the share printed; a line marks the
 * ceiling share and the reading-ceiling rung is named in bold.
 */
export function renderLadder(
  ladder: ReportLadder,
  options: { title: string; ceilingShare: number; theme?: Theme },
): string {
  const theme = options.theme ?? defaultTheme;
  const rowHeight = 22;
  const labelWidth = 300;
  const barWidth = 240;
  const top = 34;
  const width = labelWidth + barWidth + 60;
  const height = top + ladder.rungs.length * rowHeight + 20;
  const colour = theme.colours.categorical[0]!;
  const body: string[] = [
    textElement(
      'text',
      { x: labelWidth, y: 20, 'font-size': theme.fontSize.note, fill: theme.colours.text },
      'share who can handle it',
    ),
  ];
  const ceilingX = labelWidth + barWidth * options.ceilingShare;
  ladder.rungs.forEach((rung, index) => {
    const y = top + index * rowHeight;
    const isCeiling =
      ladder.readingCeiling?.chartType === rung.chartType && ladder.readingCeiling.level === rung.level;
    body.push(
      textElement(
        'text',
        {
          x: labelWidth - 8,
          y: y + 15,
          'text-anchor': 'end',
          'font-size': theme.fontSize.note,
          fill: theme.colours.text,
          'font-weight': isCeiling ? 'bold' : undefined,
        },
        `${isCeiling ? 'ceiling → ' : ''}${rung.level} · ${chartTypePluralNames[rung.chartType]}`,
      ),
      element('rect', {
        x: labelWidth,
        y: y + 3,
        width: Math.max(barWidth * rung.shareAtRp, 1),
        height: rowHeight - 6,
        fill: colour,
      }),
      textElement(
        'text',
        {
          x: labelWidth + barWidth * rung.shareAtRp + 4,
          y: y + 15,
          'font-size': theme.fontSize.note,
          fill: theme.colours.text,
        },
        percentText(rung.shareAtRp),
      ),
    );
  });
  body.push(
    element('line', {
      x1: ceilingX,
      x2: ceilingX,
      y1: top - 4,
      y2: height - 14,
      stroke: theme.colours.axis,
      'stroke-dasharray': '4 3',
    }),
  );
  const description = `${ladder.rungs.length} chart-type and task cells from easiest to hardest. ${ladder.ceilingSentence}`;
  return pictureFrame({ width, height, title: options.title, description, theme }, body);
}
