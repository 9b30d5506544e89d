import { describe, expect, it } from 'vitest';
import { distractorDuplicates } from '../../../server/bank/lint/distractor-duplicates.js';
import { broken, runRule, singleChoice } from './lint-helpers.js';

describe('distractor-duplicates', () => {
  it('fires for a distractor with the text of the key (ignoring case and spacing)', () => {
    const item = broken((i) => {
      singleChoice(i).options[2] = { id: 'c', text: ' tuesday ', value: 'Wed' };
    });
    expect(runRule(distractorDuplicates, [item])).toEqual([
      expect.objectContaining({
        field: 'response.options.2.text',
        message: 'distractor text same as the key (option b)',
      }),
    ]);
  });

  it('fires for two distractors with the same value', () => {
    const item = broken((i) => {
      singleChoice(i).options[3] = { id: 'd', text: 'Thursday', value: 'Mon' };
    });
    expect(runRule(distractorDuplicates, [item])).toEqual([
      expect.objectContaining({
        field: 'response.options.3.value',
        message: 'distractor value same as option a',
      }),
    ]);
  });
});
