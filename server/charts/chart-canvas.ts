/**
 * The drawing surface every renderer shares: it places the visible title and note, writes text
 * while recording each label's box, draws the spec's annotation, and wraps everything into one
 * accessible SVG document (role="img", <title>, <desc>, viewBox, no fixed pixel size).
 */
import { annotatedRowIndex } from './chart-data.js';
import type { ChartSpec } from './chart-spec.js';
import { type ChartSummary, describeChart } from './describe-chart.js';
import type { LabelBox } from './label-box.js';
import { element, formatCoordinate, hashString, textElement } from './svg.js';
import { estimateTextWidth, wrapText } from './text-metrics.js';
import { defaultTheme, type Theme } from './theme.js';

/** Options every renderer accepts. */
export interface ChartRenderOptions {
  /** viewBox width; default theme.width (600). Text sizes are in these units. */
  readonly width?: number;
  /** viewBox height; default theme.height (400); tables size themselves to their rows. */
  readonly height?: number;
  /** Prefix for element ids, unique per chart on a page; default `chart-` + a hash of the spec. */
  readonly idPrefix?: string;
  /** Alt text for <desc> (the item's own); default a description built from the spec. */
  readonly description?: string;
  /** Called once per text label drawn, with its estimated box (for overlap lint). */
  readonly onLabel?: (box: LabelBox) => void;
  /** Draw the spec's title as visible text at the top; default true. */
  readonly showTitle?: boolean;
  /** Sizes, fonts and colours; default {@link defaultTheme}. */
  readonly theme?: Theme;
}

export interface TextStyle {
  readonly kind: string;
  readonly size?: number;
  readonly anchor?: 'start' | 'middle' | 'end';
  /** Where `y` sits: on the baseline (default), the middle, the top or the bottom of the text. */
  readonly align?: 'baseline' | 'middle' | 'top' | 'bottom';
  readonly bold?: boolean;
  readonly fill?: string;
  /** A white outline behind the glyphs, for text over marks or regions. */
  readonly halo?: boolean;
  readonly className?: string;
  /** Extra attributes, e.g. data-row on table cells. */
  readonly extra?: Readonly<Record<string, string | number>>;
}

/** Ascent and descent of the estimated text box, as fractions of the font size. */
const ascent = 0.8;
const descent = 0.2;

export class ChartCanvas {
  readonly width: number;
  readonly height: number;
  readonly theme: Theme;
  readonly idPrefix: string;
  /** Top of the free area: below the title and anything reserved with {@link reserveTop}. */
  top: number;
  /** Bottom of the free area: above the note. */
  bottom: number;
  readonly left: number;
  readonly right: number;
  private readonly header: string[] = [];
  private readonly footer: string[] = [];
  private readonly anchors = new Map<number, { x: number; y: number }>();
  /** Estimated boxes of every text drawn so far, in drawing order (for label placement). */
  readonly drawnBoxes: LabelBox[] = [];

  constructor(
    private readonly spec: ChartSpec,
    private readonly options: ChartRenderOptions = {},
  ) {
    this.theme = options.theme ?? defaultTheme;
    this.width = options.width ?? this.theme.width;
    this.height = options.height ?? this.theme.height;
    this.idPrefix = options.idPrefix ?? `chart-${hashString(JSON.stringify(spec))}`;
    const pad = this.theme.padding;
    this.left = pad;
    this.right = this.width - pad;
    this.top = pad;
    this.bottom = this.height - pad;
    if (options.showTitle ?? true) {
      const size = this.theme.fontSize.title;
      const lines = wrapText(spec.title, size, this.right - this.left, true);
      this.header.push(
        ...this.lines(this.left, this.top, lines, {
          kind: 'title',
          size,
          bold: true,
          align: 'top',
          className: 'chart-title',
        }),
      );
      this.top += lines.length * size * this.theme.lineHeight + 8;
    }
    if (spec.note !== undefined) {
      const size = this.theme.fontSize.note;
      const lines = wrapText(spec.note, size, this.right - this.left);
      const height = lines.length * size * this.theme.lineHeight;
      this.bottom -= height;
      this.footer.push(
        ...this.lines(this.left, this.bottom + 4, lines, {
          kind: 'note',
          size,
          align: 'top',
          fill: this.theme.colours.mutedText,
          className: 'chart-note',
        }),
      );
      this.bottom -= 4;
    }
  }

  /** A coordinate as written to the SVG. */
  n(value: number): string {
    return formatCoordinate(value, this.theme.digits);
  }

  /** Takes `height` units off the top of the free area and returns the y where they start. */
  reserveTop(height: number): number {
    const start = this.top;
    this.top += height;
    return start;
  }

