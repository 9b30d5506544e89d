import { itemSchema } from '../item-schema.js';
import { error, type LintRule } from './lint-types.js';

/** Files that are not JSON, or whose JSON the item schema rejects (one problem per zod issue). */
export const schemaErrors: LintRule = {
  name: 'schema-errors',
  check: (context) =>
    context.entries.flatMap((entry) => {
      if (entry.jsonError !== undefined)
        return [error(entry.file, '-', `not valid JSON: ${entry.jsonError}`)];
      const parsed = itemSchema.safeParse(entry.raw);
      if (parsed.success) return [];
      return parsed.error.issues.map((issue) =>
        error(entry.file, issue.path.length === 0 ? '-' : issue.path.map(String).join('.'), issue.message),
      );
    }),
};
