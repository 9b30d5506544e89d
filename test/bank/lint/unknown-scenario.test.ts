import { describe, expect, it } from 'vitest';
import { unknownScenario } from '../../../server/bank/lint/unknown-scenario.js';
import { broken, runRule } from './lint-helpers.js';

describe('unknown-scenario', () => {
  it('fires for a scenario not in scenarios.json', () => {
    const item = broken((i) => {
      i.scenario = 'moon-base';
    });
    expect(runRule(unknownScenario, [item])).toEqual([
      expect.objectContaining({
        field: 'scenario',
        message: 'unknown scenario "moon-base" (not in items/scenarios.json)',
      }),
    ]);
  });
});
