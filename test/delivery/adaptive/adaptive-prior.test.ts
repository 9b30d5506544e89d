import { describe, expect, it } from 'vitest';
import { choosePrior, DEFAULT_PRIOR } from '../../../server/delivery/adaptive/adaptive-prior.js';
import {
  adaptiveStudySettingsSchema,
  stopRulesFor,
} from '../../../server/delivery/adaptive/adaptive-settings.js';

describe('choosePrior', () => {
  const groups = [
    { cohortId: 'weekday', mean: 0.2, sd: 0.9 },
    { cohortId: 'broken', mean: 0.1, sd: 0 },
  ];

  it("uses the cohort's calibrated distribution when there is one", () => {
    expect(choosePrior('weekday', groups)).toEqual({
      prior: { mean: 0.2, sd: 0.9, source: 'cohort' },
      warning: null,
    });
  });

  it('falls back to the stated default N(0, 1.5^2) with a warning', () => {
    const { prior, warning } = choosePrior('new-cohort', groups);
    expect(prior).toEqual({ mean: DEFAULT_PRIOR.mean, sd: 1.5, source: 'default' });
    expect(warning).toContain('no estimate of this cohort');
    expect(choosePrior('broken', groups).warning).toContain('no usable mean and SD');
    expect(choosePrior('new-cohort', [], { mean: -0.5, sd: 2 }).prior).toEqual({
      mean: -0.5,
      sd: 2,
      source: 'default',
    });
    expect(() => choosePrior('x', [], { mean: 0, sd: -1 })).toThrow('positive sd');
  });
});

describe('adaptive settings', () => {
  it('fills defaults and takes item and time limits from the study', () => {
    const adaptive = adaptiveStudySettingsSchema.parse({});
    expect(adaptive).toMatchObject({ seTarget: 0.45, minItems: 5, randomesque: 5, contentBalance: 'level' });
    expect(stopRulesFor(adaptive, { maxItems: 3, timeLimitSeconds: 180 })).toEqual({
      seTarget: 0.45,
      minItems: 3,
      maxItems: 3,
      timeLimitSeconds: 180,
      randomesque: 5,
    });
    expect(() => adaptiveStudySettingsSchema.parse({ seTarget: 0 })).toThrow();
  });
});
