import { findOverlappingLabels } from '../../charts/label-box.js';
import { type BankProblem, eachItem, error, type LintRule } from './lint-types.js';

/** No two text labels of a chart overlap (boxes from the renderer's estimated text metrics). */
export const labelOverlap: LintRule = {
  name: 'label-overlap',
  check: (context) => {
    const labelBoxes = context.labelBoxes;
    if (labelBoxes === undefined) return [];
    return eachItem(context, (item, file) => {
      let boxes: ReturnType<typeof labelBoxes>;
      try {
        boxes = labelBoxes(item);
      } catch (cause) {
        return [
          error(
            file,
            'chart',
            `chart cannot be drawn: ${cause instanceof Error ? cause.message : String(cause)}`,
          ),
        ];
      }
      const problems: BankProblem[] = [];
      for (const [i, j] of findOverlappingLabels(boxes)) {
        const a = boxes[i]!;
        const b = boxes[j]!;
        problems.push(
          error(file, 'chart', `labels "${a.text}" (${a.kind}) and "${b.text}" (${b.kind}) overlap`),
        );
      }
      return problems;
    });
  },
};
