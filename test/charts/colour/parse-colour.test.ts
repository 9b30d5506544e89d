import { describe, expect, it } from 'vitest';
import { parseColour } from '../../../server/charts/colour/parse-colour.js';

// CSS Color Module Level 4, sections 5.1-5.2: #rgb doubles each digit, #rrggbb is two hex digits
// per channel, rgb(r, g, b) takes integers 0..255.
describe('parseColour', () => {
  it('reads the documented example', () => {
    expect(parseColour('#0a8')).toEqual([0, 170, 136]);
    expect(parseColour('rgb(255, 0, 16)')).toEqual([255, 0, 16]);
  });

  it('reads six-digit hex in either case and ignores surrounding space', () => {
    expect(parseColour('#0000EE')).toEqual([0, 0, 238]);
    expect(parseColour('  #a1B2c3 ')).toEqual([161, 178, 195]);
  });

  it('doubles each digit of the short form', () => {
    expect(parseColour('#fff')).toEqual([255, 255, 255]);
    expect(parseColour('#123')).toEqual([17, 34, 51]);
  });

  it('reads rgb() without spaces', () => {
    expect(parseColour('RGB(1,2,3)')).toEqual([1, 2, 3]);
  });

  it.each([
    'red',
    '#ff',
    '#ffff',
    '#fffffff',
    '#ggg',
    'ff0000',
    'rgb(256, 0, 0)',
    'rgb(1, 2)',
    'rgba(1, 2, 3, 0.5)',
    'rgb(10%, 0%, 0%)',
    'hsl(0, 100%, 50%)',
    '',
  ])('rejects %j with a terse message', (text) => {
    expect(() => parseColour(text)).toThrow(`parseColour cannot read ${JSON.stringify(text)}`);
  });
});
