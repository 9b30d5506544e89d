/**
 * Checks and cleans a pilot chart uploaded as an image: SVG (sanitized) or PNG (signature
 * checked). Anything else, anything malformed and anything too large is refused with a clear
 * 4xx; the caller stores only what this returns.
 *
 * SVG profile: DOMPurify over jsdom with its SVG profile (no scripts, no event handlers, no
 * foreignObject, no animation elements such as animate/set), and on top of it:
 * - `href` / `xlink:href` only to a same-document `#id` (no javascript:, data:, http: ...);
 * - attribute values with `url(...)` only as `url(#id)`;
 * - `<style>` elements are removed when they contain `url(`, `@import` or `expression(`;
 * - a DOCTYPE or entity declaration is refused outright (entity expansion);
 * - the result must still be well-formed XML with an `<svg>` root.
 * Served later with `Content-Security-Policy: default-src 'none'; style-src 'unsafe-inline'` and
 * `X-Content-Type-Options: nosniff`, so even a missed vector cannot run script or fetch.
 *
 * @see OWASP Cheat Sheet Series, XSS Filter Evasion Cheat Sheet (vectors used in the tests).
 * @see W3C, PNG Specification (Third Edition), 5.2 PNG signature: 137 80 78 71 13 10 26 10.
 */
import createDOMPurify from 'dompurify';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { JSDOM } from 'jsdom';
import { AppError } from '../../errors.js';

/** Largest accepted image, bytes after base64 decoding (256 KiB). */
export const pilotImageMaxBytes = 256 * 1024;

export const pilotImageTypes = ['image/svg+xml', 'image/png'] as const;
export type PilotImageType = (typeof pilotImageTypes)[number];

/** The PNG signature (PNG specification, 5.2). */
const pngSignature = Uint8Array.of(137, 80, 78, 71, 13, 10, 26, 10);

const window = new JSDOM('').window;
const purify = createDOMPurify(window as unknown as Window & typeof globalThis);

/** Same-document reference: `#id` only. */
const localRef = /^\s*#[A-Za-z_][\w.:-]*\s*$/;
/** A `url(...)` value that points inside the document. */
const localUrlOnly = /^\s*url\(\s*(['"]?)#[A-Za-z_][\w.:-]*\1\s*\)\s*$/i;

purify.addHook('uponSanitizeAttribute', (_node, data) => {
  const name = data.attrName.toLowerCase();
  const value = data.attrValue;
  if ((name === 'href' || name === 'xlink:href') && !localRef.test(value)) data.keepAttr = false;
  if (/url\s*\(/i.test(value) && !localUrlOnly.test(value)) data.keepAttr = false;
  if (/javascript:|data:|vbscript:|expression\s*\(/i.test(value)) data.keepAttr = false;
});
purify.addHook('uponSanitizeElement', (node, data) => {
  if (data.tagName === 'style' && /url\s*\(|@import|expression\s*\(/i.test(node.textContent ?? '')) {
    node.parentNode?.removeChild(node);
    styleRemoved = true;
  }
});

let styleRemoved = false;

/** DOMPurify also lists the <body> wrapper of its HTML parse as removed; that is not the image's content. */
function isRealRemoval(entry: unknown): boolean {
  const element = (entry as { element?: { nodeName?: string } }).element;
  return element?.nodeName !== 'BODY';
}

function refuse(problem: string, field = 'body.image'): never {
  throw new AppError('VALIDATION_FAILED', `${field}: ${problem}`, { problems: [{ field, problem }] });
}

/**
 * Decodes and checks an uploaded pilot image.
 *
 * @param input `type` (image/svg+xml or image/png) and `base64` data.
 * @returns the bytes to store (for SVG: the sanitized text, UTF-8) and `removed` = true when the
 *   sanitizer took something out.
 * @throws AppError VALIDATION_FAILED (not SVG/PNG, malformed, bad base64, PNG signature missing),
 *   BODY_TOO_LARGE (over {@link pilotImageMaxBytes}), UNSUPPORTED_MEDIA_TYPE (another type).
 * @example
 * checkPilotImage({ type: 'image/svg+xml', base64: btoa('<svg xmlns="http://www.w3.org/2000/svg" onload="x()"/>') }).removed; // true
 */
export function checkPilotImage(input: { type: string; base64: string }): {
  type: PilotImageType;
  bytes: Buffer;
  removed: boolean;
} {
  if (!(pilotImageTypes as readonly string[]).includes(input.type)) {
    throw new AppError('UNSUPPORTED_MEDIA_TYPE', 'A pilot image must be image/svg+xml or image/png.', {
      field: 'body.image.type',
    });
  }
  if (!/^[A-Za-z0-9+/]*={0,2}$/.test(input.base64.replace(/\s+/g, ''))) refuse('is not valid base64');
  const bytes = Buffer.from(input.base64, 'base64');
  if (bytes.length === 0) refuse('is empty');
  if (bytes.length > pilotImageMaxBytes) {
    throw new AppError('BODY_TOO_LARGE', `A pilot image may be at most ${pilotImageMaxBytes} bytes.`, {
      field: 'body.image',
      bytes: bytes.length,
    });
  }
  if (input.type === 'image/png') {
    if (bytes.length < 24 || !pngSignature.every((b, i) => bytes[i] === b)) refuse('is not a PNG file');
    if (bytes.subarray(12, 16).toString('latin1') !== 'IHDR') refuse('is not a PNG file (no IHDR chunk)');
    return { type: 'image/png', bytes, removed: false };
  }
  const text = bytes.toString('utf8');
  if (/<!DOCTYPE|<!ENTITY/i.test(text)) refuse('must not contain a DOCTYPE or entity declarations');
  if (XMLValidator.validate(text) !== true) refuse('is not well-formed XML');
  const parsed = new XMLParser({ ignoreAttributes: true, ignoreDeclaration: true }).parse(text) as Record<
    string,
    unknown
  >;
  const roots = Object.keys(parsed).filter((k) => !k.startsWith('?') && k !== '#comment');
  if (roots.length !== 1 || roots[0] !== 'svg')
    refuse('is not an SVG image (the root element must be <svg>)');
  styleRemoved = false;
  const clean = purify
    .sanitize(text, { USE_PROFILES: { svg: true, svgFilters: true }, FORBID_TAGS: ['foreignObject'] })
    .replace(/&nbsp;/g, '&#160;')
    .trim();
  if (!clean.startsWith('<svg') || XMLValidator.validate(clean) !== true) {
    refuse('could not be made safe as an SVG image');
  }
  return {
    type: 'image/svg+xml',
    bytes: Buffer.from(clean, 'utf8'),
    removed: styleRemoved || purify.removed.some(isRealRemoval),
  };
}
