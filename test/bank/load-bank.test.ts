import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { BankLoadError, loadBank } from '../../server/bank/load-bank.js';
import { validItem } from './valid-item.js';

let dir: string | undefined;
afterEach(async () => {
  if (dir !== undefined) await rm(dir, { recursive: true, force: true });
  dir = undefined;
});

async function bankFolder(files: Record<string, unknown>): Promise<string> {
  dir = await mkdtemp(path.join(tmpdir(), 'bank-'));
  const items = path.join(dir, 'items');
  const all = { 'scenarios.json': [{ id: 'isle', name: 'An island', summary: 'Invented.' }], ...files };
  for (const [name, content] of Object.entries(all)) {
    await mkdir(path.dirname(path.join(items, name)), { recursive: true });
    await writeFile(
      path.join(items, name),
      typeof content === 'string' ? content : JSON.stringify(content, null, 2),
    );
  }
  return items;
}

describe('loadBank', () => {
  it('loads, resolves the key, derives features and versions each item', async () => {
    const bank = await loadBank(await bankFolder({ 'isle/isle-ferry-busiest-day.json': validItem() }));
    expect(bank.items).toHaveLength(1);
    const item = bank.byId.get('isle-ferry-busiest-day')!;
    expect(item.resolvedKey).toEqual({ answer: 'Tue', optionIds: ['b'], value: null });
    expect(item.features.markCount).toBe(4);
    expect(item.version).toMatch(/^[0-9a-f]{64}$/);
    expect(item.file).toBe('items/isle/isle-ferry-busiest-day.json');
    expect(Object.isFrozen(item.chart.data)).toBe(true);
    expect('set' in bank.byId).toBe(false);
  });

  it('throws a BankLoadError listing every problem as file: field: problem, and serves nothing', async () => {
    const badKey = {
      ...validItem(),
      id: 'bad-key',
      key: { by: 'query', query: { op: 'largest', field: 'riders', by: 'day' } },
    };
    const folder = await bankFolder({
      'isle/isle-ferry-busiest-day.json': validItem(),
      'isle/bad-key.json': badKey,
      'isle/broken.json': '{ "id": ',
      'isle/no-level.json': { ...validItem(), id: 'no-level', level: undefined },
    });
    const error = await loadBank(folder).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(BankLoadError);
    const lines = (error as BankLoadError).message.split('\n').slice(1);
    expect(lines).toContain(
      'items/isle/bad-key.json: key.query: cannot be computed: sum: field "riders" is missing, need a number',
    );
    expect(lines.some((l) => l.startsWith('items/isle/broken.json: -: not valid JSON'))).toBe(true);
    expect(lines.some((l) => l.startsWith('items/isle/no-level.json: level: '))).toBe(true);
    expect((error as BankLoadError).message).not.toMatch(/\n\s+at /); // no stack trace in the message
  });

  it('reports a broken scenarios.json', async () => {
    const folder = await bankFolder({ 'scenarios.json': [{ id: 'Isle', name: '', summary: 'x' }] });
    await expect(loadBank(folder)).rejects.toThrow(/items\/scenarios\.json: 0\.id: use kebab-case/);
  });
});
