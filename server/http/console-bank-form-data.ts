import { AppError } from '../errors.js';

/** One uploaded file of a multipart form. */
export interface FormFile {
  filename: string;
  /** The part's Content-Type as the browser sent it (by file extension), lower-cased. */
  type: string;
  data: Buffer;
}

/** A parsed `multipart/form-data` body: text fields and files, by field name (first one wins). */
export interface FormData {
  fields: Map<string, string>;
  files: Map<string, FormFile>;
}

/** Most parts a console form sends (the pilot form has about a dozen). */
const maxParts = 50;

function refuse(problem: string): never {
  throw new AppError('VALIDATION_FAILED', `body: ${problem}`, {
    problems: [{ field: 'body', problem }],
  });
}

/** The boundary of a `multipart/form-data` content type (RFC 2046 5.1.1: 1 to 70 characters). */
export function multipartBoundary(contentType: string | undefined): string {
  const match = /;\s*boundary=(?:"([^"]{1,70})"|([^\s;]{1,70}))/i.exec(contentType ?? '');
  const boundary = match?.[1] ?? match?.[2];
  if (boundary === undefined) refuse('a multipart form needs a boundary in its content type');
  return boundary;
}

/** A parameter of a Content-Disposition header, e.g. `name` or `filename` (quoted or bare). */
function dispositionParameter(header: string, name: string): string | undefined {
  const match = new RegExp(`;\\s*${name}=(?:"((?:[^"\\\\]|\\\\.)*)"|([^;\\s]+))`, 'i').exec(header);
  if (!match) return undefined;
  return match[1] !== undefined ? match[1].replace(/\\(.)/g, '$1') : match[2];
}

/**
 * Parses a `multipart/form-data` body (RFC 7578) held in memory: the route's body limit bounds it.
 * Text fields are UTF-8; a part with a filename is a file. A malformed body is a 400
 * VALIDATION_FAILED naming `body`, never a crash.
 *
 * @see RFC 7578, Returning Values from Forms: multipart/form-data; RFC 2046 5.1.1 (boundaries).
 */
export function parseMultipartForm(body: Buffer, boundary: string): FormData {
  const fields = new Map<string, string>();
  const files = new Map<string, FormFile>();
  const delimiter = Buffer.from(`--${boundary}`);
  let at = body.indexOf(delimiter);
  if (at < 0) refuse('the multipart body has no part');
  let parts = 0;
  for (;;) {
    at += delimiter.length;
    if (body.subarray(at, at + 2).toString('latin1') === '--') break; // the close delimiter
    if (body.subarray(at, at + 2).toString('latin1') !== '\r\n') refuse('a multipart boundary is malformed');
    at += 2;
    const next = body.indexOf(Buffer.from(`\r\n--${boundary}`), at);
    if (next < 0) refuse('the multipart body ends before its closing boundary');
    const part = body.subarray(at, next);
    at = next + 2;
    parts += 1;
    if (parts > maxParts) refuse(`a form may send at most ${maxParts} parts`);
    const headerEnd = part.indexOf('\r\n\r\n');
    if (headerEnd < 0) refuse('a multipart part has no headers');
    const headers = part.subarray(0, headerEnd).toString('utf8').split('\r\n');
    const content = part.subarray(headerEnd + 4);
    const disposition = headers.find((h) => /^content-disposition:/i.test(h));
    if (disposition === undefined || !/^content-disposition:\s*form-data/i.test(disposition)) {
      refuse('a multipart part is not form data');
    }
    const name = dispositionParameter(disposition, 'name');
    if (name === undefined || name === '') refuse('a multipart part has no field name');
    const filename = dispositionParameter(disposition, 'filename');
    if (filename !== undefined) {
      const typeHeader = headers.find((h) => /^content-type:/i.test(h));
      const type = (typeHeader?.slice(typeHeader.indexOf(':') + 1).trim() ?? 'application/octet-stream')
        .split(';')[0]!
        .trim()
        .toLowerCase();
      if (!files.has(name)) files.set(name, { filename, type, data: Buffer.from(content) });
    } else if (!fields.has(name)) {
      fields.set(name, content.toString('utf8'));
    }
  }
  return { fields, files };
}
