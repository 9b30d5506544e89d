import { describe, expect, it } from 'vitest';
import { resolveColour } from '../../../server/charts/colour/resolve-colour.js';
import type { Rgb } from '../../../server/charts/colour/types.js';

describe('resolveColour', () => {
  it('parses strings (documented example)', () => {
    expect(resolveColour('#fff')).toEqual([255, 255, 255]);
  });

  it('passes valid channel triples through, fractions included', () => {
    expect(resolveColour([12.5, 0, 255])).toEqual([12.5, 0, 255]);
  });

  it.each([[[256, 0, 0]], [[-1, 0, 0]], [[Number.NaN, 0, 0]], [[1, 2]]])('rejects %j', (channels) => {
    expect(() => resolveColour(channels as unknown as Rgb)).toThrow(
      'resolveColour requires three channels within 0..255',
    );
  });

  it('reports unreadable strings through parseColour', () => {
    expect(() => resolveColour('teal')).toThrow('parseColour cannot read "teal"');
  });
});
