import { createHash } from 'node:crypto';

/**
 * JSON with object keys sorted at every depth and no whitespace, so that two files holding the
 * same data (in any key order or layout) give the same text. Arrays keep their order.
 *
 * @example canonicalJson({ b: 1, a: [2, { d: 3, c: 4 }] }) // '{"a":[2,{"c":4,"d":3}],"b":1}'
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') {
    const text = JSON.stringify(value);
    if (text === undefined) throw new Error('canonicalJson requires JSON data');
    return text;
  }
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/**
 * Fields that do not make a new version: `status` (retiring an item is not editing it), and the
 * team-only `rationale` and `features` (fixing a typo there must not split an item's response
 * history). Everything a respondent sees or is scored on is hashed.
 */
export const UNVERSIONED_FIELDS: readonly string[] = ['status', 'rationale', 'features'];

/**
 * The version of an item: sha256 (hex) of the canonical JSON of the item file as written,
 * without {@link UNVERSIONED_FIELDS}. An edited chart, prompt, option or key is a new version.
 *
 * @param item - the item's JSON as read from its file
 * @returns 64 lower-case hex digits
 */
export function contentHash(item: Readonly<Record<string, unknown>>): string {
  const versioned = Object.fromEntries(Object.entries(item).filter(([k]) => !UNVERSIONED_FIELDS.includes(k)));
  return createHash('sha256').update(canonicalJson(versioned), 'utf8').digest('hex');
}
