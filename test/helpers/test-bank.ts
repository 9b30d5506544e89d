import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { ItemInput } from '../../server/bank/item-schema.js';
import { type ItemBank, loadBank } from '../../server/bank/load-bank.js';
import { validItem } from '../bank/valid-item.js';

/**
 * Small invented item banks for delivery tests, written to a temporary folder and loaded by the real
 * loader (so they pass the same validation as items/). Five bar-chart items about an invented
 * island's ferry, one of each response kind plus a second scenario.
 */
export function testItems(): ItemInput[] {
  const base = validItem();
  const chart = base.chart;
  return [
    // single choice, keyed by query: Tuesday (option b)
    base,
    {
      ...base,
      id: 'isle-ferry-monday-count',
      prompt: 'How many people took the ferry on Monday?',
      response: { kind: 'numeric', unit: 'people', tolerance: 5, min: 0, max: 400 },
      key: { by: 'query', query: { op: 'value-at', where: { day: 'Mon' }, field: 'passengers' } },
      rationale: 'The Monday bar reaches 120 on the passenger scale.',
      features: {},
    },
    {
      ...base,
      id: 'isle-ferry-quiet-days',
      level: 'interpret',
      prompt: 'Which days had fewer than 150 people on the ferry? Choose all that apply.',
      response: {
        kind: 'multiple-choice',
        options: [
          { id: 'mon', text: 'Monday' },
          { id: 'tue', text: 'Tuesday' },
          { id: 'thu', text: 'Thursday' },
          { id: 'wed', text: 'Wednesday' },
        ],
      },
      key: { by: 'options', options: ['mon', 'thu'] },
      rationale: 'Monday (120) and Thursday (90) are below 150; Tuesday and Wednesday are above.',
      features: {},
    },
    {
      ...base,
      id: 'isle-ferry-why-tuesday',
      level: 'envision',
      prompt: 'What else would you like to know to explain the busy Tuesday?',
      response: {
        kind: 'short-text',
        maxLength: 200,
        rubric: [
          { score: 0, description: 'No relevant information named.' },
          { score: 1, description: 'Names one plausible extra piece of data.' },
          { score: 2, description: 'Names data and says how it would explain the peak.' },
        ],
      },
      key: { by: 'rubric' },
      rationale: 'A market day or weather record would explain the Tuesday peak.',
      features: {},
    },
    {
      ...base,
      id: 'town-ferry-quietest-day',
      scenario: 'town',
      prompt: 'On which day did the fewest people take the ferry?',
      chart,
      key: { by: 'query', query: { op: 'smallest', field: 'passengers', by: 'day' } },
      rationale: 'The Thursday bar is the shortest at 90 people.',
      features: {},
    },
  ];
}

/** Writes a bank folder (scenarios.json and one file per item) for the loader or ITEMS_DIR. */
export function writeTestBank(folder: string, items: readonly ItemInput[] = testItems()): void {
  writeFileSync(
    path.join(folder, 'scenarios.json'),
    JSON.stringify([
      { id: 'isle', name: 'Test Isle', summary: 'An invented island for tests.' },
      { id: 'town', name: 'Test Town', summary: 'An invented town for tests.' },
    ]),
  );
  for (const item of items) {
    mkdirSync(path.join(folder, item.scenario), { recursive: true });
    writeFileSync(path.join(folder, item.scenario, `${item.id}.json`), JSON.stringify(item, null, 2));
  }
}

/** Writes items (default: testItems()) to a temporary bank folder and loads it. */
export async function loadTestBank(items: readonly ItemInput[] = testItems()): Promise<ItemBank> {
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-bank-'));
  try {
    writeTestBank(folder, items);
    return await loadBank(folder);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
