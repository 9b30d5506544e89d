import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { errorCodes } from '../server/errors.js';

const guide = readFileSync(new URL('../DEVELOPERS.md', import.meta.url), 'utf8');
const table = guide.slice(guide.indexOf('## Error codes'));
const documented = [...table.matchAll(/^\| `([A-Z_]+)` \| (\d{3}) \|/gm)].map((m) => [m[1], Number(m[2])]);

describe('DEVELOPERS.md error-code table', () => {
  it('lists every code in server/errors.ts with its status, and no code that no longer exists', () => {
    const actual = Object.entries(errorCodes).map(([code, { status }]) => [code, status]);
    expect(documented.sort()).toEqual(actual.sort());
  });
});

describe('README', () => {
  const readme = readFileSync(new URL('../README.md', import.meta.url), 'utf8');
  it('shows the two commands for a fresh machine', () => {
    expect(readme).toContain('npm install && npm start');
    expect(readme).toContain('npm test');
  });
});
