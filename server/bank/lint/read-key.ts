import { resolveKey } from '../resolve-key.js';
import { eachItem, error, type LintRule } from './lint-types.js';

/** A key query computes from the data and selects exactly the options it should (one for single choice). */
export const readKey: LintRule = {
  name: 'read-key',
  check: (context) =>
    eachItem(context, (item, file) => {
      const result = resolveKey(item);
      return result.ok ? [] : [error(file, result.field, result.message)];
    }),
};
