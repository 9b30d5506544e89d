import {
  checkCategoricalColours,
  MIN_CATEGORICAL_DIFFERENCE,
} from '../../charts/colour/check-categorical-colours.js';
import { usedColours } from '../used-colours.js';
import { type BankProblem, eachItem, error, type LintRule } from './lint-types.js';

/**
 * Categorical colours stay distinguishable with normal vision and under simulated protanopia,
 * deuteranopia and tritanopia (Machado, Oliveira and Fernandes 2009 matrices, full severity):
 * every pair differs by at least ΔE00 10 (CIEDE2000; the threshold and its justification are the
 * chart layer's `MIN_CATEGORICAL_DIFFERENCE`, see check-categorical-colours.ts). Contrast against
 * the background is the `contrast` rule's job.
 */
export const colourVision: LintRule = {
  name: 'colour-vision',
  check: (context) =>
    eachItem(context, (item, file) => {
      const used = usedColours(item.chart, context.theme);
      if (used.length < 2) return [];
      const report = checkCategoricalColours(
        used.map((c) => c.colour),
        context.theme.colours.background,
      );
      const field = used[0]!.source.startsWith('chart.') ? 'chart.colours' : 'chart.colours (theme palette)';
      const problems: BankProblem[] = [];
      for (const pair of report.confusablePairs) {
        const seen = pair.vision === 'normal' ? 'with normal vision' : `under simulated ${pair.vision}`;
        problems.push(
          error(
            file,
            field,
            `colours ${pair.firstColour} and ${pair.secondColour} are indistinguishable ${seen} (ΔE00 ${pair.difference.toFixed(1)} < ${MIN_CATEGORICAL_DIFFERENCE})`,
          ),
        );
      }
      return problems;
    }),
};
