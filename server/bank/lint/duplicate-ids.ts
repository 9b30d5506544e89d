import { error, type LintRule } from './lint-types.js';

/** Every id is used by one file only (ids are never reused). */
export const duplicateIds: LintRule = {
  name: 'duplicate-ids',
  check: (context) => {
    const firstFile = new Map<string, string>();
    const problems = [];
    for (const entry of context.entries) {
      if (entry.item === undefined) continue;
      const first = firstFile.get(entry.item.id);
      if (first === undefined) firstFile.set(entry.item.id, entry.file);
      else problems.push(error(entry.file, 'id', `duplicate id "${entry.item.id}", also used by ${first}`));
    }
    return problems;
  },
};
