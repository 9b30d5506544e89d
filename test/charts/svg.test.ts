import { describe, expect, it } from 'vitest';
import { element, escapeXml, formatCoordinate, hashString, textElement } from '../../server/charts/svg.js';

describe('escapeXml', () => {
  // The five predefined entities of XML 1.0, section 4.6.
  it('matches its documented example', () => {
    expect(escapeXml('Tom & "Jo" <3')).toBe('Tom &amp; &quot;Jo&quot; &lt;3');
    expect(escapeXml("a'b>c")).toBe('a&apos;b&gt;c');
  });
});

describe('formatCoordinate', () => {
  it('rounds to the digits, drops trailing zeros and negative zero', () => {
    expect(formatCoordinate(1.23456, 2)).toBe('1.23');
    expect(formatCoordinate(2.5, 2)).toBe('2.5');
    expect(formatCoordinate(-0.0001, 2)).toBe('0');
    expect(() => formatCoordinate(Number.NaN)).toThrow('formatCoordinate requires a finite number, got NaN');
  });
});

describe('element', () => {
  it('writes attributes in order, leaves out undefined ones and escapes text', () => {
    expect(element('rect', { x: 1.234, y: undefined, fill: '#fff' })).toBe('<rect x="1.23" fill="#fff"/>');
    expect(textElement('text', { class: 'a' }, 'x < y')).toBe('<text class="a">x &lt; y</text>');
  });
});

describe('hashString', () => {
  // FNV-1a 32-bit test vectors of the FNV reference (draft-eastlake-fnv), from memory: "" -> 0x811c9dc5,
  // "a" -> 0xe40c292c, "foobar" -> 0xbf9cf968.
  it('matches the published FNV-1a vectors', () => {
    expect(hashString('')).toBe('811c9dc5');
    expect(hashString('a')).toBe('e40c292c');
    expect(hashString('foobar')).toBe('bf9cf968');
  });
});
