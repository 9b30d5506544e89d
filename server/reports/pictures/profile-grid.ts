import { element, textElement } from '../../charts/svg.js';
import { defaultTheme, type Theme } from '../../charts/theme.js';
import { chartTypePluralNames } from '../chart-type-names.js';
import type { ReportCell } from '../report-types.js';
import { percentText, pictureFrame, textColourOn } from './picture-frame.js';

const levels = ['read', 'interpret', 'envision'] as const;

/**
 * Text on coloured cells is bold and 19 units (≥ 14 pt bold): WCAG "large-scale text", whose minimum
 * contrast is 3:1 (SC 1.4.3). The mid-ramp fills reach 3:1 but not 4.5:1 with either dark or white text.
 */
export const largeTextSize = 19;

/** Share bands of the grid's colours, one per sequential ramp class (lightest = lowest share). */
export const profileBands = [0, 0.2, 0.4, 0.6, 0.8] as const;

/** The ramp class of a share: 0 for [0, 0.2), …, 4 for [0.8, 1]. */
export function bandOf(share: number): number {
  let band = 0;
  profileBands.forEach((start, index) => {
    if (share >= start) band = index;
  });
  return band;
}

/**
 * The readability profile as a grid: one row per chart type, one column per task level, each cell
 * shaded by the share of the audience who can handle it (sequential ramp, 5 bands) and printing that
 * share, so colour is never the only channel. Cells without items say "no items".
 *
 * @param cells the audience's profile
 * @param options title of the picture and the theme
 * @returns SVG markup
 */
export function renderProfileGrid(
  cells: readonly ReportCell[],
  options: { title: string; theme?: Theme },
): string {
  const theme = options.theme ?? defaultTheme;
  const ramp = theme.sequential(profileBands.length);
  const types = [...new Set(cells.map((c) => c.chartType))];
  const labelWidth = 230;
  const cellWidth = 120;
  const cellHeight = 34;
  const top = 40;
  const legendHeight = 80;
  const width = labelWidth + cellWidth * levels.length + theme.padding * 2;
  const height = top + cellHeight * types.length + legendHeight + theme.padding;
  const body: string[] = [];
  levels.forEach((level, column) => {
    body.push(
      textElement(
        'text',
        {
          x: labelWidth + column * cellWidth + cellWidth / 2,
          y: top - 12,
          'text-anchor': 'middle',
          'font-size': theme.fontSize.label,
          'font-weight': 'bold',
          fill: theme.colours.text,
        },
        level,
      ),
    );
  });
  types.forEach((type, row) => {
    const y = top + row * cellHeight;
    body.push(
      textElement(
        'text',
        {
          x: labelWidth - 10,
          y: y + cellHeight / 2 + 5,
          'text-anchor': 'end',
          'font-size': theme.fontSize.label,
          fill: theme.colours.text,
        },
        chartTypePluralNames[type],
      ),
    );
    levels.forEach((level, column) => {
      const x = labelWidth + column * cellWidth;
      const cell = cells.find((c) => c.chartType === type && c.level === level);
      const fill = cell ? ramp[bandOf(cell.shareAtRp)]! : theme.colours.noData;
      body.push(
        element('rect', {
          x: x + 1,
          y: y + 1,
          width: cellWidth - 2,
          height: cellHeight - 2,
          fill,
          stroke: theme.colours.outline,
          'stroke-width': 0.5,
        }),
        textElement(
          'text',
          {
            x: x + cellWidth / 2,
            y: y + cellHeight / 2 + 5,
            'text-anchor': 'middle',
            'font-size': cell ? largeTextSize : theme.fontSize.note,
            'font-weight': cell ? 'bold' : undefined,
            fill: cell ? textColourOn(fill, theme) : theme.colours.mutedText,
          },
          cell ? percentText(cell.shareAtRp) : 'no items',
        ),
      );
    });
  });
  const legendY = top + types.length * cellHeight + 22;
  body.push(
    textElement(
      'text',
      { x: theme.padding, y: legendY + 4, 'font-size': theme.fontSize.note, fill: theme.colours.text },
      'share who can handle it:',
    ),
  );
  profileBands.forEach((start, index) => {
    // Swatches on their own row under the label, wide enough for "80–100%" in large bold text.
    const x = theme.padding + index * 104;
    const end = profileBands[index + 1] ?? 1;
    const fill = ramp[index]!;
    body.push(
      element('rect', {
        x,
        y: legendY + 14,
        width: 100,
        height: 28,
        fill,
        stroke: theme.colours.outline,
        'stroke-width': 0.5,
      }),
      textElement(
        'text',
        {
          x: x + 50,
          y: legendY + 35,
          'text-anchor': 'middle',
          'font-size': largeTextSize,
          'font-weight': 'bold',
          fill: textColourOn(fill, theme),
        },
        `${Math.round(start * 100)}–${Math.round(end * 100)}%`,
      ),
    );
  });
  const best = [...cells].sort((a, b) => b.shareAtRp - a.shareAtRp)[0];
  const worst = [...cells].sort((a, b) => a.shareAtRp - b.shareAtRp)[0];
  const description =
    best && worst
      ? `Grid of ${types.length} chart types by three task levels. Each cell prints the share of the audience who can handle it. Highest: ${chartTypePluralNames[best.chartType]}, ${best.level}, ${percentText(best.shareAtRp)}. Lowest: ${chartTypePluralNames[worst.chartType]}, ${worst.level}, ${percentText(worst.shareAtRp)}.`
      : 'An empty grid: no calibrated items.';
  return pictureFrame({ width, height, title: options.title, description, theme }, body);
}
