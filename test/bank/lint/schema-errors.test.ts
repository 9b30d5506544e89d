import { describe, expect, it } from 'vitest';
import { schemaErrors } from '../../../server/bank/lint/schema-errors.js';
import { broken, runRule, singleChoice } from './lint-helpers.js';

describe('schema-errors', () => {
  it('names the field of a wrong level', () => {
    const item = broken((i) => {
      (i as Record<string, unknown>).level = 'recall';
    });
    const problems = runRule(schemaErrors, [item]);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({
      file: 'items/isle/isle-ferry-busiest-day.json',
      field: 'level',
      severity: 'error',
    });
  });

  it('reports a read item keyed by hand', () => {
    const item = broken((i) => {
      i.key = { by: 'options', options: ['b'] };
    });
    expect(runRule(schemaErrors, [item])).toEqual([
      expect.objectContaining({
        field: 'key.by',
        message: 'a read item needs a key query computed from the data',
      }),
    ]);
  });

  it('reports too few options and an option without a value', () => {
    const item = broken((i) => {
      singleChoice(i).options = [
        { id: 'a', text: 'Monday', value: 'Mon' },
        { id: 'b', text: 'Tuesday' },
      ];
    });
    const fields = runRule(schemaErrors, [item]).map((p) => p.field);
    expect(fields).toContain('response.options');
    expect(fields).toContain('response.options.1.value');
  });

  it('reports a file that is not JSON', () => {
    const problems = schemaErrors.check({
      entries: [{ file: 'items/isle/x.json', raw: undefined, jsonError: 'Unexpected token' }],
      scenarios: [],
      maps: new Map(),
      theme: undefined as never,
    });
    expect(problems).toEqual([
      expect.objectContaining({
        file: 'items/isle/x.json',
        field: '-',
        message: 'not valid JSON: Unexpected token',
      }),
    ]);
  });
});
