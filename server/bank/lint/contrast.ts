import { contrastRatio } from '../../charts/colour/contrast-ratio.js';
import { CONTRAST_THRESHOLDS, meetsContrast } from '../../charts/colour/meets-contrast.js';
import { usedColours } from '../used-colours.js';
import { type BankProblem, eachItem, error, type LintRule } from './lint-types.js';

/**
 * Marks reach 3:1 against the chart background (WCAG 2.1 SC 1.4.11 Non-text Contrast) and text
 * reaches 4.5:1 (WCAG 2.1 SC 1.4.3 Contrast (Minimum)); ratios are compared unrounded.
 */
export const contrast: LintRule = {
  name: 'contrast',
  check: (context) => {
    const { background, text, mutedText, axis } = context.theme.colours;
    const themeProblems = (file: string): BankProblem[] => {
      const problems: BankProblem[] = [];
      for (const [name, colour] of [
        ['text', text],
        ['muted text', mutedText],
      ] as const) {
        const ratio = contrastRatio(colour, background);
        if (!meetsContrast(ratio, CONTRAST_THRESHOLDS.text)) {
          problems.push(
            error(
              file,
              'theme',
              `${name} ${colour} on ${background} is ${ratio.toFixed(2)}:1, text needs 4.5:1 (WCAG 2.1 SC 1.4.3)`,
            ),
          );
        }
      }
      const axisRatio = contrastRatio(axis, background);
      if (!meetsContrast(axisRatio, CONTRAST_THRESHOLDS.graphicalObject)) {
        problems.push(
          error(
            file,
            'theme',
            `axis ${axis} on ${background} is ${axisRatio.toFixed(2)}:1, marks need 3:1 (WCAG 2.1 SC 1.4.11)`,
          ),
        );
      }
      return problems;
    };
    return eachItem(context, (item, file) => {
      const problems = themeProblems(file);
      const seen = new Set<string>();
      for (const { colour, source } of usedColours(item.chart, context.theme)) {
        if (seen.has(source)) continue;
        seen.add(source);
        const ratio = contrastRatio(colour, background);
        if (!meetsContrast(ratio, CONTRAST_THRESHOLDS.graphicalObject)) {
          problems.push(
            error(
              file,
              source.startsWith('chart.') ? source : 'chart.colours',
              `mark colour ${colour} (${source}) on ${background} is ${ratio.toFixed(2)}:1, marks need 3:1 (WCAG 2.1 SC 1.4.11)`,
            ),
          );
        }
      }
      return problems;
    });
  },
};
