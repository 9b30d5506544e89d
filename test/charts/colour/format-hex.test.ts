import { describe, expect, it } from 'vitest';
import { formatHex } from '../../../server/charts/colour/format-hex.js';

describe('formatHex', () => {
  it('writes the documented example', () => {
    expect(formatHex([0, 170, 136])).toBe('#00aa88');
  });

  it('rounds to the nearest integer and clamps to 0..255', () => {
    expect(formatHex([15.4, 15.6, 254.5])).toBe('#0f10ff');
    expect(formatHex([-3, 300, 0])).toBe('#00ff00');
  });

  it('rejects non-finite channels', () => {
    expect(() => formatHex([Number.NaN, 0, 0])).toThrow('formatHex requires finite channels');
  });
});
