import { describe, expect, it } from 'vitest';
import { labelOverlap } from '../../../server/bank/lint/label-overlap.js';
import { validItem } from '../valid-item.js';
import { runRule } from './lint-helpers.js';

describe('label-overlap', () => {
  it('fires for two labels whose boxes overlap', () => {
    const labelBoxes = () => [
      { x: 10, y: 10, width: 50, height: 16, text: 'Monday', kind: 'tick' },
      { x: 40, y: 12, width: 50, height: 16, text: 'Tuesday', kind: 'tick' },
    ];
    expect(runRule(labelOverlap, [validItem()], { labelBoxes })).toEqual([
      expect.objectContaining({
        field: 'chart',
        message: 'labels "Monday" (tick) and "Tuesday" (tick) overlap',
      }),
    ]);
  });

  it('reports a chart that cannot be drawn', () => {
    const labelBoxes = () => {
      throw new Error('no renderer for this chart');
    };
    expect(runRule(labelOverlap, [validItem()], { labelBoxes })[0]?.message).toBe(
      'chart cannot be drawn: no renderer for this chart',
    );
  });
});
