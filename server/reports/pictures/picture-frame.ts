import { contrastRatio } from '../../charts/colour/contrast-ratio.js';
import { element, escapeXml, hashString, textElement } from '../../charts/svg.js';
import { defaultTheme, type Theme } from '../../charts/theme.js';

/**
 * Wraps a report picture's body in an `<svg>` with a text alternative: `role="img"`, a `<title>` and
 * a `<desc>` referenced by `aria-labelledby`, the theme's font and a white background.
 */
export function pictureFrame(
  options: { width: number; height: number; title: string; description: string; theme?: Theme },
  body: readonly string[],
): string {
  const theme = options.theme ?? defaultTheme;
  const id = `pg-${hashString(options.title + options.description)}`;
  return element(
    'svg',
    {
      xmlns: 'http://www.w3.org/2000/svg',
      viewBox: `0 0 ${options.width} ${options.height}`,
      width: options.width,
      height: options.height,
      role: 'img',
      'aria-labelledby': `${id}-title ${id}-desc`,
      'font-family': theme.fontFamily,
    },
    [
      textElement('title', { id: `${id}-title` }, options.title),
      textElement('desc', { id: `${id}-desc` }, options.description),
      element('rect', {
        x: 0,
        y: 0,
        width: options.width,
        height: options.height,
        fill: theme.colours.background,
      }),
      ...body,
    ],
  );
}

/** The theme's text colour or white, whichever contrasts more with `fill` (WCAG 2.x contrast). */
export function textColourOn(fill: string, theme: Theme = defaultTheme): string {
  return contrastRatio(theme.colours.text, fill) >= contrastRatio('#ffffff', fill)
    ? theme.colours.text
    : '#ffffff';
}

/** Whole-percent text of a share. */
export function percentText(share: number): string {
  return `${Math.round(share * 100)}%`;
}

export { escapeXml };
