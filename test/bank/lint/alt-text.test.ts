import { describe, expect, it } from 'vitest';
import { altText, containsToken } from '../../../server/bank/lint/alt-text.js';
import { broken, runRule, singleChoice } from './lint-helpers.js';

describe('alt-text', () => {
  it('fires for alt text that is too short', () => {
    const item = broken((i) => {
      i.alt = 'A bar chart.';
    });
    expect(runRule(altText, [item])).toEqual([
      expect.objectContaining({
        field: 'alt',
        message: 'alt text is 12 characters, needs at least 40 to describe the chart',
      }),
    ]);
  });

  it('fires for alt text that contains a numeric answer', () => {
    const item = broken((i) => {
      i.key = { by: 'query', query: { op: 'value-at', field: 'passengers', where: { day: 'Tue' } } };
      singleChoice(i).options = [120, 340, 210, 90].map((value, index) => ({
        id: 'abcd'[index]!,
        text: `${value}`,
        value,
      }));
      i.alt = 'Bar chart of ferry passengers on four days; the tallest bar reaches 340 people.';
    });
    expect(runRule(altText, [item])[0]?.message).toBe("alt text contains the key's answer 340");
  });

  it('fires when the alt text singles out the key category, not when it lists every option', () => {
    const singled = broken((i) => {
      i.alt = 'Bar chart of ferry passengers on four days, with Tuesday well above the rest of the week.';
    });
    const listed = broken((i) => {
      i.alt =
        'Bar chart of ferry passengers on Monday, Tuesday, Wednesday and Thursday, from 0 to 400 people.';
    });
    expect(runRule(altText, [singled])[0]?.message).toBe(
      'alt text names the key "Tuesday" but not every other option',
    );
    expect(runRule(altText, [listed])).toEqual([]);
  });

  it('matches whole numbers only', () => {
    expect(containsToken('from 0 to 400 people', '40')).toBe(false);
    expect(containsToken('about 1,340 people', '340')).toBe(false);
    expect(containsToken('about 340.5 people', '340')).toBe(false);
    expect(containsToken('reaches 340.', '340')).toBe(true);
  });
});
