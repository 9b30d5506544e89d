import { encodedFields } from '../encoded-fields.js';
import { type BankProblem, eachItem, error, type LintRule } from './lint-types.js';

/**
 * Each encoding gets a field of a fitting level of measurement: a quantitative encoding (value
 * axis, length, area, colour ramp, scatter x and y) needs a quantitative field, since a nominal or
 * ordinal variable is never shown on an interval scale (common practice, no source); a line's x
 * axis needs an order (not nominal); categories are not quantitative fields.
 */
export const fieldKinds: LintRule = {
  name: 'field-kinds',
  check: (context) =>
    eachItem(context, (item, file) => {
      const problems: BankProblem[] = [];
      for (const encoded of encodedFields(item.chart)) {
        const kind = item.chart.fields.find((f) => f.name === encoded.field)?.kind;
        if (kind === undefined) continue;
        const name = `"${encoded.field}"`;
        if (encoded.role === 'quantitative' && kind !== 'quantitative') {
          problems.push(
            error(file, encoded.path, `${kind} field ${name} drawn on a quantitative axis or scale`),
          );
        } else if (encoded.role === 'ordered' && kind === 'nominal') {
          problems.push(
            error(file, encoded.path, `nominal field ${name} drawn along a line, which implies an order`),
          );
        } else if (encoded.role === 'categorical' && kind === 'quantitative') {
          problems.push(
            error(
              file,
              encoded.path,
              `quantitative field ${name} drawn as categories; make it ordinal or temporal`,
            ),
          );
        }
      }
      return problems;
    }),
};
