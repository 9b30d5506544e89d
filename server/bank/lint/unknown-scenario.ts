import { eachItem, error, type LintRule } from './lint-types.js';

/** The item's scenario is listed in items/scenarios.json. */
export const unknownScenario: LintRule = {
  name: 'unknown-scenario',
  check: (context) => {
    const known = new Set(context.scenarios.map((s) => s.id));
    return eachItem(context, (item, file) =>
      known.has(item.scenario)
        ? []
        : [error(file, 'scenario', `unknown scenario "${item.scenario}" (not in items/scenarios.json)`)],
    );
  },
};
