import { XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { checkPilotImage, pilotImageMaxBytes } from '../../../server/delivery/pilots/check-pilot-image.js';
import { AppError } from '../../../server/errors.js';

const b64 = (text: string) => Buffer.from(text, 'utf8').toString('base64');
const svg = (inner: string, attrs = '') =>
  `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" viewBox="0 0 100 50"${attrs}>${inner}</svg>`;
const clean = (text: string) =>
  checkPilotImage({ type: 'image/svg+xml', base64: b64(text) }).bytes.toString('utf8');
const codeOf = (f: () => unknown): string => {
  try {
    f();
  } catch (error) {
    if (error instanceof AppError) return error.code;
    throw error;
  }
  return 'none';
};

/** Nothing executable or external may survive: no script, handler, javascript:, data:, foreign content. */
function expectInert(out: string): void {
  expect(out).not.toMatch(/<script/i);
  expect(out).not.toMatch(/\son[a-z]+\s*=/i);
  expect(out).not.toMatch(/javascript:/i);
  expect(out).not.toMatch(/data:/i);
  expect(out).not.toMatch(/foreignObject/i);
  expect(out).not.toMatch(/<(animate|set|animateTransform|animateMotion)\b/i);
  expect(out).not.toMatch(/https?:\/\/(?!www\.w3\.org)/i);
  expect(out.startsWith('<svg')).toBe(true);
  expect(XMLValidator.validate(out)).toBe(true);
}

describe('checkPilotImage: SVG sanitizing against published XSS vectors', () => {
  // Vectors from the OWASP Cheat Sheet Series, "XSS Filter Evasion Cheat Sheet" (SVG onload,
  // script element, javascript: URLs, embedded foreign HTML, data: URLs) and its SVG-animation
  // variants (animate/set changing href or handlers).
  const vectors: [string, string][] = [
    ['<svg onload=...> on the root', svg('<rect width="10" height="10"/>', ' onload="alert(1)"')],
    ['<script> element', svg('<script>alert(1)</script><rect width="10" height="10"/>')],
    ['CDATA script', svg('<script><![CDATA[alert(1)]]></script>')],
    [
      'event handler on a child',
      svg('<rect width="10" height="10" onmouseover="alert(1)" onclick="alert(2)"/>'),
    ],
    ['javascript: href on <a>', svg('<a href="javascript:alert(1)"><text y="20">x</text></a>')],
    ['javascript: xlink:href on <a>', svg('<a xlink:href="javascript:alert(1)"><text y="20">x</text></a>')],
    [
      '<foreignObject> with HTML',
      svg(
        '<foreignObject><body xmlns="http://www.w3.org/1999/xhtml"><img src="x" onerror="alert(1)"/></body></foreignObject>',
      ),
    ],
    ['<use href="data:...">', svg('<use href="data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+"/>')],
    [
      '<animate attributeName="href" values="javascript:...">',
      svg('<a><animate attributeName="href" values="javascript:alert(1)"/><text y="20">x</text></a>'),
    ],
    [
      '<set attributeName="onmouseover">',
      svg('<rect width="9" height="9"><set attributeName="onmouseover" to="alert(1)"/></rect>'),
    ],
    [
      '<set> to a javascript: href',
      svg('<a><set attributeName="href" to="javascript:alert(1)"/><text y="9">x</text></a>'),
    ],
    ['external image', svg('<image href="http://attacker.example/x.png" width="5" height="5"/>')],
    [
      'data: image',
      svg(
        '<image xlink:href="data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==" width="5" height="5"/>',
      ),
    ],
    [
      '<style> with url()',
      svg('<style>rect { fill: url(http://attacker.example/a.svg#g) }</style><rect width="9" height="9"/>'),
    ],
    ['<style> with @import', svg('<style>@import "http://attacker.example/a.css";</style>')],
    ['fill="url(http:...)"', svg('<rect width="9" height="9" fill="url(http://attacker.example/p.svg#p)"/>')],
    ['<iframe srcdoc> inside', svg('<iframe srcdoc="&lt;script&gt;alert(1)&lt;/script&gt;"></iframe>')],
  ];
  for (const [name, vector] of vectors) {
    it(`strips ${name}`, () => {
      expectInert(clean(vector));
    });
  }

  it('keeps the drawing: shapes, text, same-document gradients and url(#id) fills survive', () => {
    const out = clean(
      svg(
        '<defs><linearGradient id="g"><stop offset="0" stop-color="#123456"/></linearGradient></defs>' +
          '<rect x="1" y="2" width="30" height="20" fill="url(#g)"/><text x="5" y="40">Ferry 120</text>' +
          '<style>text { font-size: 8px; }</style>',
      ),
    );
    expect(out).toContain('fill="url(#g)"');
    expect(out).toContain('<linearGradient id="g"');
    expect(out).toContain('Ferry 120');
    expect(out).toContain('font-size: 8px');
    expectInert(out);
  });

  it('reports that something was removed', () => {
    expect(checkPilotImage({ type: 'image/svg+xml', base64: b64(svg('', ' onload="x()"')) }).removed).toBe(
      true,
    );
    expect(
      checkPilotImage({ type: 'image/svg+xml', base64: b64(svg('<rect width="1" height="1"/>')) }).removed,
    ).toBe(false);
  });
});

describe('checkPilotImage: bad input is a clear 4xx', () => {
  it('refuses malformed XML, a non-SVG root, a DOCTYPE (entity expansion) and non-image text', () => {
    expect(codeOf(() => clean('<svg xmlns="http://www.w3.org/2000/svg"><rect></svg>'))).toBe(
      'VALIDATION_FAILED',
    );
    expect(codeOf(() => clean('<html><body>hi</body></html>'))).toBe('VALIDATION_FAILED');
    expect(
      codeOf(() =>
        clean('<!DOCTYPE svg [<!ENTITY a "aaaa">]><svg xmlns="http://www.w3.org/2000/svg">&a;</svg>'),
      ),
    ).toBe('VALIDATION_FAILED');
    expect(codeOf(() => clean('just some words'))).toBe('VALIDATION_FAILED');
  });

  it('refuses another media type with 415 and a too large image with 413', () => {
    expect(codeOf(() => checkPilotImage({ type: 'image/gif', base64: 'R0lGODlh' }))).toBe(
      'UNSUPPORTED_MEDIA_TYPE',
    );
    const big = svg(`<text>${'x'.repeat(pilotImageMaxBytes)}</text>`);
    expect(codeOf(() => clean(big))).toBe('BODY_TOO_LARGE');
  });

  it('checks the PNG signature (PNG specification 5.2) and the IHDR chunk', () => {
    // A 1×1 PNG header: signature, then the IHDR chunk's length (13) and type.
    const header = Buffer.from([
      137, 80, 78, 71, 13, 10, 26, 10, 0, 0, 0, 13, 73, 72, 68, 82, 0, 0, 0, 1, 0, 0, 0, 1, 8, 6, 0, 0, 0,
    ]);
    const ok = checkPilotImage({ type: 'image/png', base64: header.toString('base64') });
    expect(ok.type).toBe('image/png');
    expect(ok.bytes.equals(header)).toBe(true);
    const wrong = Buffer.from(header);
    wrong[1] = 81;
    expect(codeOf(() => checkPilotImage({ type: 'image/png', base64: wrong.toString('base64') }))).toBe(
      'VALIDATION_FAILED',
    );
    // An SVG sent as PNG is refused by the signature.
    expect(codeOf(() => checkPilotImage({ type: 'image/png', base64: b64(svg('')) }))).toBe(
      'VALIDATION_FAILED',
    );
  });
});
