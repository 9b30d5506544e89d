/**
 * Estimated advance widths of a common sans-serif font, in thousandths of an em, for the printable
 * ASCII characters 32..126 in order. Values follow the widths of the metric-compatible
 * Helvetica/Arial family (from memory); the system font stack the charts use (system-ui, Segoe UI,
 * Roboto, Helvetica, Arial) differs by a few percent, so every width here is an ESTIMATE, good
 * enough for layout and for detecting overlapping labels, not for exact typesetting.
 */
// biome-ignore format: one row per 16 characters keeps the table readable
const asciiWidths: readonly number[] = [
  278, 278, 355, 556, 556, 889, 667, 191, 333, 333, 389, 584, 278, 333, 278, 278, // space to /
  556, 556, 556, 556, 556, 556, 556, 556, 556, 556, 278, 278, 584, 584, 584, 556, // 0 to ?
  1015, 667, 667, 722, 722, 667, 611, 778, 722, 278, 500, 667, 556, 833, 722, 778, // @ to O
  667, 778, 722, 667, 611, 722, 667, 944, 667, 667, 611, 278, 278, 278, 469, 556, // P to _
  333, 556, 556, 500, 556, 556, 278, 556, 556, 222, 222, 500, 222, 833, 556, 556, // ` to o
  556, 556, 333, 500, 278, 556, 500, 722, 500, 500, 500, 334, 260, 334, 584, // p to ~
];

/** Width used for characters outside printable ASCII (accented letters, °, –, ...). */
const otherWidth = 600;
/** Bold text is estimated this much wider than regular text. */
const boldFactor = 1.07;
/**
 * Safety margin: system-ui resolves to wider faces on some systems (DejaVu Sans on Debian is about
 * 10 % wider than Arial), and overestimating only costs a little space.
 */
const safetyFactor = 1.1;

/**
 * Estimated width of a line of text in a sans-serif font: the sum of per-character advance widths
 * times the font size, times a 1.1 safety factor. An estimate (see the table's comment), not a measurement.
 *
 * @param text one line of text
 * @param fontSize font size in viewBox units
 * @param bold whether the text is set in bold
 * @returns estimated width in the same units as `fontSize`
 * @example
 * estimateTextWidth('10', 16); // 19.5712 (2 x 0.556 em x 16 x 1.1)
 */
export function estimateTextWidth(text: string, fontSize: number, bold = false): number {
  let thousandths = 0;
  for (const character of text) {
    const code = character.codePointAt(0) ?? 0;
    thousandths += code >= 32 && code <= 126 ? asciiWidths[code - 32]! : otherWidth;
  }
  return (thousandths / 1000) * fontSize * safetyFactor * (bold ? boldFactor : 1);
}

/**
 * Breaks text into lines no wider than `maxWidth` (estimated), breaking only at spaces; a single
 * word wider than `maxWidth` stays on its own line.
 *
 * @example
 * wrapText('North harbour quay', 16, 80); // ['North', 'harbour', 'quay']
 */
export function wrapText(text: string, fontSize: number, maxWidth: number, bold = false): string[] {
  const words = text.split(/\s+/).filter((word) => word.length > 0);
  const lines: string[] = [];
  let line = '';
  for (const word of words) {
    const candidate = line === '' ? word : `${line} ${word}`;
    if (line !== '' && estimateTextWidth(candidate, fontSize, bold) > maxWidth) {
      lines.push(line);
      line = word;
    } else {
      line = candidate;
    }
  }
  if (line !== '') lines.push(line);
  return lines;
}
