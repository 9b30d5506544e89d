import { describe, expect, it } from 'vitest';
import { equalIntervalClasses } from '../../server/charts/class-legend.js';
import { defaultTheme } from '../../server/charts/theme.js';

describe('equalIntervalClasses', () => {
  it('matches its documented examples', () => {
    expect(equalIntervalClasses([5, 50], 5, defaultTheme).edges).toEqual([0, 10, 20, 30, 40, 50]);
    expect(equalIntervalClasses([12, 45], 3, defaultTheme).edges).toEqual([0, 20, 40, 60]);
  });

  it('assigns a value on an inner edge to the upper class and the maximum to the last', () => {
    const classes = equalIntervalClasses([0, 100], 4, defaultTheme);
    expect(classes.edges).toEqual([0, 25, 50, 75, 100]);
    expect([0, 24.9, 25, 99, 100].map(classes.classOf)).toEqual([0, 0, 1, 3, 3]);
  });
});
