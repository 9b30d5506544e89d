import { describe, expect, it } from 'vitest';
import {
  adaptiveStudySettingsSchema,
  stopRulesFor,
} from '../../server/delivery/adaptive/adaptive-settings.js';
import {
  alignExposureControl,
  exposureControlSettingsHash,
  exposureControlSettingsJson,
  exposureControlSettingsOf,
} from '../../server/delivery/stored-exposure-control.js';

const settingsFor = (block: Record<string, unknown>, maxItems = 20) => {
  const adaptive = adaptiveStudySettingsSchema.parse(block);
  return exposureControlSettingsOf(adaptive, stopRulesFor(adaptive, { maxItems, timeLimitSeconds: 600 }));
};

describe('stored exposure control', () => {
  it('names the settings it holds for in a fixed order, without time limit or default prior', () => {
    expect(exposureControlSettingsJson(settingsFor({ areaTargets: { read: 2, envision: 1 } }))).toBe(
      '{"seTarget":0.45,"minItems":5,"maxItems":20,"randomesque":5,"contentBalance":"level","areaTargets":{"envision":1,"read":2}}',
    );
    // minItems is capped at maxItems, as the stop rules apply it.
    expect(settingsFor({ minItems: 9 }, 6).minItems).toBe(6);
  });

  it('hashes equal settings equally and any selection setting differently', () => {
    const base = exposureControlSettingsHash(settingsFor({ areaTargets: { read: 2, envision: 1 } }));
    expect(base).toMatch(/^[0-9a-f]{64}$/);
    // Key order of the area targets does not matter; the default prior is not part of it.
    expect(
      exposureControlSettingsHash(
        settingsFor({ areaTargets: { envision: 1, read: 2 }, defaultPrior: { mean: 1, sd: 1 } }),
      ),
    ).toBe(base);
    const changed = [
      { seTarget: 0.5, areaTargets: { read: 2, envision: 1 } },
      { minItems: 6, areaTargets: { read: 2, envision: 1 } },
      { randomesque: 4, areaTargets: { read: 2, envision: 1 } },
      { contentBalance: 'chart-type', areaTargets: { read: 2, envision: 1 } },
      { areaTargets: { read: 3, envision: 1 } },
      {},
    ].map((block) => exposureControlSettingsHash(settingsFor(block)));
    changed.push(exposureControlSettingsHash(settingsFor({ areaTargets: { read: 2, envision: 1 } }, 21)));
    expect(new Set([base, ...changed]).size).toBe(changed.length + 1);
  });

  it('aligns K to the bank: items not named get 1, names not in the bank are ignored, damage throws', () => {
    expect(Array.from(alignExposureControl({ b: 0.4, c: 0, gone: 0.2 }, ['a', 'b', 'c']))).toEqual([
      1, 0.4, 0,
    ]);
    expect(() => alignExposureControl({ a: 1.2 }, ['a'])).toThrow('K in [0, 1] (item a: 1.2)');
    expect(() => alignExposureControl({ a: Number.NaN }, ['a'])).toThrow('K in [0, 1]');
    // An inherited name is not a stored value.
    expect(Array.from(alignExposureControl({}, ['toString']))).toEqual([1]);
  });
});
