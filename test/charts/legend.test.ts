import { describe, expect, it } from 'vitest';
import { spreadLabels } from '../../server/charts/legend.js';

describe('spreadLabels', () => {
  it('matches its documented example', () => {
    expect(spreadLabels([10, 12, 30], 10, 0, 100)).toEqual([10, 20, 30]);
  });

  it('keeps the input order of results, and pushes up from the bottom limit', () => {
    expect(spreadLabels([95, 99, 50], 10, 0, 100)).toEqual([90, 100, 50]);
    expect(spreadLabels([40, 40], 20, 0, 100)).toEqual([40, 60]);
  });
});
