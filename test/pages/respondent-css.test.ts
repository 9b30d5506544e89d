import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { contrastRatio } from '../../server/charts/colour/contrast-ratio.js';
import { CONTRAST_THRESHOLDS, meetsContrast } from '../../server/charts/colour/meets-contrast.js';

const css = readFileSync(new URL('../../server/pages/assets/respondent.css', import.meta.url), 'utf8');

/** The custom properties declared in :root (the only place the stylesheet defines colours). */
function colours(): Map<string, string> {
  const root = /:root\s*\{([^}]*)\}/.exec(css)?.[1] ?? '';
  return new Map([...root.matchAll(/--([a-z-]+):\s*(#[0-9a-fA-F]{3,8})\s*;/g)].map((m) => [m[1]!, m[2]!]));
}

function ratio(foreground: string, background: string): number {
  const palette = colours();
  const a = palette.get(foreground);
  const b = palette.get(background);
  if (a === undefined || b === undefined) throw new Error(`no colour --${foreground} or --${background}`);
  return contrastRatio(a, b);
}

describe('respondent.css colours', () => {
  it('uses no colour literal outside :root (every colour is checked below)', () => {
    const outsideRoot = css.replace(/:root\s*\{[^}]*\}/, '');
    expect(outsideRoot.match(/#[0-9a-fA-F]{3,8}\b|rgba?\(|hsla?\(/g) ?? []).toEqual([]);
  });

  // WCAG 2.1 success criterion 1.4.3 Contrast (Minimum): 4.5:1 for normal text.
  it.each([
    ['text', 'background'],
    ['text', 'surface'],
    ['text', 'selected'],
    ['muted', 'background'],
    ['on-accent', 'accent'],
    ['on-accent', 'accent-dark'],
    ['accent', 'background'],
    ['accent', 'selected'],
    ['error', 'error-surface'],
    ['notice', 'notice-surface'],
  ])('text --%s on --%s reaches 4.5:1', (foreground, background) => {
    expect(meetsContrast(ratio(foreground, background), CONTRAST_THRESHOLDS.text)).toBe(true);
  });

  // WCAG 2.1 success criterion 1.4.11 Non-text Contrast: 3:1 for control borders and focus rings.
  it.each([
    ['border', 'background'],
    ['border', 'surface'],
    ['accent', 'selected'],
    ['focus', 'background'],
    ['focus', 'selected'],
  ])('control outline --%s on --%s reaches 3:1', (foreground, background) => {
    expect(meetsContrast(ratio(foreground, background), CONTRAST_THRESHOLDS.graphicalObject)).toBe(true);
  });

  it('the check itself rejects a pale grey that fails (WCAG 2.1 1.4.3: #999 on white is about 2.8:1)', () => {
    // #999999 on #ffffff = 2.85:1 (computed with the WCAG relative-luminance formula; from memory).
    expect(contrastRatio('#999999', '#ffffff')).toBeLessThan(3);
  });

  it('respects reduced motion: transitions only inside prefers-reduced-motion: no-preference', () => {
    const outside = css.replace(/@media \(prefers-reduced-motion: no-preference\)\s*\{[\s\S]*?\n\}/, '');
    expect(outside).not.toMatch(/transition|animation/);
    expect(css).toMatch(/prefers-reduced-motion: no-preference/);
  });
});
