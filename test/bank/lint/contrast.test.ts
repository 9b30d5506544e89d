import { describe, expect, it } from 'vitest';
import { contrast } from '../../../server/bank/lint/contrast.js';
import { defaultTheme } from '../../../server/charts/theme.js';
import { barChart, broken, runRule } from './lint-helpers.js';

describe('contrast', () => {
  it('fires for a mark colour below 3:1 on white (WCAG 2.1 SC 1.4.11)', () => {
    // #959595 on #ffffff is 2.9953:1, just below 3:1 (check-values.md, derived from the W3C formula)
    const item = broken((i) => {
      barChart(i).colours = ['#959595'];
    });
    expect(runRule(contrast, [item])).toEqual([
      expect.objectContaining({
        field: 'chart.colours.0',
        message:
          'mark colour #959595 (chart.colours.0) on #ffffff is 3.00:1, marks need 3:1 (WCAG 2.1 SC 1.4.11)',
      }),
    ]);
  });

  it('passes #767676 marks (4.54:1) and fires for #777777 text (4.4781:1 < 4.5, WCAG 2.1 SC 1.4.3)', () => {
    const item = broken((i) => {
      barChart(i).colours = ['#767676'];
    });
    const theme = { ...defaultTheme, colours: { ...defaultTheme.colours, text: '#777777' } };
    expect(runRule(contrast, [item], { theme })).toEqual([
      expect.objectContaining({
        field: 'theme',
        message: 'text #777777 on #ffffff is 4.48:1, text needs 4.5:1 (WCAG 2.1 SC 1.4.3)',
      }),
    ]);
  });
});
