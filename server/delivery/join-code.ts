import { randomInt } from 'node:crypto';

/** Letters without I and O, which read as 1 and 0 (and L kept: it reads as L in upper case). */
export const joinCodeLetters = 'ABCDEFGHJKLMNPQRSTUVWXYZ';
/** Digits without 0 and 1. */
export const joinCodeDigits = '23456789';

/**
 * A random join code: four letters, a hyphen, two digits (`WAKT-47`), drawn with a cryptographic
 * generator from alphabets with no look-alike characters. 24⁴ · 8² ≈ 21 million codes; callers
 * check uniqueness against the stored codes and draw again on a clash.
 *
 * @param pick - random integer in [0, n); defaults to crypto.randomInt (tests pass their own)
 * @example generateJoinCode() // 'WAKT-47'
 */
export function generateJoinCode(pick: (n: number) => number = randomInt): string {
  let code = '';
  for (let i = 0; i < 4; i++) code += joinCodeLetters[pick(joinCodeLetters.length)];
  code += '-';
  for (let i = 0; i < 2; i++) code += joinCodeDigits[pick(joinCodeDigits.length)];
  return code;
}

/**
 * The stored form of a join code as a person typed it: case ignored, spaces and hyphens ignored.
 * Returns undefined when what is left cannot be a join code (so it is never looked up).
 * @example normaliseJoinCode(' wakt 47 ') // 'WAKT-47'
 */
export function normaliseJoinCode(typed: string): string | undefined {
  const compact = typed.toUpperCase().replace(/[\s-]+/g, '');
  const match = /^([A-Z]{4})([0-9]{2})$/.exec(compact);
  if (!match) return undefined;
  return `${match[1]}-${match[2]}`;
}