  /** One <text> element; its estimated box goes to `options.onLabel`. */
  text(x: number, y: number, content: string, style: TextStyle): string {
    const size = Math.max(style.size ?? this.theme.fontSize.label, this.theme.minFontSize);
    const align = style.align ?? 'baseline';
    const baseline =
      align === 'middle'
        ? y + (ascent - 0.5) * size
        : align === 'top'
          ? y + ascent * size
          : align === 'bottom'
            ? y - descent * size
            : y;
    const width = estimateTextWidth(content, size, style.bold ?? false);
    const anchor = style.anchor ?? 'start';
    const left = anchor === 'middle' ? x - width / 2 : anchor === 'end' ? x - width : x;
    const box = {
      x: left,
      y: baseline - ascent * size,
      width,
      height: size,
      text: content,
      kind: style.kind,
    };
    this.drawnBoxes.push(box);
    this.options.onLabel?.(box);
    const halo = style.halo === true;
    return textElement(
      'text',
      {
        class: style.className ?? style.kind,
        ...style.extra,
        x: this.n(x),
        y: this.n(baseline),
        'font-size': size,
        'font-weight': style.bold === true ? 'bold' : undefined,
        'text-anchor': anchor === 'start' ? undefined : anchor,
        fill: style.fill ?? this.theme.colours.text,
        stroke: halo ? this.theme.colours.background : undefined,
        'stroke-width': halo ? 4 : undefined,
        'stroke-linejoin': halo ? 'round' : undefined,
        'paint-order': halo ? 'stroke' : undefined,
      },
      content,
    );
  }

  /** Several lines of text, `y` placing the first line as in {@link text}. */
  lines(x: number, y: number, lines: readonly string[], style: TextStyle): string[] {
    const size = Math.max(style.size ?? this.theme.fontSize.label, this.theme.minFontSize);
    return lines.map((line, index) => this.text(x, y + index * size * this.theme.lineHeight, line, style));
  }

  /** Records where the mark drawn for `spec.data[rowIndex]` is, for the annotation. */
  anchor(rowIndex: number, x: number, y: number): void {
    if (!this.anchors.has(rowIndex)) this.anchors.set(rowIndex, { x, y });
  }

  /** Wraps the chart body into the finished SVG (root element with title and desc). */
  finish(body: readonly string[], summary: ChartSummary): string {
    const titleId = `${this.idPrefix}-title`;
    const descId = `${this.idPrefix}-desc`;
    const description = this.options.description ?? describeChart(this.spec, summary);
    const parts = [
      textElement('title', { id: titleId }, this.spec.title),
      textElement('desc', { id: descId }, description),
      element('rect', {
        class: 'background',
        width: this.width,
        height: this.height,
        fill: this.theme.colours.background,
      }),
      ...this.header,
      ...body,
      this.annotation(),
      ...this.footer,
    ];
    return element(
      'svg',
      {
        xmlns: 'http://www.w3.org/2000/svg',
        viewBox: `0 0 ${this.n(this.width)} ${this.n(this.height)}`,
        preserveAspectRatio: 'xMidYMid meet',
        role: 'img',
        'aria-labelledby': `${titleId} ${descId}`,
        class: `chart chart-${this.spec.type}`,
        'data-chart-type': this.spec.type,
        'font-family': this.theme.fontFamily,
      },
      parts,
    );
  }

  /** The annotation: its text above (or below) the annotated mark, joined by a short line. */
  private annotation(): string {
    const note = this.spec.annotation;
    const anchor = this.anchors.get(annotatedRowIndex(this.spec));
    if (note === undefined || anchor === undefined) return '';
    const size = this.theme.fontSize.label;
    const width = estimateTextWidth(note.text, size, true);
    const gap = 34;
    const above = anchor.y - gap - size >= this.top;
    const textY = above ? anchor.y - gap : anchor.y + gap;
    const x = Math.min(Math.max(anchor.x - width / 2, this.left), this.right - width);
    const line = element('line', {
      x1: this.n(anchor.x),
      y1: this.n(above ? anchor.y - 4 : anchor.y + 4),
      x2: this.n(anchor.x),
      y2: this.n(above ? textY + 4 : textY - 4),
      stroke: this.theme.colours.text,
      'stroke-width': 1.5,
    });
    const text = this.text(x, textY, note.text, {
      kind: 'annotation',
      className: 'annotation-text',
      size,
      bold: true,
      align: above ? 'bottom' : 'top',
      halo: true,
    });
    return element('g', { class: 'annotation' }, [line, text]);
  }
}
