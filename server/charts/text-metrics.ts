/**
 * Advance widths, in thousandths of an em, for the printable ASCII characters 32..126 in order:
 * per character the LARGER of two faces, so the estimate covers both:
 * - Helvetica/Arial (metric-compatible family; values from memory), what most phones, kiosks and
 *   desktops resolve the chart font stack (system-ui, Segoe UI, Roboto, Helvetica, Arial) to or
 *   something close;
 * - DejaVu Sans 2.37, the fallback on Debian and many Linux kiosks, about 17 % (regular) and 30 %
 *   (bold) wider than Arial on average. Measured with Chromium's canvas `measureText` at 1000 px
 *   on Debian 12, so a chart laid out with these widths does not clip on such a kiosk.
 * Every width is still an ESTIMATE, good for layout and overlap checks, not exact typesetting.
 */
// biome-ignore format: one row per 16 characters keeps the table readable
const regularWidths: readonly number[] = [
  318, 401, 460, 838, 636, 950, 780, 275, 390, 390, 500, 838, 318, 361, 318, 337, // space to /
  636, 636, 636, 636, 636, 636, 636, 636, 636, 636, 337, 337, 838, 838, 838, 556, // 0 to ?
  1015, 684, 686, 722, 770, 667, 611, 778, 752, 295, 500, 667, 557, 863, 748, 787, // @ to O
  667, 787, 722, 667, 611, 732, 684, 989, 685, 667, 685, 390, 337, 390, 838, 556, // P to _
  500, 613, 635, 550, 635, 615, 352, 635, 634, 278, 278, 579, 278, 974, 634, 612, // ` to o
  635, 635, 411, 521, 392, 634, 592, 818, 592, 592, 525, 636, 337, 636, 838, // p to ~
];

/** As `regularWidths` for bold: the larger of Arial x 1.07 and DejaVu Sans Bold (measured as above). */
// biome-ignore format: one row per 16 characters keeps the table readable
const boldWidths: readonly number[] = [
  348, 456, 521, 838, 696, 1002, 872, 306, 457, 457, 523, 838, 380, 415, 380, 365, // space to /
  696, 696, 696, 696, 696, 696, 696, 696, 696, 696, 400, 400, 838, 838, 838, 595, // 0 to ?
  1086, 774, 762, 773, 830, 714, 683, 832, 837, 372, 535, 775, 637, 995, 837, 850, // @ to O
  733, 850, 773, 720, 682, 812, 774, 1103, 771, 724, 725, 457, 365, 457, 838, 595, // P to _
  500, 675, 716, 593, 716, 678, 435, 716, 712, 343, 343, 665, 343, 1042, 712, 687, // ` to o
  716, 716, 493, 595, 478, 712, 652, 924, 645, 652, 582, 712, 365, 712, 838, // p to ~
];

/** Width used for characters outside printable ASCII (accented letters, °, –, ...). */
const otherWidth = { regular: 640, bold: 720 };
/** A small margin for kerning differences and faces slightly wider than both tables. */
const safetyFactor = 1.03;

/**
 * Estimated width of a line of text in a sans-serif font: the sum of per-character advance widths
 * (regular or bold table) times the font size, times a 1.03 safety factor. An estimate (see the
 * tables' comment), not a measurement.
 *
 * @param text one line of text
 * @param fontSize font size in viewBox units
 * @param bold whether the text is set in bold
 * @returns estimated width in the same units as `fontSize`
 * @example
 * estimateTextWidth('10', 16); // 20.96256 (2 x 0.636 em x 16 x 1.03)
 */
export function estimateTextWidth(text: string, fontSize: number, bold = false): number {
  const widths = bold ? boldWidths : regularWidths;
  const other = bold ? otherWidth.bold : otherWidth.regular;
  let thousandths = 0;
  for (const character of text) {
    const code = character.codePointAt(0) ?? 0;
    thousandths += code >= 32 && code <= 126 ? widths[code - 32]! : other;
  }
  return (thousandths / 1000) * fontSize * safetyFactor;
}

/** Widths within this of `maxWidth` count as fitting (layout arithmetic leaves rounding residue). */
const fitTolerance = 1e-6;

/**
 * Breaks text into lines no wider than `maxWidth` (estimated), breaking at spaces and, only where
 * a piece still does not fit, after an en dash or a hyphen inside it (the dash stays on the first
 * line: "10:00–" / "12:00"). A text that fits stays on one line; a piece wider than `maxWidth` with
 * no break opportunity stays whole on its own line.
 *
 * @example
 * wrapText('North harbour quay', 16, 80); // ['North', 'harbour', 'quay']
 * wrapText('10:00–12:00', 16, 60); // ['10:00–', '12:00']
 */
export function wrapText(text: string, fontSize: number, maxWidth: number, bold = false): string[] {
  const fits = (candidate: string) => estimateTextWidth(candidate, fontSize, bold) <= maxWidth + fitTolerance;
  const words = text.split(/\s+/).filter((word) => word.length > 0);
  const lines: string[] = [];
  let line = '';
  for (const word of words) {
    // A word too wide for a line of its own may split after its dashes.
    const pieces = fits(word) ? [word] : word.split(/(?<=[–-])(?=.)/);
    pieces.forEach((piece, index) => {
      const joiner = index === 0 && line !== '' ? ' ' : '';
      const candidate = `${line}${joiner}${piece}`;
      if (line !== '' && !fits(candidate)) {
        lines.push(line);
        line = piece;
      } else {
        line = candidate;
      }
    });
  }
  if (line !== '') lines.push(line);
  return lines;
}
