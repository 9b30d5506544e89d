import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { buildItems } from '../../scripts/generate-items/build-items.js';
import { allDrafts } from '../../scripts/generate-items/index.js';

const itemsDir = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'items');

describe('scripts/generate-items', () => {
  const built = buildItems(allDrafts);

  it('reproduces every committed item file byte for byte from the drafts', () => {
    for (const item of built) {
      const file = join(itemsDir, item.scenario, `${item.id}.json`);
      const expected = readFileSync(file, 'utf8');
      expect({ file, text: `${JSON.stringify(item, null, 2)}\n` }).toEqual({ file, text: expected });
    }
  });

  it('leaves no committed item without a draft (the bank and the drafts hold the same ids)', () => {
    const scenarios = new Set(built.map((item) => item.scenario));
    const committed = [...scenarios]
      .flatMap((scenario) =>
        readdirSync(join(itemsDir, scenario))
          .filter((name) => name.endsWith('.json'))
          .map((name) => name.slice(0, -5)),
      )
      .sort();
    expect(committed).toEqual(built.map((item) => item.id).sort());
  });

  it('is deterministic: building twice gives identical items', () => {
    expect(JSON.stringify(buildItems(allDrafts))).toBe(JSON.stringify(built));
  });
});
