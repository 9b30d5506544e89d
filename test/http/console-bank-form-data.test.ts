import { describe, expect, it } from 'vitest';
import { multipartBoundary, parseMultipartForm } from '../../server/http/console-bank-form-data.js';

const crlf = '\r\n';

/** A multipart body as a browser writes it (RFC 7578 section 4: one part per field, CRLF line ends). */
function body(boundary: string, parts: string[]): Buffer {
  return Buffer.from(
    `${parts.map((p) => `--${boundary}${crlf}${p}${crlf}`).join('')}--${boundary}--${crlf}`,
    'latin1',
  );
}

describe('parseMultipartForm', () => {
  it('reads text fields as UTF-8 and files as bytes, binary data included', () => {
    const png = Buffer.from([137, 80, 78, 71, 13, 10, 26, 10, 0, 45, 45, 13, 10, 255]);
    const text = Buffer.from(
      `--b0undary${crlf}Content-Disposition: form-data; name="prompt"${crlf}${crlf}Which row grew most? ✓${crlf}` +
        `--b0undary${crlf}Content-Disposition: form-data; name="image"; filename="rows.png"${crlf}Content-Type: IMAGE/PNG${crlf}${crlf}`,
      'utf8',
    );
    const raw = Buffer.concat([text, png, Buffer.from(`${crlf}--b0undary--${crlf}`)]);
    const form = parseMultipartForm(raw, 'b0undary');
    expect(form.fields.get('prompt')).toBe('Which row grew most? ✓');
    const file = form.files.get('image');
    expect(file?.filename).toBe('rows.png');
    expect(file?.type).toBe('image/png');
    // The bytes "\r\n--" inside the file are not a boundary: only CRLF + "--b0undary" is.
    expect(file?.data.equals(png)).toBe(true);
  });

  it('keeps the first of repeated fields, an empty file, and a quoted name with an escaped quote', () => {
    const form = parseMultipartForm(
      body('x', [
        `Content-Disposition: form-data; name="key"${crlf}${crlf}a`,
        `Content-Disposition: form-data; name="key"${crlf}${crlf}b`,
        `Content-Disposition: form-data; name="image"; filename=""${crlf}Content-Type: application/octet-stream${crlf}${crlf}`,
        `Content-Disposition: form-data; name="say \\"hi\\""${crlf}${crlf}hello`,
      ]),
      'x',
    );
    expect(form.fields.get('key')).toBe('a');
    expect(form.files.get('image')?.data.length).toBe(0);
    expect(form.fields.get('say "hi"')).toBe('hello');
  });

  it('refuses malformed bodies with a 400 that names the body', () => {
    const cases: [string, Buffer][] = [
      ['no boundary at all', Buffer.from('hello')],
      [
        'no closing boundary',
        Buffer.from(`--x${crlf}Content-Disposition: form-data; name="a"${crlf}${crlf}1`),
      ],
      ['no headers', Buffer.from(`--x${crlf}just text${crlf}--x--`)],
      ['not form data', body('x', [`Content-Disposition: attachment; name="a"${crlf}${crlf}1`])],
      ['no name', body('x', [`Content-Disposition: form-data${crlf}${crlf}1`])],
      [
        'too many parts',
        body(
          'x',
          Array.from({ length: 51 }, (_, i) => `Content-Disposition: form-data; name="f${i}"${crlf}${crlf}v`),
        ),
      ],
    ];
    for (const [label, raw] of cases) {
      let caught: unknown;
      try {
        parseMultipartForm(raw, 'x');
      } catch (error) {
        caught = error;
      }
      expect([
        label,
        (caught as { code?: string }).code,
        (caught as { statusCode?: number }).statusCode,
      ]).toEqual([label, 'VALIDATION_FAILED', 400]);
      expect((caught as { details: { problems: { field: string }[] } }).details.problems[0]!.field).toBe(
        'body',
      );
    }
  });

  it('takes the boundary from the content type, quoted or not (RFC 2046 5.1.1: at most 70 characters)', () => {
    expect(multipartBoundary('multipart/form-data; boundary=----FormBoundaryAbc')).toBe(
      '----FormBoundaryAbc',
    );
    expect(multipartBoundary('multipart/form-data; charset=utf-8; boundary="a b"')).toBe('a b');
    expect(() => multipartBoundary('multipart/form-data')).toThrow(/boundary/);
    expect(() => multipartBoundary(undefined)).toThrow(/boundary/);
  });
});
