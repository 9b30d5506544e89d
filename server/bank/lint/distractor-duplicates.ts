import { resolveKey } from '../resolve-key.js';
import { type BankProblem, eachItem, error, type LintRule } from './lint-types.js';

const normalise = (text: string): string => text.trim().replace(/\s+/g, ' ').toLowerCase();

/** No two options share a text (ignoring case and spacing) or a value; a distractor never equals the key. */
export const distractorDuplicates: LintRule = {
  name: 'distractor-duplicates',
  check: (context) =>
    eachItem(context, (item, file) => {
      const response = item.response;
      if (response.kind !== 'single-choice' && response.kind !== 'multiple-choice') return [];
      const resolved = resolveKey(item);
      const keyed = new Set(resolved.ok ? resolved.key.optionIds : []);
      const role = (id: string): string => (keyed.has(id) ? `the key (option ${id})` : `option ${id}`);
      const problems: BankProblem[] = [];
      response.options.forEach((option, index) => {
        for (const earlier of response.options.slice(0, index)) {
          const pair = `same as ${role(earlier.id)}`;
          if (normalise(option.text) === normalise(earlier.text)) {
            problems.push(error(file, `response.options.${index}.text`, `distractor text ${pair}`));
          }
          if (
            option.value !== undefined &&
            earlier.value !== undefined &&
            String(option.value) === String(earlier.value)
          ) {
            problems.push(error(file, `response.options.${index}.value`, `distractor value ${pair}`));
          }
        }
      });
      return problems;
    }),
};
