import { beforeAll, describe, expect, it } from 'vitest';
import type { ItemBank } from '../../server/bank/load-bank.js';
import { selectItemPool } from '../../server/delivery/select-item-pool.js';
import { studySettingsSchema } from '../../server/delivery/study-settings.js';
import { loadTestBank } from '../helpers/test-bank.js';

let bank: ItemBank;
beforeAll(async () => {
  bank = await loadTestBank();
});

describe('study settings', () => {
  it('fill in documented defaults: fixed form, 20 items, no kiosk, no end summary', () => {
    const settings = studySettingsSchema.parse({ title: 'Walk-up test' });
    expect(settings).toMatchObject({
      design: 'fixed',
      maxItems: 20,
      kiosk: false,
      idleSeconds: 90,
      endSummary: false,
      background: [],
      pool: {},
    });
    expect(settings.timeLimitSeconds).toBeUndefined();
  });

  it.each([
    [{ title: 'x', design: 'rotated', maxItems: 1 }, 'maxItems'],
    [{ title: 'x', kiosk: true, idleSeconds: 5 }, 'idleSeconds'],
    [
      { title: 'x', background: [{ id: 'a', prompt: 'A?', options: [{ id: 'x', text: 'X' }] }] },
      'background.0.options',
    ],
    [{ title: 'x', background: [{ id: 'A b', prompt: 'A?', options: [] }] }, 'background.0.id'],
    [{ title: 'x', unknown: true }, ''],
  ])('%j is refused at %s', (input, path) => {
    const result = studySettingsSchema.safeParse(input);
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.path.join('.'))).toContain(path);
  });
});

describe('selectItemPool', () => {
  const items = () => bank.items;
  it('selects by level, scenario and chart type (AND), in balanced order', () => {
    // Same chart type and level: after an isle item the town item comes before the second isle one.
    expect(selectItemPool(items(), { levels: ['read'] }).itemIds).toEqual([
      'isle-ferry-busiest-day',
      'town-ferry-quietest-day',
      'isle-ferry-monday-count',
    ]);
    expect(selectItemPool(items(), { levels: ['read'], scenarios: ['town'] }).itemIds).toEqual([
      'town-ferry-quietest-day',
    ]);
    expect(selectItemPool(items(), { chartTypes: ['line'] }).itemIds).toEqual([]);
    expect(selectItemPool(items(), {}).itemIds).toHaveLength(5);
  });

  it('keeps explicit ids in their order and reports the unavailable ones', () => {
    expect(
      selectItemPool(items(), { itemIds: ['town-ferry-quietest-day', 'nope', 'isle-ferry-busiest-day'] }),
    ).toEqual({
      itemIds: ['town-ferry-quietest-day', 'isle-ferry-busiest-day'],
      unavailable: ['nope'],
    });
  });
});
