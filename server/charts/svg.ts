/** Small SVG string helpers: escaping, number formatting and element building. */

/**
 * Escapes the five XML special characters so any text can sit in element content or in a
 * double-quoted attribute value.
 *
 * @see W3C, Extensible Markup Language (XML) 1.0, section 2.4 "Character Data and Markup".
 * @param text any text
 * @returns the text with & < > " ' replaced by entity references
 * @example
 * escapeXml('Tom & "Jo" <3'); // 'Tom &amp; &quot;Jo&quot; &lt;3'
 */
export function escapeXml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/**
 * Writes a coordinate with at most `digits` decimals and no trailing zeros, so output is stable
 * across platforms (no `1e-7`, no `-0`).
 *
 * @example
 * formatCoordinate(1.23456, 2); // '1.23'
 */
export function formatCoordinate(value: number, digits = 2): string {
  if (!Number.isFinite(value)) {
    throw new Error(`formatCoordinate requires a finite number, got ${value}`);
  }
  const factor = 10 ** digits;
  const rounded = Math.round(value * factor) / factor;
  return Object.is(rounded, -0) || rounded === 0 ? '0' : String(rounded);
}

export type AttributeValue = string | number | undefined | null | false;
export type Attributes = Readonly<Record<string, AttributeValue>>;

/** Attribute string with a leading space per attribute; undefined/null/false attributes are left out. */
export function attributes(attrs: Attributes): string {
  let out = '';
  for (const [name, value] of Object.entries(attrs)) {
    if (value === undefined || value === null || value === false) continue;
    const text = typeof value === 'number' ? formatCoordinate(value) : escapeXml(value);
    out += ` ${name}="${text}"`;
  }
  return out;
}

/**
 * One element: self-closing when `children` is undefined, otherwise wrapping the children.
 * Children are raw markup (already escaped); use {@link textElement} for text content.
 */
export function element(name: string, attrs: Attributes, children?: string | readonly string[]): string {
  if (children === undefined) return `<${name}${attributes(attrs)}/>`;
  const inner = typeof children === 'string' ? children : children.join('');
  return `<${name}${attributes(attrs)}>${inner}</${name}>`;
}

/** An element whose content is text (escaped here). */
export function textElement(name: string, attrs: Attributes, text: string): string {
  return `<${name}${attributes(attrs)}>${escapeXml(text)}</${name}>`;
}

/**
 * FNV-1a 32-bit hash of a string, as 8 hex digits: a short deterministic fingerprint for default ids.
 *
 * @see Fowler, Noll and Vo, "FNV hash" (IETF draft-eastlake-fnv), 32-bit offset basis 2166136261,
 *   prime 16777619.
 * @example
 * hashString(''); // '811c9dc5'
 */
export function hashString(text: string): string {
  let hash = 0x811c9dc5;
  for (let index = 0; index < text.length; index += 1) {
    hash ^= text.charCodeAt(index);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash.toString(16).padStart(8, '0');
}
