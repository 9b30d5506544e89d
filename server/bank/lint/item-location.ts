import { eachItem, error, type LintRule } from './lint-types.js';

/** The file name is the item's id and its folder is the item's scenario: items/<scenario>/<id>.json. */
export const itemLocation: LintRule = {
  name: 'item-location',
  check: (context) =>
    eachItem(context, (item, file) => {
      const parts = file.split('/');
      const name = parts.at(-1)?.replace(/\.json$/, '');
      const folder = parts.at(-2);
      const problems = [];
      if (name !== item.id)
        problems.push(error(file, 'id', `id "${item.id}" differs from the file name "${name}"`));
      if (folder !== item.scenario) {
        problems.push(
          error(file, 'scenario', `scenario "${item.scenario}" differs from the folder "${folder}"`),
        );
      }
      return problems;
    }),
};
