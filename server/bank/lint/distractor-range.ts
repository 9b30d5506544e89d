import { drawnValueRange } from '../drawn-value-range.js';
import { type BankProblem, eachItem, error, type LintRule } from './lint-types.js';

/**
 * When the key is a value read off a numeric axis, every numeric option value lies inside the axis
 * as drawn; a distractor off the axis is eliminated without reading the chart (item-writing guide).
 */
export const distractorRange: LintRule = {
  name: 'distractor-range',
  check: (context) =>
    eachItem(context, (item, file) => {
      const response = item.response;
      if (
        item.key.by !== 'query' ||
        (response.kind !== 'single-choice' && response.kind !== 'multiple-choice')
      )
        return [];
      const range = drawnValueRange(item.chart, item.key.query);
      if (range === undefined) return [];
      const [low, high] = range;
      const problems: BankProblem[] = [];
      response.options.forEach((option, index) => {
        if (typeof option.value === 'number' && (option.value < low || option.value > high)) {
          problems.push(
            error(
              file,
              `response.options.${index}.value`,
              `numeric distractor ${option.value} is outside the drawn axis range ${low} to ${high}`,
            ),
          );
        }
      });
      return problems;
    }),
};
