/**
 * Helpers for chart tests: parse an SVG string into a small element tree, find elements by
 * class, read axis mappings, and normalise numbers for golden-file comparison (after d3's test
 * habit of comparing path strings with numbers rounded).
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';

export interface SvgElement {
  readonly name: string;
  readonly attributes: Readonly<Record<string, string>>;
  readonly children: readonly SvgElement[];
  /** Concatenated text content of this element's own text nodes. */
  readonly text: string;
}

type Parsed = Record<string, unknown>;

/** Parses an SVG document; throws with the parser's message when it is not well-formed XML. */
export function parseSvg(svg: string): SvgElement {
  const valid = XMLValidator.validate(svg);
  if (valid !== true) throw new Error(`invalid XML: ${valid.err.msg} (line ${valid.err.line})`);
  const parser = new XMLParser({
    ignoreAttributes: false,
    attributeNamePrefix: '',
    preserveOrder: true,
    trimValues: false,
    parseTagValue: false,
    parseAttributeValue: false,
  });
  const nodes = parser.parse(svg) as Parsed[];
  const root = nodes.map(toElement).find((node) => node !== undefined && node.name === 'svg');
  if (root === undefined) throw new Error('no <svg> root');
  return root;
}

function toElement(node: Parsed): SvgElement | undefined {
  const name = Object.keys(node).find((key) => key !== ':@' && key !== '#text');
  if (name === undefined) return undefined;
  const rawChildren = (node[name] as Parsed[]) ?? [];
  const attributes = (node[':@'] as Record<string, string> | undefined) ?? {};
  const children = rawChildren.map(toElement).filter((child): child is SvgElement => child !== undefined);
  const text = rawChildren
    .map((child) => (typeof child['#text'] === 'string' ? child['#text'] : ''))
    .join('');
  return { name, attributes, children, text: decode(text) };
}

function decode(text: string): string {
  return text
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&amp;/g, '&');
}

/** Every element under (and including) `root` that satisfies `predicate`, in document order. */
export function findElements(root: SvgElement, predicate: (element: SvgElement) => boolean): SvgElement[] {
  const found: SvgElement[] = [];
  const visit = (element: SvgElement) => {
    if (predicate(element)) found.push(element);
    element.children.forEach(visit);
  };
  visit(root);
  return found;
}

/** Elements whose class list contains every one of `classNames` (space separated). */
export function byClass(root: SvgElement, classNames: string): SvgElement[] {
  const wanted = classNames.split(' ');
  return findElements(root, (element) => {
    const classes = (element.attributes['class'] ?? '').split(/\s+/);
    return wanted.every((name) => classes.includes(name));
  });
}

/** Texts of the elements with the given classes. */
export function textsOf(root: SvgElement, classNames: string): string[] {
  return byClass(root, classNames).map((element) => element.text);
}

/** Numeric attribute; throws when absent. */
export function num(element: SvgElement, attribute: string): number {
  const value = element.attributes[attribute];
  if (value === undefined) throw new Error(`<${element.name}> has no ${attribute}`);
  return Number(value);
}

/**
 * The linear map value -> coordinate of a numeric axis, read from its first and last tick
 * (tick lines and labels come in the same order inside `<g class="axis axis-left|bottom">`).
 */
export function axisMapping(root: SvgElement, side: 'left' | 'bottom'): (value: number) => number {
  const axis = byClass(root, `axis axis-${side}`)[0];
  if (axis === undefined) throw new Error(`no ${side} axis`);
  const ticks = byClass(axis, 'tick');
  // Tick labels as numbers: thousands separators dropped, percentages as fractions.
  const labels = textsOf(axis, 'tick-label').map((label) => {
    const value = Number(label.replace(/[,%]/g, ''));
    return label.endsWith('%') ? value / 100 : value;
  });
  const position = (tick: SvgElement) => num(tick, side === 'left' ? 'y1' : 'x1');
  const [v0, v1] = [labels[0]!, labels[labels.length - 1]!];
  const [p0, p1] = [position(ticks[0]!), position(ticks[ticks.length - 1]!)];
  return (value) => p0 + ((value - v0) / (v1 - v0)) * (p1 - p0);
}

/**
 * Rounds every number in an SVG string to 1 decimal (and -0 to 0) so golden files tolerate
 * last-digit floating-point differences between platforms but not layout changes.
 */
export function normalizeSvgNumbers(svg: string): string {
  return svg.replace(/-?\d*\.?\d+(?:e[-+]?\d+)?/gi, (match) => {
    const value = Math.round(Number(match) * 10) / 10;
    return Object.is(value, -0) ? '0' : String(value);
  });
}
